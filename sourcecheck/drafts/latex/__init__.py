"""LaTeX drafts: ``\\input`` followed inside the draft's folder, cite commands, bibliographies."""

from __future__ import annotations

from sourcecheck.drafts.latex.reader import read_latex

__all__ = ["read_latex"]
