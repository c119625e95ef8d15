"""A small hand-built report that the reporter tests render."""

from sourcecheck.model import (
    Band,
    Check,
    Citation,
    Claim,
    ClaimResult,
    Evidence,
    MatchMethod,
    ModelInfo,
    Problem,
    Reason,
    Reference,
    Report,
    SourceMatch,
)


def sample_report() -> Report:
    ref1 = Reference(
        key="1", text='[1] A. Ferrow, "Heron nests," J. Tidal Stud., 2021.', authors=("Ferrow",), year=2021
    )
    ref2 = Reference(key="2", text='[2] B. Quill, "Salt meadows," 2020.', authors=("Quill",), year=2020)
    ref3 = Reference(key="3", text='[3] C. Marrow, "Never cited," 2019.', authors=("Marrow",), year=2019)
    c1 = Citation("[1]", "[1]", "1")
    c2 = Citation("[2, 9]", "[2]", "2")
    c9 = Citation("[2, 9]", "[9]", None)
    claim1 = Claim("c1", "Heron nests rose by 23% [1].", 4, (c1,))
    claim2 = Claim("c2", "Salt meadows spread [2, 9].", 7, (c2, c9))
    anchored = Check(
        citation=c1,
        reference=ref1,
        source="src/ferrow.pdf",
        band=Band.CONFLICT,
        score=0.31,
        reasons=[Reason("number-mismatch", "claim says 23%, source says 18% (p. 4)")],
        evidence=[Evidence("Heron nests rose by 18% after dredging stopped.", 4, 0.91, "src/ferrow.pdf")],
    )
    missing = Check(c2, ref2, None, Band.UNVERIFIABLE, 0.0, [Reason("source-missing", "no readable PDF matches [2]")])
    unresolved = Check(c9, None, None, Band.UNVERIFIABLE, 0.0, [Reason("marker-unresolved", "[9] has no entry")])
    return Report(
        draft="draft.md",
        sources="src",
        model=ModelInfo("all-MiniLM-L6-v2", "/models/minilm"),
        claims=[ClaimResult(claim1, [anchored]), ClaimResult(claim2, [missing, unresolved])],
        references=[ref1, ref2, ref3],
        matches={"1": SourceMatch("1", "src/ferrow.pdf", MatchMethod.DOI)},
        unused_sources=["src/orphan.pdf"],
        problems=[Problem("src/broken.pdf", "not a PDF (no %PDF- header)")],
    )
