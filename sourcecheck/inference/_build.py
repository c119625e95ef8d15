"""Export a local Hugging Face model to ONNX and quantise it to int8, once per set of weights.

Why at first use and not at build time: the model folder can be any local folder
(``--model``), so the int8 file is made for whatever weights are in use, and a ``pip install``
needs no build step. The export needs torch and transformers (already dependencies, for
the ``torch`` backend); it runs once per machine and weights and takes some tens of seconds.
The result lives in the user cache folder under the SHA-256 of the source weights, so
changed weights can never be served a stale export. Nothing is downloaded: the folder is
read with ``local_files_only``.

The quantisation is ONNX Runtime's dynamic int8 (weights int8, activations quantised per
batch at run time), per output channel and on the MatMul nodes only. Measured on 160
SciFact abstract snippets against the fp32 export (all-MiniLM-L6-v2): per-tensor
quantisation of every node gave cosine 0.952 mean / 0.912 min to the fp32 vectors; per
channel on MatMul 0.994 / 0.989 (2026-12-02, this project's measurement).
"""

from __future__ import annotations

import hashlib
import json
import os
import tempfile
from pathlib import Path
from typing import Any, Literal

import platformdirs

from sourcecheck.errors import ModelUnavailable

#: What the exported graph returns: the encoder's last hidden state (embedders pool it
#: themselves) or a sequence classifier's logits (cross-encoders, verifiers).
Head = Literal["hidden", "logits"]
ENV_MODEL_CACHE = "SOURCECHECK_MODEL_CACHE"
#: Bumped when the export or quantisation recipe changes: older files are then remade.
RECIPE = "1"
WEIGHT_NAMES = ("model.safetensors", "pytorch_model.bin")
OPSET = 17
#: Files smaller than this are hashed every time: cheap, and immune to a rewrite within
#: the file system's timestamp granularity.
MEMO_FROM_BYTES = 1 << 20


def default_model_cache() -> Path:
    """Where int8 models are kept: ``SOURCECHECK_MODEL_CACHE`` or the user cache folder."""
    chosen = os.environ.get(ENV_MODEL_CACHE)
    return Path(chosen) if chosen else Path(platformdirs.user_cache_dir("sourcecheck", appauthor=False)) / "models"


def _file_sha256(path: Path) -> str:
    digest = hashlib.sha256()
    with path.open("rb") as handle:
        for block in iter(lambda: handle.read(1 << 20), b""):
            digest.update(block)
    return digest.hexdigest()


def weights_digest(folder: Path, names: tuple[str, ...], memo: Path | None = None) -> str:
    """A short SHA-256 over the named files of ``folder`` (those present), memoised by size, mtime and inode.

    Hashing 90 MB of weights costs a few tenths of a second, as much as a whole warm run
    may take, so each file's hash is remembered in ``memo`` (a JSON file) against its
    size and modification time and recomputed only when either changes.
    """
    known: dict[str, list[Any]] = {}
    if memo is not None:
        try:
            known = json.loads(memo.read_text(encoding="utf-8"))
        except (OSError, ValueError):
            known = {}
    digest = hashlib.sha256()
    changed = False
    for name in names:
        file = folder / name
        if not file.is_file():
            continue
        stat = file.stat()
        signature = [stat.st_size, stat.st_mtime_ns, stat.st_ino]
        entry = known.get(str(file.resolve()))
        if stat.st_size >= MEMO_FROM_BYTES and entry and entry[:3] == signature:
            file_hash = str(entry[3])
        else:
            file_hash = _file_sha256(file)
            if stat.st_size >= MEMO_FROM_BYTES:
                known[str(file.resolve())] = [*signature, file_hash]
                changed = True
        digest.update(name.encode())
        digest.update(file_hash.encode())
    if memo is not None and changed:
        try:
            memo.parent.mkdir(parents=True, exist_ok=True)
            _replace_text(memo, json.dumps(known))
        except OSError:
            pass  # a memo that cannot be written only costs the hash next time
    return digest.hexdigest()[:16]


def _replace_text(path: Path, text: str) -> None:
    fd, tmp = tempfile.mkstemp(dir=path.parent, prefix=".tmp-")
    with os.fdopen(fd, "w", encoding="utf-8") as handle:
        handle.write(text)
    os.replace(tmp, path)


def int8_model(folder: Path, head: Head = "hidden", cache: Path | None = None) -> Path:
    """The int8 ONNX file for the model in ``folder``, exported and quantised on first use."""
    root = cache if cache is not None else default_model_cache()
    names = (*WEIGHT_NAMES, "config.json")
    if not any((folder / name).is_file() for name in WEIGHT_NAMES):
        raise ModelUnavailable(f"{folder}: no model weights ({', '.join(WEIGHT_NAMES)}) to export")
    key = weights_digest(folder, names, memo=root / "digests.json")
    target = root / f"{key}-{head}-r{RECIPE}" / "model-int8.onnx"
    if target.is_file():
        return target
    target.parent.mkdir(parents=True, exist_ok=True)
    with tempfile.TemporaryDirectory(dir=target.parent) as work:
        fp32 = Path(work) / "model-fp32.onnx"
        int8 = Path(work) / "model-int8.onnx"
        try:
            _export(folder, fp32, head)
            _quantise(fp32, int8)
        except ModelUnavailable:
            raise
        except Exception as exc:  # any exporter failure is one line for the user
            raise ModelUnavailable(f"{folder}: could not be converted to ONNX ({exc})") from exc
        os.replace(int8, target)  # atomic: a concurrent run sees the whole file or none
    return target


def _export(folder: Path, target: Path, head: Head) -> None:
    """Trace the model with torch's TorchScript-based exporter (dynamic batch and length)."""
    os.environ["HF_HUB_OFFLINE"] = "1"
    os.environ["TRANSFORMERS_OFFLINE"] = "1"
    import warnings

    import torch
    import transformers

    transformers.utils.logging.disable_progress_bar()
    transformers.utils.logging.set_verbosity_error()
    loader = transformers.AutoModel if head == "hidden" else transformers.AutoModelForSequenceClassification
    # Eager attention: the fused kernel's shape branches would be frozen by tracing.
    model = loader.from_pretrained(str(folder), local_files_only=True, attn_implementation="eager")
    model.eval()

    class Graph(torch.nn.Module):
        """Named tensors in, one tensor out: what the exporter traces."""

        def __init__(self) -> None:
            super().__init__()
            self.inner = model

        def forward(self, input_ids: Any, attention_mask: Any, token_type_ids: Any) -> Any:
            out = self.inner(input_ids=input_ids, attention_mask=attention_mask, token_type_ids=token_type_ids)
            return out.last_hidden_state if head == "hidden" else out.logits

    sample = torch.ones((2, 8), dtype=torch.long)
    axes = {0: "batch", 1: "tokens"}
    output = "last_hidden_state" if head == "hidden" else "logits"
    with warnings.catch_warnings(), torch.no_grad():
        warnings.simplefilter("ignore")  # the tracer's notes on frozen Python values
        torch.onnx.export(
            Graph(),
            (sample, sample, torch.zeros_like(sample)),
            str(target),
            input_names=["input_ids", "attention_mask", "token_type_ids"],
            output_names=[output],
            dynamic_axes={"input_ids": axes, "attention_mask": axes, "token_type_ids": axes, output: axes},
            opset_version=OPSET,
            dynamo=False,
        )


def _quantise(source: Path, target: Path) -> None:
    """ONNX Runtime's dynamic int8 quantisation, per channel, MatMul weights only (see module doc)."""
    import logging

    from onnxruntime.quantization import QuantType, quantize_dynamic

    logging.getLogger().setLevel(logging.ERROR)  # its advice to pre-process goes to the root logger
    quantize_dynamic(
        str(source),
        str(target),
        weight_type=QuantType.QInt8,
        per_channel=True,
        op_types_to_quantize=["MatMul"],
    )
