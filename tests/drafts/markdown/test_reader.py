"""Tests for the Markdown and plain-text reader."""

from __future__ import annotations

from sourcecheck.drafts.markdown.reader import prose_blocks, read_markdown, visible_lines

DRAFT = """---
title: Field notes (Okafor, 2019)
---

# Yields on *treated* plots

Yields rose by 12% (Okafor et al., 2019; Brandt 2021a).
Okafor and Lin (2019) saw the same in Fig. 2 of their report. Nothing cited here.

<!-- (Brandt, 2021b) is hidden in a comment -->

```
print("[3] (Okafor, 2019)")
```

- A list item citing van der Berg (2020).
- Another item (e.g., Brandt, 2021a, 2021b).

> A quoted remark (Ólafsdóttir, 2017).

## Sources of error (Okafor, 2019)

Heading above is not a claim.

## References

Brandt, D. (2021a). First field study. *Journal of Fields*, 1, 1–2.

Brandt, D. (2021b). Second field study. *Journal of Fields*, 2, 3–4.
Okafor, A. B., & Lin, C. (2019). Two-author work. *J*, 3, 5.
Okafor, A. B., Lin, C., & Brandt, D. (2019). Three-author work on
    things. *J*, 3, 5. https://doi.org/10.1234/ABCD
- van der Berg, J. (2020). Particles. J.
- Ólafsdóttir, S. (2017). Accents. J.

## Appendix A

More text (Okafor & Lin, 2019).
"""


def test_full_draft() -> None:
    draft = read_markdown(DRAFT, "draft.md")
    assert draft.path == "draft.md"
    assert draft.problems == []
    got = [(c.id, c.line, [(x.label, x.key) for x in c.citations]) for c in draft.claims]
    assert got == [
        ("c1", 7, [("Okafor et al., 2019", "okafor2019_2"), ("Brandt, 2021a", "brandt2021a")]),
        ("c2", 8, [("Okafor & Lin, 2019", "okafor2019")]),
        ("c3", 16, [("van der Berg, 2020", "vanderberg2020")]),
        ("c4", 17, [("Brandt, 2021a", "brandt2021a"), ("Brandt, 2021b", "brandt2021b")]),
        ("c5", 19, [("Ólafsdóttir, 2017", "olafsdottir2017")]),
        ("c6", 38, [("Okafor & Lin, 2019", "okafor2019")]),
    ]
    assert draft.claims[1].text == "Okafor and Lin (2019) saw the same in Fig. 2 of their report."
    assert draft.claims[4].text == "A quoted remark (Ólafsdóttir, 2017)."
    keys = [(r.key, r.line) for r in draft.references]
    assert keys == [
        ("brandt2021a", 27),
        ("brandt2021b", 29),
        ("okafor2019", 30),
        ("okafor2019_2", 31),
        ("vanderberg2020", 33),
        ("olafsdottir2017", 34),
    ]
    assert draft.references[3].doi == "10.1234/abcd"
    assert draft.references[3].title == "Three-author work on things"
    assert draft.references[3].text.endswith("*J*, 3, 5. https://doi.org/10.1234/ABCD")


def test_ieee_numbered_plain_text() -> None:
    text = (
        "Rates fell as reported in [1], [2].\n"
        "The effect held [1]–[3], and again [4, p. 7].\n"
        "\n"
        "REFERENCES\n"
        "\n"
        '[1] A. B. Okafor, C. Lin, and D. Brandt, "Title of the work," Journal, vol. 3, no. 2,\n'
        "    pp. 1–10, 2019, doi: 10.1234/abcd.\n"
        "[2] W.-K. Chen, Linear Networks and Systems. Belmont, CA, USA: Wadsworth, 1993.\n"
        '[3] D. Brandt, "Fields," J, 2021.\n'
    )
    draft = read_markdown(text, "d.txt")
    assert [r.key for r in draft.references] == ["1", "2", "3"]
    assert draft.references[0].line == 6
    assert draft.references[0].doi == "10.1234/abcd"
    assert [(c.line, [(x.label, x.key, x.locator) for x in c.citations]) for c in draft.claims] == [
        (1, [("[1]", "1", None), ("[2]", "2", None)]),
        (2, [("[1]", "1", None), ("[2]", "2", None), ("[3]", "3", None), ("[4]", None, "p. 7")]),
    ]
    assert draft.problems == []


def test_reference_list_sentences_are_not_claims() -> None:
    text = "# References\n\n[1] Okafor, A. (2019). Cited by Lin (2018). J.\n"
    draft = read_markdown(text, "d.md")
    assert draft.claims == []
    assert [p.message for p in draft.problems] == ["no citation markers found in the text"]


def test_problems_for_missing_parts() -> None:
    no_list = read_markdown("Yields rose [1].\n", "d.md")
    assert [p.message for p in no_list.problems] == [
        "no reference list found (no heading such as References, Bibliography or Works cited)"
    ]
    assert len(no_list.claims) == 1 and no_list.claims[0].citations[0].key is None
    empty_list = read_markdown("Yields rose [1].\n\n## References\n\n## Appendix\n", "d.md")
    assert [p.message for p in empty_list.problems] == ["the reference list under 'References' (line 3) has no entries"]
    empty = read_markdown(" \n\n", "d.md")
    assert [(p.file, p.message) for p in empty.problems] == [("d.md", "the draft is empty")]


def test_visible_lines_keep_line_count() -> None:
    text = "---\na: 1\n---\ntext\n<!-- a\nb -->\n~~~\ncode\n~~~\n[1]: https://x.org\nend"
    lines = visible_lines(text)
    assert len(lines) == text.count("\n") + 1
    assert [i for i, line in enumerate(lines) if line] == [3, 10]


def test_blocks_skip_headings_and_table_rules() -> None:
    lines = ["# Title", "Para one", "goes on.", "", "Setext", "------", "| a [1] | b |", "|---|---|", "**Bold**"]
    blocks = list(prose_blocks(lines))
    assert [(b.text, b.line) for b in blocks] == [("Para one\ngoes on.", 2), ("  a [1]   b  ", 7)]
