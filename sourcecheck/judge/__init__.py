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
from sourcecheck.judge.reading import PairScorer, Reading, read, windows
from sourcecheck.judge.verdict import judge
from sourcecheck.judge.verifier import INPUT_NAMES as VERIFIER_INPUTS
from sourcecheck.judge.verifier import LABELS as VERIFIER_LABELS
from sourcecheck.judge.verifier import MODEL_DIR as VERIFIER_DIR
from sourcecheck.judge.verifier import MODEL_FILE as VERIFIER_FILE
from sourcecheck.judge.verifier import TOKENIZER_FILE as VERIFIER_TOKENIZER
from sourcecheck.judge.verifier import Verifier, encode_pairs, load_tokenizer

__all__ = [
    "EVIDENCE_SEARCHED",
    "FEATURE_NAMES",
    "VERIFIER_DIR",
    "VERIFIER_FILE",
    "VERIFIER_INPUTS",
    "VERIFIER_LABELS",
    "VERIFIER_TOKENIZER",
    "Calibration",
    "CitationJudge",
    "Features",
    "PairScorer",
    "Reading",
    "Search",
    "Verifier",
    "encode_pairs",
    "features_of",
    "judge",
    "load_calibration",
    "load_tokenizer",
    "page_texts",
    "read",
    "windows",
]
