"""Tests for the benchmark corpus builder, on a tiny invented dataset in the SciFact layout.

The real dataset is never read here: every claim and abstract below is made up. The PDFs
are checked with two independent extractors (pypdf and pdfminer.six), the font coverage
with fontTools, so the checks do not rest on the builder's own reading of its output.
"""

from __future__ import annotations

import csv
import importlib.util
import json
import re
import sys
from pathlib import Path
from types import ModuleType

import pytest
from fontTools.ttLib import TTFont
from pdfminer.high_level import extract_pages
from pdfminer.layout import LTChar, LTTextContainer
from pypdf import PdfReader

BUILDER = Path(__file__).resolve().parents[2] / "bench" / "scifact_corpus.py"


def _load_builder() -> ModuleType:
    """bench/ is not a package, so the script is imported from its path."""
    spec = importlib.util.spec_from_file_location("scifact_corpus", BUILDER)
    assert spec and spec.loader
    module = importlib.util.module_from_spec(spec)
    sys.modules[spec.name] = module
    spec.loader.exec_module(module)
    return module


sc = _load_builder()

# --- the invented dataset --------------------------------------------------------------

DOCS = [
    {
        "doc_id": 101,
        "title": "Glimmer moss doubles the survival of lantern beetles reared in glass jars for many weeks.",
        "abstract": [
            "Lantern beetles were reared on glimmer moss for 40 days.   \n",
            "Survival rose from 31% to 64% (p ≤ 0.01, n = 120 ± 4).",
            "The effect needed β-carotene at 5 µg per gram.",
        ],
        "structured": False,
    },
    {
        "doc_id": 202,
        "title": "Tide clocks in  coastal snails   ",
        "abstract": [
            "BACKGROUND Coastal snails keep time by the tides.",
            "Their clocks drift in still water.",
            "MAIN OUTCOME MEASURES Phase shift in hours.",
            "RESULTS Snails in tanks drifted by 2.5 hours\u200bper week.",
            "DNA of the clock gene was unchanged.",
        ],
        "structured": True,
    },
    {
        "doc_id": 303,
        "title": "On the “quiet” rivers of Velmora",
        "abstract": ["Velmora's rivers carry little sediment.", "Flow is steady all year."],
        "structured": False,
    },
    {
        "doc_id": 404,
        "title": "Salt crusts and dune walking",
        "abstract": ["Salt crusts slow dune migration by a third."],
        "structured": False,
    },
    {
        "doc_id": 505,
        "title": "Mirror lakes are warmer than thought",
        "abstract": ["Mirror lakes stay 3 °C warmer in winter."],
        "structured": False,
    },
]

CLAIMS = [
    {
        "id": 7,
        "claim": "Glimmer moss doubles lantern beetle survival.",
        "evidence": {"101": [{"sentences": [1], "label": "SUPPORT"}]},
        "cited_doc_ids": [101],
    },
    {
        "id": 8,
        "claim": "Snail tide clocks stay exact [in tanks] without tides",
        "evidence": {"202": [{"sentences": [3], "label": "CONTRADICT"}]},
        "cited_doc_ids": [202, 303],
    },
    {
        "id": 9,
        "claim": "Velmora rivers carry sediment. They flood yearly.",
        "evidence": {},
        "cited_doc_ids": [303],
    },
    {
        "id": 10,
        "claim": 'Dunes can be stopped by "salt crusts."',
        "evidence": {"404": [{"sentences": [0], "label": "SUPPORT"}]},
        "cited_doc_ids": [404, 101],
    },
]

EXPECTED_LABEL = {  # read off the invented evidence above, pair by pair
    (7, 101): "SUPPORT",
    (8, 202): "CONTRADICT",
    (8, 303): "NEI",
    (9, 303): "NEI",
    (10, 404): "SUPPORT",
    (10, 101): "NEI",
}


def write_dataset(folder: Path, claims: list[dict], docs: list[dict]) -> Path:
    """Write claims and corpus as JSON lines, the dataset's layout."""
    folder.mkdir(parents=True, exist_ok=True)
    for name, rows in ((sc.CLAIMS_FILE, claims), (sc.CORPUS_FILE, docs)):
        text = "".join(json.dumps(row, ensure_ascii=False) + "\n" for row in rows)
        (folder / name).write_text(text, encoding="utf-8")
    return folder


@pytest.fixture(scope="module")
def built(tmp_path_factory: pytest.TempPathFactory) -> tuple[Path, object]:
    """One full build of the invented dataset, with no decoys, shared by the read-only tests."""
    root = tmp_path_factory.mktemp("scifact")
    data = write_dataset(root / "data", CLAIMS, DOCS)
    summary = sc.build(data, root / "out", seed=3, decoys=0.0)
    return root / "out", summary


def read_gold(out: Path) -> list[dict]:
    return [json.loads(line) for line in (out / "gold.jsonl").read_text("utf-8").splitlines()]


def claim_paragraphs(out: Path) -> list[str]:
    """The draft's claim paragraphs: non-empty lines before the reference heading."""
    text = (out / "draft.md").read_text("utf-8")
    body = text.split("## References")[0]
    return [line for line in body.splitlines() if line and not line.startswith("#")]


def norm(text: str) -> str:
    return re.sub(r"\s+", " ", text).strip()


# --- gold, draft and mapping -----------------------------------------------------------


def test_every_cited_pair_gets_the_datasets_label(built: tuple[Path, object]) -> None:
    out, summary = built
    gold = read_gold(out)
    assert {(g["claim_id"], g["doc_id"]): g["label"] for g in gold} == EXPECTED_LABEL
    assert summary.pairs == {"SUPPORT": 2, "CONTRADICT": 1, "NEI": 3}
    assert summary.claims == 4 and summary.pdfs == 5 - 1  # doc 505 is cited by no claim


def test_rationales_are_the_evidence_sentences_as_printed(built: tuple[Path, object]) -> None:
    out, _ = built
    by_pair = {(g["claim_id"], g["doc_id"]): g["rationales"] for g in read_gold(out)}
    assert by_pair[(7, 101)] == ["Survival rose from 31% to 64% (p ≤ 0.01, n = 120 ± 4)."]
    # The zero-width space is printed as a break, so the gold text carries a plain space.
    assert by_pair[(8, 202)] == ["RESULTS Snails in tanks drifted by 2.5 hours per week."]
    assert by_pair[(8, 303)] == []


def test_draft_places_markers_before_the_final_period(built: tuple[Path, object]) -> None:
    out, _ = built
    gold = read_gold(out)
    paragraphs = claim_paragraphs(out)
    assert len(paragraphs) == len(CLAIMS)
    for g in gold:
        line = paragraphs[g["claim_index"] - 1]
        # IEEE numeric citation style: the bracketed number sits inside the sentence,
        # before its punctuation (IEEE Editorial Style Manual, from memory).
        match = re.fullmatch(r"(.*) \[(\d+(?:, \d+)*)\]\.", line)
        assert match, line
        assert match.group(1) == g["claim"]
        assert g["ref"] in match.group(2).split(", ")


def test_claim_text_cannot_be_mistaken_for_markers(built: tuple[Path, object]) -> None:
    out, _ = built
    claims = {g["claim_id"]: g["claim"] for g in read_gold(out)}
    assert claims[8] == "Snail tide clocks stay exact (in tanks) without tides"
    assert claims[9] == "Velmora rivers carry sediment; They flood yearly"  # one sentence
    assert claims[10] == 'Dunes can be stopped by "salt crusts"'
    for text in claims.values():
        assert "[" not in text and "]" not in text


def test_references_are_numbered_in_order_of_first_citation(built: tuple[Path, object]) -> None:
    out, _ = built
    # IEEE Reference Guide: references are numbered in the order they are first cited
    # (from memory). So the numbers read left to right through the draft never skip ahead.
    seen: list[int] = []
    for line in claim_paragraphs(out):
        for number in map(int, re.findall(r"\d+", line[line.rindex("[") :])):
            if number not in seen:
                assert number == len(seen) + 1
                seen.append(number)
    assert seen == list(range(1, len(seen) + 1))


def test_mapping_and_reference_titles_point_at_the_same_pdf(built: tuple[Path, object]) -> None:
    out, _ = built
    with (out / "mapping.csv").open(encoding="utf-8", newline="") as handle:
        rows = list(csv.DictReader(handle))
    mapping = {row["key"]: row["file"] for row in rows}
    gold = read_gold(out)
    assert {g["ref"]: f"doc-{g['doc_id']}.pdf" for g in gold} == mapping
    assert sorted(p.name for p in (out / "sources").iterdir()) == sorted(mapping.values())
    draft = (out / "draft.md").read_text("utf-8")
    entries = dict(re.findall(r"^\[(\d+)\] (.+)$", draft.split("## References")[1], re.M))
    for key, file in mapping.items():
        title = PdfReader(out / "sources" / file).metadata.title
        quoted = re.match(r'"(.+?),?" ', entries[key])
        assert quoted, entries[key]
        # Inner double quotes become single ones so the entry's title stays one quoted span.
        assert quoted.group(1) == title.rstrip(".").replace("“", "‘").replace("”", "’")


# --- the PDFs --------------------------------------------------------------------------


def test_pdf_title_comes_first_and_every_sentence_extracts(built: tuple[Path, object]) -> None:
    out, _ = built
    covered = sc.font_codepoints(sc.FONT_REGULAR, sc.FONT_BOLD)
    for doc in DOCS[:4]:
        reader = PdfReader(out / "sources" / f"doc-{doc['doc_id']}.pdf")
        title = norm(doc["title"])
        assert reader.metadata.title == title
        first_lines = reader.pages[0].extract_text().splitlines()
        assert "  " not in first_lines[0]  # set ragged-right: no padded word spaces
        text = norm(" ".join(page.extract_text() for page in reader.pages))
        assert text.startswith(title)
        for sentence in doc["abstract"]:
            assert sc.clean_text(sentence, covered) in text


def test_symbols_survive_in_the_pdf(built: tuple[Path, object]) -> None:
    out, _ = built
    # pdfminer.six is an extractor independent of the pypdf used by the pipeline.
    text = "".join(
        element.get_text()
        for page in extract_pages(out / "sources" / "doc-101.pdf")
        for element in page
        if isinstance(element, LTTextContainer)
    )
    for symbol in ("≤", "±", "β", "µ"):
        assert symbol in text


def test_title_is_bold_and_larger_than_the_body(built: tuple[Path, object]) -> None:
    out, _ = built
    chars = [
        char
        for page in extract_pages(out / "sources" / "doc-202.pdf")
        for box in page
        if isinstance(box, LTTextContainer)
        for line in box
        for char in line
        if isinstance(char, LTChar)
    ]
    title = next(c for c in chars if c.get_text() == "T")  # first letter of "Tide clocks"
    body = next(c for c in chars if c.get_text() == "w")  # from "water", body text only
    assert "Bold" in title.fontname and "Bold" not in body.fontname
    assert title.size > body.size


def test_structured_abstract_breaks_at_headings(built: tuple[Path, object]) -> None:
    out, _ = built
    covered = sc.font_codepoints(sc.FONT_REGULAR, sc.FONT_BOLD)
    doc = sc.Doc(202, DOCS[1]["title"], tuple(DOCS[1]["abstract"]), True)
    parts = sc.paragraphs(doc, covered)
    assert [heading for heading, _ in parts] == ["BACKGROUND", "MAIN OUTCOME MEASURES", "RESULTS"]
    # A leading acronym ("DNA") is not a heading: that sentence stays in RESULTS.
    assert parts[2][1].endswith("DNA of the clock gene was unchanged.")
    lines = PdfReader(out / "sources" / "doc-202.pdf").pages[0].extract_text().splitlines()
    for heading, _ in parts:
        assert any(line.startswith(heading + " ") for line in lines), heading


def test_long_abstract_flows_to_a_second_page(tmp_path: Path) -> None:
    long_doc = {
        "doc_id": 606,
        "title": "A very long abstract",
        "abstract": [f"Sentence number {i} talks about the patient cohort at length." for i in range(120)],
        "structured": False,
    }
    claim = {"id": 1, "claim": "Cohorts talk.", "evidence": {}, "cited_doc_ids": [606]}
    data = write_dataset(tmp_path / "data", [claim], [long_doc])
    sc.build(data, tmp_path / "out", decoys=0.0)
    reader = PdfReader(tmp_path / "out" / "sources" / "doc-606.pdf")
    assert len(reader.pages) >= 2
    text = norm(" ".join(page.extract_text() for page in reader.pages))
    assert all(sentence in text for sentence in long_doc["abstract"])
    assert "length." in reader.pages[-1].extract_text()


def test_build_is_byte_for_byte_repeatable(tmp_path: Path) -> None:
    data = write_dataset(tmp_path / "data", CLAIMS, DOCS)
    sc.build(data, tmp_path / "a", seed=5, decoys=0.5)
    sc.build(data, tmp_path / "b", seed=5, decoys=0.5, jobs=2)
    files = sorted(p.relative_to(tmp_path / "a") for p in (tmp_path / "a").rglob("*") if p.is_file())
    assert files
    for rel in files:
        assert (tmp_path / "a" / rel).read_bytes() == (tmp_path / "b" / rel).read_bytes(), rel


def test_font_gaps_are_replaced(tmp_path: Path) -> None:
    covered = sc.font_codepoints(sc.FONT_REGULAR, sc.FONT_BOLD)
    cmap = set(TTFont(str(sc.FONT_REGULAR)).getBestCmap())
    # Preconditions from fontTools' reading of the font, not from the builder.
    assert 0xE000 not in cmap and 0xFF21 not in cmap and ord("β") in cmap
    # U+FF21 FULLWIDTH LATIN CAPITAL LETTER A decomposes (NFKD) to "A" (Unicode data).
    assert sc.clean_text("β\uff21\ue000  x", covered) == "βA? x"


# --- decoys, splits, limits ------------------------------------------------------------


def records(count: int) -> list:
    """Invented claims as the builder's records, for the functions that need no PDFs."""
    return [sc.ClaimRecord(id=i, text=f"Claim {i} holds.", cited=(1000 + i,)) for i in range(count)]


def _docs(ids: list[int]) -> dict:
    return {
        d: sc.Doc(doc_id=d, title=f"Title {d}", sentences=(f"Abstract {d} about topic {d % 5}.",), structured=False)
        for d in ids
    }


def test_decoy_count_and_targets() -> None:
    claims = records(40)
    pool = _docs([1000 + i for i in range(40)])
    decoys = sc.choose_decoys(claims, pool, 0.25, seed=1)
    assert len(decoys) == 10  # 25% of 40 claims, one decoy each
    cited = {c.id: c.cited for c in claims}
    assert all(doc not in cited[claim] and doc in pool for claim, doc in decoys.items())
    assert sc.choose_decoys(claims, pool, 0.25, seed=1) == decoys
    assert sc.choose_decoys(claims, pool, 0.25, seed=2) != decoys


def test_half_the_decoys_come_from_the_same_field() -> None:
    # Invented field of 200 abstracts on four topics; a near decoy shares the claim's topic.
    claims = [sc.ClaimRecord(id=i, text=f"Heron nests topic{i % 4} rose.", cited=(2000 + i,)) for i in range(8)]
    docs = {
        2000 + i: sc.Doc(
            doc_id=2000 + i, title=f"Study {i}", sentences=(f"topic{i % 4} heron nests.",), structured=False
        )
        for i in range(200)
    }
    decoys = sc.choose_decoys(claims, docs, 1.0, seed=3)
    near = [c for c in claims if f"topic{c.id % 4}" in docs[decoys[c.id]].sentences[0]]
    assert len(near) >= len(claims) // 2


def test_decoys_are_cited_and_labelled_unrelated(tmp_path: Path) -> None:
    data = write_dataset(tmp_path / "data", CLAIMS, DOCS)
    summary = sc.build(data, tmp_path / "out", seed=1, decoys=0.5)
    gold = read_gold(tmp_path / "out")
    decoys = [g for g in gold if g["label"] == "UNRELATED"]
    assert len(decoys) == 2 == summary.pairs["UNRELATED"]  # half of 4 claims
    cited = {c["id"]: c["cited_doc_ids"] for c in CLAIMS}
    for g in decoys:
        assert g["doc_id"] not in cited[g["claim_id"]] and g["rationales"] == []
        line = claim_paragraphs(tmp_path / "out")[g["claim_index"] - 1]
        assert g["ref"] in re.findall(r"\d+", line[line.rindex("[") :])
    # The other pairs keep the dataset's labels.
    assert {(g["claim_id"], g["doc_id"]): g["label"] for g in gold if g not in decoys} == EXPECTED_LABEL


def test_split_is_fixed_by_claim_id_and_near_seventy_thirty() -> None:
    ids = range(10_000)
    sides = [sc.split_of(i) for i in ids]
    share = sides.count("holdout") / len(sides)
    # Binomial(10000, 0.3): standard deviation sqrt(0.3 * 0.7 / 10000) ~ 0.0046, so 0.02 is
    # over four standard deviations (the textbook binomial variance formula).
    assert abs(share - 0.3) < 0.02
    assert [sc.split_of(i) for i in ids] == sides


def test_gold_split_follows_the_claim(built: tuple[Path, object]) -> None:
    out, summary = built
    gold = read_gold(out)
    assert all(g["split"] == sc.split_of(g["claim_id"]) for g in gold)
    assert sum(summary.splits.values()) == len(gold)


def test_limit_takes_a_prefix_of_the_seeded_order() -> None:
    claims = records(30)
    full = [c.id for c in sc.select_claims(claims, None, seed=4)]
    few = [c.id for c in sc.select_claims(list(reversed(claims)), 6, seed=4)]
    assert few == full[:6]  # the input file's order does not matter, only the seed
    assert sorted(full) == list(range(30)) and full != sorted(full)
    assert [c.id for c in sc.select_claims(claims, None, seed=5)] != full


def test_limited_rebuild_writes_only_what_it_cites(tmp_path: Path) -> None:
    data = write_dataset(tmp_path / "data", CLAIMS, DOCS)
    sc.build(data, tmp_path / "out", decoys=0.0)
    summary = sc.build(data, tmp_path / "out", limit=1, decoys=0.0)
    gold = read_gold(tmp_path / "out")
    assert summary.claims == 1 and len({g["claim_id"] for g in gold}) == 1
    # PDFs of the earlier, larger build are gone: they would count as unused sources.
    pdfs = sorted(p.name for p in (tmp_path / "out" / "sources").glob("*.pdf"))
    assert pdfs == sorted(f"doc-{g['doc_id']}.pdf" for g in gold)


# --- bad input -------------------------------------------------------------------------


def test_bad_lines_become_problems_and_the_rest_is_built(tmp_path: Path) -> None:
    data = write_dataset(tmp_path / "data", CLAIMS[:2], DOCS)
    with (data / sc.CLAIMS_FILE).open("a", encoding="utf-8") as handle:
        handle.write("{not json\n")
        handle.write(json.dumps({"id": 11, "claim": "Cites a ghost.", "cited_doc_ids": [999]}) + "\n")
    summary = sc.build(data, tmp_path / "out", decoys=0.0)
    messages = [p.message for p in summary.problems]
    assert any("line 3" in m and "not valid JSON" in m for m in messages)
    assert any("999" in m for m in messages)
    assert summary.claims == 2


def test_missing_input_gives_one_line_and_status_2(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    status = sc.main([str(tmp_path / "nowhere"), str(tmp_path / "out")])
    err = capsys.readouterr().err.strip()
    assert status == 2
    assert len(err.splitlines()) == 1 and sc.CLAIMS_FILE in err and "Traceback" not in err


def test_main_prints_a_summary(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    data = write_dataset(tmp_path / "data", CLAIMS, DOCS)
    assert sc.main([str(data), str(tmp_path / "out"), "--decoys", "0", "--jobs", "1"]) == 0
    out = capsys.readouterr().out
    assert "claims 4; pairs 6 (SUPPORT 2, CONTRADICT 1, NEI 3, UNRELATED 0)" in out
    assert "PDFs 4" in out
