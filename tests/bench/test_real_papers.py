"""The real-paper claim set (tests/fixtures/real_papers) and bench/real_papers.py.

The fixture checks need no PDF. The checks that open the papers run where the shared
development folder exists (``../shared/data/papers`` beside the repository, as in CI):
every cited file is there, and every gold passage is found on its gold page, which is
what makes the page figures of the bench mean something.
"""

from __future__ import annotations

import csv
import json
import re
import unicodedata
from collections import Counter
from functools import cache
from pathlib import Path
from types import ModuleType

import pytest
from pypdf import PdfReader

from tests.bench.scripts import load_script
from tests.pdf_fixtures import build_pdf

ROOT = Path(__file__).resolve().parents[2]
CLAIMS = ROOT / "tests" / "fixtures" / "real_papers" / "claims.jsonl"
PAPERS = ROOT.parent / "shared" / "data" / "papers"

KINDS = (
    "faithful",
    "number",
    "direction",
    "overstated",
    "scope",
    "absent",
    "wrong-paper",
    "quote-exact",
    "quote-altered",
)
# The band each kind calls for, read off the README's "What the bands mean" table.
BAND_OF_KIND = {
    "faithful": "anchored",
    "quote-exact": "anchored",
    "number": "conflict",
    "direction": "conflict",
    "overstated": "loose",
    "scope": "loose",
    "quote-altered": "loose",
    "absent": "adrift",
    "wrong-paper": "adrift",
}
REASON_OF_KIND = {
    "number": {"number-mismatch"},
    "direction": {"direction-flip", "negation"},
    "overstated": {"overstated"},
    "scope": {"scope-wider"},
    "quote-altered": {"quote-drift"},
    "absent": {"no-match"},
    "wrong-paper": {"better-source"},
    "faithful": {None},
    "quote-exact": {None},
}
# The least each kind must hold (the set's specification in its README).
MINIMUM = {"faithful": 25, "number": 8, "direction": 8, "overstated": 5, "scope": 5, "absent": 5, "wrong-paper": 4}
MINIMUM |= {"quote-exact": 3, "quote-altered": 3}

needs_papers = pytest.mark.skipif(not PAPERS.is_dir(), reason=f"shared papers folder {PAPERS} not present")


def _rows() -> list[dict]:
    return [json.loads(line) for line in CLAIMS.read_text(encoding="utf-8").splitlines()]


def _load() -> ModuleType:
    return load_script("real_papers")


def _squash(text: str) -> str:
    """Compatibility-normalised text without whitespace or soft hyphens (ligatures become letters)."""
    text = unicodedata.normalize("NFKC", text)
    return "".join(ch for ch in text if not ch.isspace() and ch != "\u00ad")


@cache
def _pages(name: str) -> tuple[str, ...]:
    return tuple(_squash(page.extract_text() or "") for page in PdfReader(PAPERS / name).pages)


# --- the fixture itself ------------------------------------------------------------------


def test_every_line_is_a_claim_with_the_fields_and_allowed_values() -> None:
    rows = _rows()
    assert len({r["id"] for r in rows}) == len(rows)
    for row in rows:
        assert re.fullmatch(r"rp\d{3}", row["id"])
        assert row["kind"] in KINDS, row["id"]
        assert row["band"] == BAND_OF_KIND[row["kind"]], row["id"]
        assert row["reason"] in REASON_OF_KIND[row["kind"]], row["id"]
        assert row["file"].endswith(".pdf") and "/" not in row["file"]
        assert not re.search(r"\[\d", row["claim"]), f"{row['id']}: the claim carries a marker"
        if row["kind"] == "absent":
            assert row["page"] is None and row["passage"] is None
        else:
            assert isinstance(row["page"], int) and row["page"] >= 1 and len(row["passage"]) > 20
        if row["kind"] == "wrong-paper":
            assert row["true_file"] != row["file"]
        if row["kind"].startswith("quote-"):
            assert re.search(r'"[^"]{20,}"', row["claim"]), row["id"]


def test_the_set_has_the_size_and_mix_its_readme_promises() -> None:
    rows = _rows()
    splits = {row["file"]: set() for row in rows}
    for row in rows:
        splits[row["file"]].add(row["split"])
    assert all(len(s) == 1 for s in splits.values())  # a paper's claims stay in one split
    assert Counter(next(iter(s)) for s in splits.values()).keys() == {"fit", "holdout"}
    kinds = Counter(r["kind"] for r in rows)
    assert len(rows) >= 70 and len({r["file"] for r in rows}) >= 15
    assert all(kinds[kind] >= least for kind, least in MINIMUM.items()), kinds


def test_exact_quotations_are_in_the_gold_passage_and_altered_ones_are_not() -> None:
    for row in _rows():
        if row["kind"].startswith("quote-"):
            quoted = _squash(re.search(r'"([^"]+)"', row["claim"]).group(1)).lower()
            unbroken = re.sub(r"(?<=[a-z])- (?=[a-z])", "", row["passage"])  # end-of-line hyphenation
            found = quoted in _squash(unbroken).lower()
            assert found == (row["kind"] == "quote-exact"), row["id"]


# --- against the shared papers ---------------------------------------------------------


@needs_papers
def test_every_cited_file_is_in_the_papers_folder_and_its_readme_table() -> None:
    listed = _load().read_paper_table(PAPERS / "README.md")
    for row in _rows():
        for name in filter(None, (row["file"], row.get("true_file"))):
            assert (PAPERS / name).is_file(), name
            assert name in listed, name


@needs_papers
def test_each_gold_passage_is_on_its_gold_page() -> None:
    wrong = []
    for row in _rows():
        if row["passage"] is None:
            continue
        pages = _pages(row.get("true_file") or row["file"])
        for place in [{"page": row["page"], "passage": row["passage"]}, *row.get("also", [])]:
            if _squash(place["passage"]) not in pages[place["page"] - 1]:
                wrong.append(f"{row['id']} p{place['page']}")
    assert not wrong


# --- the bench's own pieces on invented data --------------------------------------------


def test_references_are_rewritten_in_vancouver_order() -> None:
    # NLM "Citing Medicine" (2nd ed.), journal articles: Author. Title. Journal. Year;Vol(Issue):Pages.
    # (format from memory of the NLM guide).
    bench = _load()
    written = (
        "Okafor N, Brandt L. Beetles on scraped plots. Journal of Invented Ecology 12(3):45–67 (2019). doi:10.0000/x"
    )
    expected = (
        "Okafor N, Brandt L. Beetles on scraped plots. Journal of Invented Ecology. 2019;12(3):45–67. doi:10.0000/x"
    )
    assert bench.vancouver(written) == expected
    online = "Lin Q. A title. Invented Letters 5(1):1–13 (published online 2016). doi:10.0000/y"
    assert bench.vancouver(online) == "Lin Q. A title. Invented Letters. 2016;5(1):1–13. doi:10.0000/y"
    preprint = "Lin Q. A title. Preprint arXiv:0000.00000 (2015), submitted."
    assert bench.vancouver(preprint) == preprint


def test_scores_count_pages_reasons_and_flags() -> None:
    bench = _load()
    rows = [
        {"kind": "faithful", "band": "anchored", "reason": None, "page": 4, "also": [{"page": 9, "passage": "x"}]},
        {"kind": "number", "band": "conflict", "reason": "number-mismatch", "page": 2},
        {"kind": "direction", "band": "conflict", "reason": "direction-flip", "page": 7},
        {"kind": "absent", "band": "adrift", "reason": "no-match", "page": None},
    ]
    for number, row in enumerate(rows, 1):
        row |= {"id": f"rp{number:03d}", "file": "a.pdf", "claim": "A claim"}
    got = [
        bench.Outcome("anchored", (("close-match", ""),), 9, "text"),
        bench.Outcome("loose", (("number-absent", ""),), 3, "text"),
        bench.Outcome("conflict", (("direction-flip", ""),), 7, "text"),
        bench.Outcome("loose", (("partial-match", ""),), 1, "text"),
    ]
    assert [bench.page_hit(r, g) for r, g in zip(rows, got, strict=True)] == [True, False, True, None]
    assert bench.page_hit(rows[1], got[1], slack=1) is True
    assert [bench.right_reason(r, g) for r, g in zip(rows[1:], got[1:], strict=True)] == [False, True, False]
    lines = bench.summary(rows, got)
    assert "2/3 (67%)" in lines[0] and "3/3 (100%)" in lines[1]
    assert "3/3 (100%)" in lines[2] and "1/3 (33%)" in lines[3]  # flagged; with the right reason
    listed = [line.split()[0] for line in bench.misses(rows, got) if not line.startswith(" ")]
    assert listed == ["rp002", "rp004"]  # wrong band; the faithful one is on an "also" page


def test_a_reversal_read_as_contradicted_has_a_right_reason_and_other_kinds_do_not() -> None:
    # tests/fixtures/real_papers/README.md: a "direction" claim says the opposite of the
    # paper; "contradicted" is the reason that says the source states the opposite.
    bench = _load()
    contradicted = bench.Outcome("conflict", (("contradicted", ""),), 7, "text")
    reversal = {"kind": "direction", "band": "conflict", "reason": "negation", "page": 7}
    overstated = {"kind": "overstated", "band": "loose", "reason": "overstated", "page": 7}
    assert bench.right_reason(reversal, contradicted)
    assert not bench.right_reason(overstated, contradicted)
    assert not bench.right_reason(reversal, bench.Outcome("anchored", (("contradicted", ""),), 7, "text"))


def test_bench_runs_the_pipeline_on_an_invented_paper(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    papers = tmp_path / "papers"
    papers.mkdir()
    build_pdf(
        papers / "beetles.pdf",
        [
            ["Ground beetles on scraped plots. A field survey of an invented marsh."],
            ["Results. Scraped plots held 3.4 beetle nests per square metre against 0.9 on unscraped controls."],
        ],
        title="Ground beetles on scraped plots",
    )
    (papers / "README.md").write_text(
        "| File | Reference |\n|---|---|\n"
        "| beetles.pdf | Okafor N. Ground beetles. Journal of Invented Ecology 3:1–9 (2019). doi:10.0000/b |\n",
        encoding="utf-8",
    )
    claims = tmp_path / "claims.jsonl"
    passage = "Scraped plots held 3.4 beetle nests per square metre against 0.9 on unscraped controls."
    rows = [
        {"id": "rp001", "file": "beetles.pdf", "kind": "faithful", "band": "anchored", "reason": None, "page": 2,
         "passage": passage, "claim": "Scraped marsh plots held 3.4 ground beetle nests per square metre"},
        {"id": "rp002", "file": "beetles.pdf", "kind": "number", "band": "conflict", "reason": "number-mismatch",
         "page": 2, "passage": passage, "claim": "Scraped marsh plots held 7.4 ground beetle nests per square metre"},
    ]  # fmt: skip
    claims.write_text("".join(json.dumps(r) + "\n" for r in rows), encoding="utf-8")
    out = tmp_path / "out"
    code = _load().main(["--claims", str(claims), "--papers", str(papers), "--out", str(out), "--show"])
    printed = capsys.readouterr().out
    assert code == 0
    draft = (out / "draft.md").read_text(encoding="utf-8").splitlines()
    assert draft[2] == "Scraped marsh plots held 3.4 ground beetle nests per square metre [1]."
    assert "1. Okafor N. Ground beetles. Journal of Invented Ecology. 2019;3:1–9. doi:10.0000/b" in draft
    with (out / "mapping.csv").open(encoding="utf-8") as handle:
        assert list(csv.reader(handle)) == [["key", "file"], ["1", "beetles.pdf"]]
    results = [json.loads(line)["got"] for line in (out / "results.jsonl").read_text(encoding="utf-8").splitlines()]
    assert [r["page"] for r in results] == [2, 2]  # both checks found, evidence on the results page
    assert all(r["band"] in {"anchored", "loose", "conflict", "adrift"} and r["reasons"] for r in results)
    assert "page hit@1 (first evidence on the gold page)  2/2 (100%)" in printed
    given = {
        line.split()[0]: line.split()[1:]
        for line in printed.splitlines()
        if line.startswith(("anchored ", "conflict "))
    }
    assert sum(map(int, given["anchored"] + given["conflict"])) == 2  # each claim once in the confusion table


def test_a_broken_claims_line_is_one_message_naming_file_and_line(
    tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    claims = tmp_path / "claims.jsonl"
    claims.write_text('{"file": "a.pdf", "claim": "x", "kind": "faithful", "band": "anchored", "page": 1}\n{oops\n')
    (tmp_path / "README.md").write_text("| File | Reference |\n|---|---|\n| a.pdf | A. B. C 1:1 (2000). |\n")
    code = _load().main(["--claims", str(claims), "--papers", str(tmp_path), "--out", str(tmp_path / "out")])
    assert code == 2
    assert capsys.readouterr().err.strip().splitlines() == [
        f"{claims}: line 2 is not JSON (Expecting property name enclosed in double quotes)"
    ]
