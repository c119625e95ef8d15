"""The floor a cold run is measured against: reading the PDFs plus running the model, nothing else.

Usage (run by bench/run.py in a child process, after the cold run filled CACHE)::

    python bench/limits.py DRAFT SOURCES CACHE [--jobs N]

It prints one JSON object: ``pypdf_s``, the time pypdf alone takes to open every PDF and
extract every page's text (one process per core, as sourcecheck reads them); and
``model_load_s`` and ``model_s``, the time the int8 model takes to load and to embed exactly
the passages and claims the cold run embedded (those whose vectors are in CACHE's store),
with ``texts``, how many that is; and ``verifier_load_s`` and ``verifier_s``, the time the
int8 verifier takes to load and to read exactly the (claim, sentence) pairs the cold run
read, with ``pairs``, how many (found by running the pipeline again on the warm cache and
noting the pairs it asks for). Their sum is the limit no implementation on the same
libraries can beat; bench/run.py reports the tool's cold run over it.
"""

from __future__ import annotations

import argparse
import json
import os
import sqlite3
import sys
import time
from concurrent.futures import ProcessPoolExecutor
from pathlib import Path

from pypdf import PdfReader


def _read_all_pages(pdf: Path) -> int:
    try:
        return sum(len(page.extract_text() or "") for page in PdfReader(pdf).pages)
    except Exception:  # a deliberately broken demo file: sourcecheck reports it too
        return 0


def pypdf_seconds(sources: Path, jobs: int) -> float:
    """Wall time for pypdf to extract every page of every PDF under ``sources``."""
    pdfs = sorted(p for p in sources.rglob("*") if p.suffix.lower() == ".pdf" and p.is_file())
    start = time.perf_counter()
    with ProcessPoolExecutor(max_workers=jobs) as pool:
        list(pool.map(_read_all_pages, pdfs, chunksize=4))
    return time.perf_counter() - start


def embedded_texts(draft: Path, sources: Path, cache: Path) -> list[str]:
    """The passage and claim texts whose vectors the cold run stored (read warm: no model)."""
    from sourcecheck.index import Encoder, resolve_model_path, vector_key
    from sourcecheck.pipeline import prepare

    prepared = prepare(draft, sources, cache_dir=cache)
    fingerprint = Encoder(resolve_model_path(None)).fingerprint
    with sqlite3.connect(cache / "vectors.sqlite") as db:
        stored = {row[0] for row in db.execute("SELECT key FROM vectors")}
    texts = [p.text for p in prepared.index.passages] + prepared.queries
    return list(dict.fromkeys(t for t in texts if vector_key(fingerprint, t) in stored))


def verified_pairs(draft: Path, sources: Path, cache: Path) -> list[tuple[str, str]]:
    """The (claim, sentence) pairs the judge has the verifier read, in order, from a warm run."""
    from sourcecheck.pipeline import run
    from sourcecheck.verdicts import CachedScorer

    asked: list[tuple[str, str]] = []
    original = CachedScorer.score

    def noting(self: CachedScorer, pairs):  # type: ignore[no-untyped-def]
        asked.extend(pairs)
        return original(self, pairs)

    CachedScorer.score = noting  # type: ignore[method-assign]
    try:
        run(draft, sources, cache_dir=cache)
    finally:
        CachedScorer.score = original  # type: ignore[method-assign]
    return asked


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("draft", type=Path)
    parser.add_argument("sources", type=Path)
    parser.add_argument("cache", type=Path)
    parser.add_argument("--jobs", type=int, default=os.cpu_count() or 1)
    args = parser.parse_args(argv)
    texts = embedded_texts(args.draft, args.sources, args.cache)
    pairs = verified_pairs(args.draft, args.sources, args.cache)
    pypdf_s = pypdf_seconds(args.sources, args.jobs)
    from sourcecheck.index import Encoder, resolve_model_path

    encoder = Encoder(resolve_model_path(None))
    start = time.perf_counter()
    encoder.encode(["warm-up"])  # loads the session and tokenizer
    loaded = time.perf_counter()
    encoder.encode(texts)
    done = time.perf_counter()
    from sourcecheck.judge import Verifier

    verifier = Verifier()
    verifier.score([("warm-up", "warm-up")])  # loads the session and tokenizer
    verifier_loaded = time.perf_counter()
    if pairs:
        verifier.score(pairs)
    verified = time.perf_counter()
    result = {
        "pypdf_s": round(pypdf_s, 2),
        "model_load_s": round(loaded - start, 2),
        "model_s": round(done - loaded, 2),
        "texts": len(texts),
        "verifier_load_s": round(verifier_loaded - done, 2),
        "verifier_s": round(verified - verifier_loaded, 2),
        "pairs": len(pairs),
    }
    json.dump(result, sys.stdout)
    sys.stdout.write("\n")
    return 0


if __name__ == "__main__":
    sys.exit(main())
