"""Training a CRF entry tagger on labelled entries (used by the training script and the bench).

The trainer is CRFsuite's L-BFGS with elastic-net regularisation: the L1 part drops most
word features, which keeps the model file small. The values of ``TRAINING_PARAMS`` were set
by cross-validation on the labelled data (bench/entry_parser.py), not on any test split.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from pathlib import Path

import pycrfsuite

from sourcecheck.drafts.bibliography.entry_parser.features import entry_features
from sourcecheck.drafts.bibliography.entry_parser.labelled import LabelledEntry, token_labels
from sourcecheck.drafts.bibliography.entry_parser.lexicons import Lexicons, curated_lexicons, derive_lexicons
from sourcecheck.drafts.bibliography.entry_parser.tagger import MAX_TOKENS
from sourcecheck.drafts.bibliography.entry_parser.tokens import tokenize

TRAINING_PARAMS: Mapping[str, float | int | bool] = {
    "c1": 0.1,
    "c2": 0.01,
    "max_iterations": 150,
    "feature.possible_transitions": True,
}


def lexicons_for(entries: Sequence[LabelledEntry]) -> dict[str, frozenset[str]]:
    """Curated word lists plus lists derived from ``entries`` (the training part only)."""
    return {**curated_lexicons(), **derive_lexicons(entries)}


def train_model(
    entries: Sequence[LabelledEntry],
    lexicons: Lexicons,
    model_path: Path,
    params: Mapping[str, float | int | bool] = TRAINING_PARAMS,
) -> None:
    """Fit a CRF on ``entries`` and write it to ``model_path``."""
    trainer = pycrfsuite.Trainer(algorithm="lbfgs", verbose=False)
    for entry in entries:
        tokens = tokenize(entry.text)[:MAX_TOKENS]
        if tokens:
            trainer.append(entry_features(tokens, lexicons), token_labels(entry)[:MAX_TOKENS])
    trainer.set_params(dict(params))
    model_path.parent.mkdir(parents=True, exist_ok=True)
    trainer.train(str(model_path))
