"""A .docx's zip members checked before any XML parser sees them: sizes and DTDs."""

from __future__ import annotations

from sourcecheck.drafts.word.reader import read_word_bytes
from sourcecheck.limits import Limits
from tests import hostile


def test_the_plain_package_is_read() -> None:
    # Guards the tests below: the generator's package, unaltered, gives its claim and entry.
    draft = read_word_bytes(hostile.plain_docx(), "d.docx")
    assert [c.text for c in draft.claims] == ["Heron nests rose by 18% [1]."]
    assert len(draft.references) == 1 and draft.problems == []


def test_a_member_that_inflates_past_the_limit_is_refused_before_parsing() -> None:
    draft = read_word_bytes(hostile.zip_bomb_docx(3 << 20), "d.docx", Limits(zip_member_bytes=1 << 20))
    assert draft.claims == []
    assert len(draft.problems) == 1
    assert draft.problems[0].message.startswith("word/document.xml declares 3.0 MiB, over the limit of 1 MiB")


def test_all_members_together_are_bounded_too() -> None:
    draft = read_word_bytes(hostile.plain_docx(), "d.docx", Limits(zip_total_bytes=4096))
    assert len(draft.problems) == 1 and draft.claims == []
    assert draft.problems[0].message.startswith("its parts declare ")
    assert draft.problems[0].message.endswith(" KiB in all, over the limit of 4 KiB (zip_total_bytes); not read")


def test_a_member_whose_declared_size_lies_is_one_problem() -> None:
    draft = read_word_bytes(hostile.lying_size_docx(), "d.docx")
    assert draft.claims == []
    assert [p.message for p in draft.problems] == [
        "cannot be read as a Word document (Bad CRC-32 for file 'word/document.xml')"
    ]


def test_an_external_entity_is_refused_in_one_line_not_lost_silently() -> None:
    draft = read_word_bytes(hostile.entity_docx(), "d.docx")
    assert draft.claims == []
    assert [p.message for p in draft.problems] == [
        "word/document.xml declares a DTD or entity (<!DOCTYPE/<!ENTITY), which Word never writes; not read"
    ]


def test_a_broken_deflate_stream_is_one_problem_not_a_crash() -> None:
    # Found by scripts/fuzz.py: zlib's own error escaped the zip checks.
    draft = read_word_bytes(hostile.corrupt_deflate_docx(), "d.docx")
    assert draft.claims == []
    assert [p.message for p in draft.problems] == [
        "cannot be read as a Word document (Error -3 while decompressing data: invalid code lengths set)"
    ]
