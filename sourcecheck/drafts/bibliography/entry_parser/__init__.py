"""Parsing one plain-text reference entry into fields with a trained linear-chain CRF.

Tokens are cut at spaces and described by the features of the CRF reference-parsing
literature (Peng and McCallum 2004; Councill, Giles and Kan 2008); a CRFsuite model shipped
in ``model/`` labels each token (author, title, date, journal, ...), and the labels are
decoded into :class:`EntryFields`. The model is trained by ``scripts/train_entry_parser.py``
and measured by ``bench/entry_parser.py``.
"""

from __future__ import annotations

from sourcecheck.drafts.bibliography.entry_parser.evaluation import (
    FIELDS,
    Guess,
    Tally,
    assign_folds,
    gold_fields,
    guess_of,
    near_duplicate_groups,
    per_group_table,
    score_entry,
    style_family,
)
from sourcecheck.drafts.bibliography.entry_parser.fields import EntryFields, LabelledSpan
from sourcecheck.drafts.bibliography.entry_parser.labelled import LabelledDataError, read_labelled
from sourcecheck.drafts.bibliography.entry_parser.lexicons import DERIVED, LEXICON_DIR, write_lexicon
from sourcecheck.drafts.bibliography.entry_parser.tagger import MODEL_PATH, EntryTagger, parse_fields
from sourcecheck.drafts.bibliography.entry_parser.training import TRAINING_PARAMS, lexicons_for, train_model

# The training and measuring tools (scripts/train_entry_parser.py, bench/entry_parser.py) use
# this face too; the readers need only parse_fields.
__all__ = [
    "DERIVED",
    "FIELDS",
    "LEXICON_DIR",
    "MODEL_PATH",
    "TRAINING_PARAMS",
    "EntryFields",
    "EntryTagger",
    "Guess",
    "LabelledDataError",
    "LabelledSpan",
    "Tally",
    "assign_folds",
    "gold_fields",
    "guess_of",
    "lexicons_for",
    "near_duplicate_groups",
    "parse_fields",
    "per_group_table",
    "read_labelled",
    "score_entry",
    "style_family",
    "train_model",
    "write_lexicon",
]
