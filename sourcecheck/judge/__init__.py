"""The judgment stage: a claim and the passages found for it -> a band, a score, reasons.

:class:`CitationJudge` judges one citation the way a person would with the PDF open
(:mod:`.citation`); the search it reads is passed in. Underneath: features
(:mod:`.features`: similarity, coverage, numbers, wording cues, ratio estimates, group
comparisons), the fitted logistic score (:mod:`.calibration`), the band rules
(:mod:`.verdict`), quotations (:mod:`.quotes`) and page locators (:mod:`.locators`).
"""

from __future__ import annotations

from sourcecheck.judge.calibration import Calibration, load_calibration
from sourcecheck.judge.citation import EVIDENCE_SEARCHED, CitationJudge, Search, page_texts
from sourcecheck.judge.features import FEATURE_NAMES, Features, features_of
from sourcecheck.judge.verdict import judge

__all__ = [
    "EVIDENCE_SEARCHED",
    "FEATURE_NAMES",
    "Calibration",
    "CitationJudge",
    "Features",
    "Search",
    "features_of",
    "judge",
    "load_calibration",
    "page_texts",
]
