"""Parsing one plain-text reference entry into fields with a trained linear-chain CRF.

Tokens are cut at spaces and described by the features of the CRF reference-parsing
literature (Peng and McCallum 2004; Councill, Giles and Kan 2008); a CRFsuite model shipped
in ``model/`` labels each token (author, title, date, journal, ...), and the labels are
decoded into :class:`EntryFields`. The model is trained by ``scripts/train_entry_parser.py``
and measured by ``bench/entry_parser.py``.
"""

from __future__ import annotations

from sourcecheck.drafts.bibliography.entry_parser.fields import EntryFields, LabelledSpan
from sourcecheck.drafts.bibliography.entry_parser.tagger import parse_fields

__all__ = ["EntryFields", "LabelledSpan", "parse_fields"]
