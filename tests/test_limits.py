"""The table of limits: defaults, validation, and how sizes are written in problem lines."""

from __future__ import annotations

import dataclasses

import pytest

import sourcecheck
from sourcecheck.limits import Limits, size_text


def test_the_limits_are_one_frozen_table_offered_by_the_api() -> None:
    limits = sourcecheck.Limits(pdf_pages=10)
    assert limits.pdf_pages == 10 and limits.file_bytes == Limits().file_bytes
    with pytest.raises(dataclasses.FrozenInstanceError):
        limits.pdf_pages = 5  # type: ignore[misc]


@pytest.mark.parametrize("field", [f.name for f in dataclasses.fields(Limits)])
def test_a_limit_must_be_positive(field: str) -> None:
    with pytest.raises(ValueError, match=field):
        Limits(**{field: 0})


def test_sizes_are_written_in_binary_units() -> None:
    # IEC 80000-13 binary prefixes: 1 KiB = 1024 bytes, 1 MiB = 1024 KiB.
    assert size_text(12) == "12 bytes"
    assert size_text(1536) == "1.5 KiB"
    assert size_text(64 << 20) == "64 MiB"
    assert size_text(5 << 30) == "5 GiB"
