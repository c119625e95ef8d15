"""Which section of a source a paragraph stands in: background, methods, results, ...

A work backs a claim with its own findings, and papers state those in the abstract,
the results and the conclusions; the introduction mostly retells other people's work
and the methods say what was done, not what was found. Retrieval weighs a passage by
its section's role (the weights are fitted, see bench/calibrate.py), so the role must
be known for every passage. Sections are announced two ways:

- a heading on a line of its own ("2. Materials and methods", "RESULTS", "IV. Discussion");
- a run-in heading that opens a paragraph, as structured abstracts do ("RESULTS Of the
  412 nests ...", "Conclusions: ..."): upper case, or followed by a colon or full stop.

The heading vocabulary is the IMRaD structure (ANSI/NISO Z39.14-1997, "Guidelines for
Abstracts", and the ICMJE recommendations for structured abstracts; from memory) plus
the back matter of a paper (funding, acknowledgements, competing interests).
"""

from __future__ import annotations

import re

#: Heading words (lower case, one space between words) and the role each announces.
HEADINGS: dict[str, str] = {
    **dict.fromkeys(["abstract", "summary", "synopsis"], "abstract"),
    **dict.fromkeys(
        [
            "introduction",
            "background",
            "context",
            "importance",
            "rationale",
            "objective",
            "objectives",
            "aim",
            "aims",
            "purpose",
            "related work",
            "literature review",
            "state of the art",
        ],
        "background",
    ),
    **dict.fromkeys(
        [
            "method",
            "methods",
            "methodology",
            "materials and methods",
            "material and methods",
            "methods and materials",
            "patients and methods",
            "subjects and methods",
            "experimental procedures",
            "experimental",
            "design",
            "study design",
            "setting",
            "settings",
            "design and setting",
            "design, setting, and participants",
            "design, setting and participants",
            "participants",
            "patients",
            "subjects",
            "population",
            "sample",
            "intervention",
            "interventions",
            "exposure",
            "exposures",
            "measurements",
            "main outcome measures",
            "main outcomes and measures",
            "main outcome measure",
            "outcome measures",
            "data sources",
            "study selection",
            "data extraction",
            "statistical analysis",
            "analysis",
        ],
        "methods",
    ),
    **dict.fromkeys(["results", "result", "findings", "main results", "results and discussion"], "results"),
    **dict.fromkeys(["discussion", "general discussion", "comment", "limitations"], "discussion"),
    **dict.fromkeys(
        [
            "conclusion",
            "conclusions",
            "interpretation",
            "implications",
            "significance",
            "concluding remarks",
            "conclusions and relevance",
            "relevance",
            "summary and conclusions",
        ],
        "conclusions",
    ),
    **dict.fromkeys(
        [
            "funding",
            "acknowledgements",
            "acknowledgments",
            "acknowledgement",
            "acknowledgment",
            "competing interests",
            "conflict of interest",
            "conflicts of interest",
            "author contributions",
            "data availability",
            "trial registration",
            "registration",
            "supplementary material",
            "abbreviations",
        ],
        "back-matter",
    ),
}

_LONGEST = max(len(h.split()) for h in HEADINGS)
# "2", "2.1", "II.", "A." and the like before a heading; a full stop, colon or dash after it.
_NUMBERING = re.compile(r"^(?:\d+(?:\.\d+)*\.?|[IVX]+\.|[A-H]\.)\s+")
_TRAILING = re.compile(r"[\s.:—–-]+$")


def _role_of(words: str) -> str | None:
    return HEADINGS.get(" ".join(words.lower().replace("&", "and").split()))


def heading_role(paragraph: str) -> str | None:
    """The role a stand-alone heading line announces ("3 Results" -> "results"), else None."""
    text = _TRAILING.sub("", _NUMBERING.sub("", paragraph.strip()))
    if not text or len(text.split()) > _LONGEST:
        return None
    return _role_of(text)


def run_in_heading(paragraph: str) -> tuple[str, str] | None:
    """(role, heading as written) for a paragraph that opens with a run-in heading, else None.

    The heading must be upper case ("MAIN OUTCOME MEASURES Weight ...") or end in a colon
    or full stop ("Results: ...", "Conclusions. ..."), so an ordinary sentence that opens
    with "Results of the survey ..." or "Design of ..." is not taken for one. The longest
    heading wins ("MATERIALS AND METHODS" over "MATERIALS").
    """
    numbered = _NUMBERING.match(paragraph.strip())
    words = paragraph.strip()[numbered.end() :].split() if numbered else paragraph.split()
    for n in range(min(_LONGEST, len(words) - 1), 0, -1):
        head = words[:n]
        last = head[-1]
        # A numeral alone does not mark a heading: "12 patients were enrolled" opens a
        # sentence; a numbered heading is capitalised ("3 Results The marsh ...").
        marked = last.endswith((":", ".")) or (bool(numbered) and head[0][:1].isupper())
        bare = [w.rstrip(":.,") for w in head]
        written = " ".join(bare)
        if not marked and not (written.isupper() and len(written) > 2):
            continue
        role = _role_of(written.replace(",", ""))
        if role is None and "," in written:
            role = _role_of(written)
        if role is None:
            role = _role_of(" ".join(head).rstrip(":."))
        if role is not None:
            return role, " ".join(head).rstrip(":.")
    return None
