"""The second retrieval stage: a fitted linear ranker over a few evidence features.

The first stage (search.py) fuses the dense cosine and BM25 to pick candidates. Within
one cited work that is not enough to put the backing passage first: on SciFact it did so
for two claims in three, no better than BM25 alone, because the introduction restates
the claim's topic as closely as the results state the finding. The ranker adds what a
reader uses to find the finding: the share of the claim's words in the passage and in
its best sentence, the role of the section it stands in, where in that section it falls,
whether it opens the work, whether it reports a statistic, and wording that reports a
finding or sets the scene.
Only near-ties of the first stage are reordered, and never past a passage whose best
sentence covers the claim clearly better (see search.py). Its weights are fitted by
pairwise logistic regression (the RankNet objective of Burges et al., 2005, with a
linear scorer) in bench/calibrate.py and shipped in judge/calibration.json; a feature
without a weight counts zero.
"""

from __future__ import annotations

import re
from collections.abc import Mapping
from dataclasses import dataclass, field

from sourcecheck.model import SECTION_ROLES, Passage
from sourcecheck.text import coverage

#: The ranker's inputs, in the order ``features`` returns them.
RANK_FEATURES = (
    "dense",
    "bm25",
    "coverage",
    "sentence_coverage",
    "place",
    "opens_source",
    "reports_finding",
    "sets_background",
    "reports_statistics",
    *(f"section:{role}" for role in SECTION_ROLES),
)

#: How many fewer of the claim's content words (as a share) a candidate's best sentence
#: may hold than the first-stage best passage's and still overtake it. Set on the demo,
#: not fitted: SciFact's claims are all findings, so its fit would let the results
#: section outrank any restatement, and the demo's background and methods claims
#: (sample_manuscript/PLANTED.md rows 3-5 and 7) then showed a results passage on another
#: point. Its cost on SciFact's holdout hit@1 is measured in DEVELOPERS.md.
COVERAGE_SLACK = 0.15

# A light sentence cut, enough to score the best sentence of a passage; the passage was
# already made of whole pysbd sentences, so its sentence ends are plain ones.
_SENTENCE_END = re.compile(r"(?<=[.!?])\s+(?=[A-Z(\[\"'“])")


# Rhetorical moves of a scientific text (after Swales's CARS model, 1990, and Teufel's
# argumentative zoning, 1999; from memory): a passage that reports the work's own result
# ("we found", "our data show", "in conclusion") against one that sets the scene or the aim
# ("has been reported", "little is known", "we investigated whether").
_OWN_FINDING = re.compile(
    r"\b(?:we (?:found|find|show|showed|shown|demonstrate[sd]?|observed?|report(?:ed)?|identif(?:y|ied)|conclude[sd]?)"
    r"|(?:our|these|the(?:se)?) (?:results|data|findings|analyses|observations) (?:show|showed|suggest|suggested|"
    r"indicate|indicated|demonstrate|demonstrated|reveal|revealed|support|supported|provide|confirm|confirmed)"
    r"|in conclusion|taken together|collectively,|here,? we|this study (?:shows|showed|provides|demonstrates)"
    r"|results (?:showed|indicated|revealed|demonstrated))\b",
    re.IGNORECASE,
)
_BACKGROUND = re.compile(
    r"\b(?:has been|have been|is known|are known|remains? (?:unclear|unknown|poorly)|little is known"
    r"|previous(?:ly)? (?:studies|work|reported)|is thought|are thought"
    r"|we (?:aimed|sought|investigated|examined|assessed|evaluated|hypothesi[sz]ed|tested|used|performed|measured)"
    r"|to (?:determine|assess|evaluate|investigate|examine) (?:whether|the)|the (?:aim|objective|purpose) of)\b",
    re.IGNORECASE,
)


# A reported statistic: a p-value, a confidence interval, a percentage, a ratio or a
# sample size; the way results sections state findings (common practice, no source).
_STATISTIC = re.compile(
    r"\b[Pp]\s*[<>=≤≥]\s*0?[.·]\d|\b(?:CI|confidence interval)\b|\d\s?%|\b(?:OR|HR|RR)\b|\b[nN]\s*=\s*\d"
)


def sentence_coverage(query: str, text: str) -> float:
    """The largest share of the query's content words that one sentence of ``text`` holds."""
    return max((coverage(query, s) for s in _SENTENCE_END.split(text) if s.strip()), default=0.0)


def features(
    query: str,
    passage: Passage,
    dense: float,
    bm25_scaled: float,
    passage_coverage: float,
    opens_source: bool = False,
) -> list[float]:
    """The passage's ranking features in RANK_FEATURES order.

    ``opens_source``: the passage is its work's first (after the front matter). A work
    opens by setting the scene, so its first passage restates the topic of a claim more
    often than it states the finding; the fitted weight is negative.
    """
    roles = [float(passage.section == role) for role in SECTION_ROLES]
    return [
        dense,
        bm25_scaled,
        passage_coverage,
        sentence_coverage(query, passage.text),
        passage.place,
        float(opens_source),
        float(bool(_OWN_FINDING.search(passage.text))),
        float(bool(_BACKGROUND.search(passage.text))),
        float(bool(_STATISTIC.search(passage.text))),
        *roles,
    ]


@dataclass(frozen=True)
class Ranker:
    """Weights of the ranking features by name, and how far below the first stage's best
    fused score a candidate may be and still be reordered; an empty ranker keeps the
    first-stage order."""

    weights: Mapping[str, float] = field(default_factory=dict)
    margin: float = 0.0
    coverage_slack: float = COVERAGE_SLACK

    def __post_init__(self) -> None:
        unknown = set(self.weights) - set(RANK_FEATURES)
        if unknown:
            raise ValueError(f"unknown ranking features: {', '.join(sorted(unknown))}")

    @property
    def active(self) -> bool:
        return bool(self.weights)

    def vector(self) -> list[float]:
        return [float(self.weights.get(name, 0.0)) for name in RANK_FEATURES]

    def score(self, values: list[float]) -> float:
        return sum(w * v for w, v in zip(self.vector(), values, strict=True))
