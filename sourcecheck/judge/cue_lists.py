"""The cue lists (``cue_lists.toml``) as typed data, loaded once.

Each list in the TOML file names its source; this module only reads and checks them.
"""

from __future__ import annotations

import tomllib
from dataclasses import dataclass
from functools import lru_cache
from importlib import resources


@dataclass(frozen=True)
class CueFinding:
    """One way the claim goes beyond its passage, with the words on each side."""

    code: str  # "overstated" | "negation" | "direction-flip" | "scope-wider"
    claim_cue: str  # the words in the claim, "" when the claim has none
    source_cue: str  # the words in the passage, "" when the passage has none
    message: str  # one readable sentence, without the page


@dataclass(frozen=True)
class DirectionAxis:
    """Two opposite sides of one meaning (amount: up/down), each a list of cue entries."""

    name: str
    sides: tuple[str, str]
    terms: tuple[tuple[str, ...], tuple[str, ...]]


@dataclass(frozen=True)
class ScopeGroup:
    """Synonymous terms for one restriction of where a finding holds ("mice", "women")."""

    name: str
    kind: str  # "species" | "in-vitro" | "subgroup" | "setting"
    terms: tuple[str, ...]
    opposite: str = ""  # a group that, present too, makes the pair a whole


@dataclass(frozen=True)
class CueLists:
    """The parsed ``cue_lists.toml``."""

    hedges: tuple[str, ...]
    boosters: tuple[str, ...]
    causal: tuple[str, ...]
    effect_verbs: tuple[str, ...]
    associational: tuple[str, ...]
    not_certainty: tuple[str, ...]
    negations: tuple[str, ...]
    negation_cancels: tuple[str, ...]
    not_negation: tuple[str, ...]
    direction: tuple[DirectionAxis, ...]
    not_direction: tuple[str, ...]
    scope_groups: tuple[ScopeGroup, ...]
    scope_wider: dict[str, tuple[str, ...]]
    scope_covers: dict[str, tuple[str, ...]]
    not_places: frozenset[str]
    not_place_heads: frozenset[str]
    ignore: frozenset[str]


def _strings(value: object, where: str) -> tuple[str, ...]:
    if not isinstance(value, list) or not value or not all(isinstance(v, str) and v for v in value):
        raise ValueError(f"cue_lists.toml: {where} must be a non-empty list of strings")
    return tuple(v.strip() for v in value)


@lru_cache(maxsize=1)
def load_cues() -> CueLists:
    """Parse the packaged cue lists once; a malformed file is a packaging bug, so it raises."""
    text = resources.files("sourcecheck.judge").joinpath("cue_lists.toml").read_text(encoding="utf-8")
    data = tomllib.loads(text)
    cert, neg, scope = data["certainty"], data["negation"], data["scope"]
    axes = []
    for name, table in data["direction"].items():
        if not isinstance(table, dict) or len(table) != 2:
            raise ValueError(f"cue_lists.toml: direction.{name} must hold exactly two lists")
        (a, terms_a), (b, terms_b) = table.items()
        axes.append(
            DirectionAxis(
                name, (a, b), (_strings(terms_a, f"direction.{name}.{a}"), _strings(terms_b, f"direction.{name}.{b}"))
            )
        )
    groups = tuple(
        ScopeGroup(g["name"], g["kind"], _strings(g["terms"], f"scope group {g['name']}"), g.get("opposite", ""))
        for g in scope["groups"]
    )
    return CueLists(
        hedges=_strings(cert["hedges_bioscope"], "hedges_bioscope") + _strings(cert["hedges_hyland"], "hedges_hyland"),
        boosters=_strings(cert["boosters_hyland"], "boosters_hyland") + _strings(cert["boosters_extra"], "extra"),
        causal=_strings(cert["causal"], "causal"),
        effect_verbs=_strings(cert["effect_verbs"], "effect_verbs"),
        associational=_strings(cert["associational"], "associational"),
        not_certainty=_strings(cert["not_certainty"], "not_certainty"),
        negations=_strings(neg["cues"], "negation.cues"),
        negation_cancels=_strings(neg["cancels"], "negation.cancels"),
        not_negation=_strings(neg["not_negation"], "negation.not_negation"),
        direction=tuple(axes),
        not_direction=_strings(data["direction_pseudo"]["phrases"], "direction_pseudo.phrases"),
        scope_groups=groups,
        scope_wider={k: _strings(v, f"scope.wider.{k}") for k, v in scope["wider"].items()},
        scope_covers={k: _strings(v, f"scope.covers.{k}") for k, v in scope["covers"].items()},
        not_places=frozenset(_strings(scope["not_places"], "scope.not_places")),
        not_place_heads=frozenset(_strings(scope["not_place_heads"], "scope.not_place_heads")),
        ignore=frozenset(_strings(data["shared"]["ignore"], "shared.ignore")),
    )
