"""Certainty, negation, direction and scope cues between a claim and its passage.

Example sentences are invented fixtures; the cue lists are checked against the works they
come from (named beside each check, from memory).
"""

from __future__ import annotations

import re
import tomllib
from importlib import resources

import pytest

from sourcecheck.judge.cue_lists import CueFinding, load_cues
from sourcecheck.judge.cues import compare

TOML_TEXT = resources.files("sourcecheck.judge").joinpath("cue_lists.toml").read_text(encoding="utf-8")


def _codes(claim: str, passage: str) -> dict[str, CueFinding]:
    found = compare(claim, passage)
    assert len({f.code for f in found}) == len(found), found  # at most one finding per code
    return {f.code: f for f in found}


# --- the cue lists as data ------------------------------------------------------------------


def _lists(node: object, path: str = "") -> list[tuple[str, list[object]]]:
    if isinstance(node, dict):
        return [item for key, value in node.items() for item in _lists(value, f"{path}.{key}")]
    if isinstance(node, list) and node and all(isinstance(v, dict) for v in node):
        return [item for k, value in enumerate(node) for item in _lists(value, f"{path}[{k}]")]
    if isinstance(node, list):
        return [(path, node)]
    return []


def test_every_list_is_non_empty_lower_case_text() -> None:
    lists = _lists(tomllib.loads(TOML_TEXT))
    assert len(lists) > 20
    for path, values in lists:
        assert values, path
        for value in values:
            assert isinstance(value, str) and value.strip() == value and value, (path, value)
            assert value == value.lower(), (path, value)


def test_every_list_names_its_source_in_the_comment_above_it() -> None:
    lines = TOML_TEXT.splitlines()
    assignments = [k for k, line in enumerate(lines) if re.match(r"^\s*[\w.-]+\s*=\s*\[", line)]
    assert len(assignments) > 20
    for k in assignments:
        above = k - 1
        while above >= 0 and not lines[above].lstrip().startswith("#"):
            above -= 1
        block = []
        while above >= 0 and lines[above].lstrip().startswith("#"):
            block.insert(0, lines[above])
            above -= 1
        comment = " ".join(block)
        # A cited work with its year, "from memory", or a declared fact of the trade.
        assert re.search(r"\d{4}\b.*from memory|from memory.*\d{4}\b|no source", comment), lines[k]
    assert "Vincze" in TOML_TEXT and "Hyland" in TOML_TEXT


def test_load_cues_is_parsed_once_and_complete() -> None:
    cues = load_cues()
    assert cues is load_cues()
    for name in (
        "hedges",
        "boosters",
        "causal",
        "effect_verbs",
        "associational",
        "negations",
        "negation_cancels",
        "not_negation",
        "direction",
        "not_direction",
        "scope_groups",
        "scope_wider",
        "scope_covers",
        "not_places",
        "ignore",
    ):
        assert getattr(cues, name), name
    assert {g.kind for g in cues.scope_groups} <= set(cues.scope_wider)
    names = {g.name for g in cues.scope_groups}
    assert all(g.opposite in names for g in cues.scope_groups if g.opposite)


def test_hedges_hold_the_bioscope_speculation_cues() -> None:
    # BioScope annotation guidelines (Vincze et al., 2008, BMC Bioinformatics 9(Suppl 11):S9),
    # speculation cues, from memory.
    hedges = set(load_cues().hedges)
    for cue in ("may", "might", "could", "suggest*", "indicate", "appear", "possible", "likely", "putative"):
        assert cue in hedges, cue


def test_hedges_and_boosters_hold_hylands_markers() -> None:
    # Hyland (2005), "Metadiscourse", appendix lists of hedges and boosters, from memory.
    cues = load_cues()
    for cue in ("perhaps", "possibly", "tend to", "apparently", "probably"):
        assert cue in cues.hedges, cue
    for cue in ("clearly", "demonstrat*", "show", "prove", "definitely", "undoubtedly", "in fact"):
        assert cue in cues.boosters, cue
    assert not set(cues.hedges) & set(cues.boosters)  # one word cannot both hedge and boost


def test_negations_hold_the_bioscope_negation_cues() -> None:
    # BioScope annotation guidelines (Vincze et al., 2008), negation cues, from memory.
    negations = set(load_cues().negations)
    for cue in ("no", "not", "without", "absence of", "neither", "nor", "failed to", "lack of", "rather than"):
        assert cue in negations, cue


def test_antonyms_sit_on_opposite_sides_of_one_axis() -> None:
    # WordNet direct antonyms (Fellbaum, ed., 1998, "WordNet"), from memory.
    axes = {a.name: a for a in load_cues().direction}
    amount = axes["amount"]
    for up, down in (("increas*", "decreas*"), ("rise", "fall"), ("higher", "lower"), ("gain", "loss")):
        assert up in amount.terms[0] and down in amount.terms[1], (up, down)
    assert "improv*" in axes["quality"].terms[0] and "worsen*" in axes["quality"].terms[1]
    for axis in axes.values():
        assert not set(axis.terms[0]) & set(axis.terms[1]), axis.name


# --- overstated -----------------------------------------------------------------------------


def test_booster_against_hedge_is_overstated() -> None:
    found = _codes(
        "Smith et al. show that warming raises nest density.",
        "These results suggest that warming may raise nest density at marsh sites.",
    )["overstated"]
    assert found.claim_cue == "show"
    assert found.source_cue == "suggest"
    assert found.message == 'claim says "show", source hedges: "suggest"'


def test_causal_claim_against_association_is_overstated() -> None:
    # Causal against correlational wording, as coded by Sumner et al. (2014, BMJ 349:g7015), from memory.
    passage = "Grazing was associated with higher plant diversity across the plots."
    found = _codes("Grazing causes higher plant diversity.", passage)["overstated"]
    assert (found.claim_cue, found.source_cue) == ("causes", "associated with")
    assert "association" in found.message
    assert _codes("Grazing increases plant diversity.", passage)["overstated"].claim_cue == "increases"


def test_no_overstatement_when_both_hedge_or_claim_is_plain() -> None:
    passage = "These results suggest that warming may raise nest density."
    assert "overstated" not in _codes("Warming may raise nest density.", passage)
    assert "overstated" not in _codes("Warming raised nest density.", passage)  # no booster, no causal verb


def test_effect_verb_without_object_is_not_causal() -> None:
    found = _codes("Plant diversity increases with rainfall.", "Plant diversity was correlated with rainfall.")
    assert "overstated" not in found
    # "lower" as an adjective is no effect verb, and "all-cause" is neither booster nor cause.
    passage = "Residential green space was associated with lower all-cause mortality."
    assert "overstated" not in _codes("Green space is linked to lower mortality.", passage)
    assert _codes("Green space reduces mortality.", passage)["overstated"].claim_cue == "reduces"


def test_a_claim_of_proof_is_overstated_unless_the_source_claims_it_too() -> None:
    # Strong boosters (Hyland, 1998, from memory) where the source states the finding plainly.
    passage = "Warming raised nest density at all three marsh sites."
    found = _codes("The marsh data prove that warming raised nest density.", passage)["overstated"]
    assert found.claim_cue == "prove" and found.source_cue == ""
    assert "overstated" in _codes("The marsh data clearly established that warming raised nest density.", passage)
    assert "overstated" not in _codes("Warming definitively raised it.", "Warming definitively raised nest density.")
    # A plain booster still needs a hedge in the source (test_negated_hedge_does_not_hedge).
    assert "overstated" not in _codes("Warming clearly raised nest density.", passage)
    assert "overstated" not in _codes("It is not proven that warming raised nest density.", passage)
    assert "overstated" not in _codes("Warming raised nest density.", passage)


def test_negated_hedge_does_not_hedge() -> None:
    found = _codes("Warming clearly raises nest density.", "The data do not suggest that warming raises nest density.")
    assert "overstated" not in found
    assert found["negation"].source_cue == "do not"


def test_hedge_in_an_unrelated_sentence_does_not_count() -> None:
    passage = "Warming raised nest density by 18%. Other factors might matter for gull colonies."
    assert "overstated" not in _codes("Warming clearly raised nest density.", passage)
    assert "overstated" in _codes("Warming clearly raised nest density.", "Warming might have raised nest density.")


def test_the_month_may_is_not_a_hedge() -> None:
    assert "overstated" not in _codes(
        "Warming clearly raised nest density.", "In May 2019, warming raised nest density."
    )


# --- negation -------------------------------------------------------------------------------


def test_passage_negating_the_claim_is_flagged() -> None:
    found = _codes("Warming increased nest density.", "Warming did not increase nest density at the marsh sites.")
    assert found["negation"] == CueFinding(
        "negation", "", "did not", 'source negates it: "did not"; the claim does not'
    )
    found = _codes(
        "Warming increased nest density.",
        "There was no significant difference in nest density between warmed and control plots.",
    )
    assert found["negation"].source_cue == "no significant"


def test_claim_negating_the_passage_is_flagged() -> None:
    found = _codes("Warming didn't increase nest density.", "Warming increased nest density at the marsh sites.")
    assert found["negation"].claim_cue == "didn't"  # read as "did not", shown as written
    assert found["negation"].source_cue == ""


def test_no_negation_flag_when_both_negate() -> None:
    assert "negation" not in _codes(
        "Warming did not increase nest density.", "Warming did not increase nest density at the marsh sites."
    )
    assert "negation" not in _codes(
        "Warming had no effect on nest density.", "We found no significant effect of warming on nest density."
    )


def test_a_claim_of_no_change_agrees_with_a_passage_reporting_no_difference() -> None:
    # "did not change X" and "no statistically significant difference in X" state the same
    # null result, though the passage's "no" stands too far from X for the window to reach it.
    passage = "There was no statistically significant difference identified in the average daily nest density."
    assert "negation" not in _codes("Warming did not change the average daily nest density.", passage)
    # A claim that negates a passage reporting an effect is still flagged.
    found = _codes("Warming did not change average daily nest density.", "Warming raised average daily nest density.")
    assert found["negation"].claim_cue == "did not"


def test_negation_about_something_else_is_ignored() -> None:
    passage = "Nest density rose with warming at all sites. Predators were not observed at the colony."
    assert "negation" not in _codes("Warming raised nest density.", passage)


def test_plain_double_negation_cancels_and_idioms_do_not_negate() -> None:
    # Double negation ("did not fail to"), common practice, no source; not solved in general.
    assert "negation" not in _codes("The treatment reduced costs.", "The treatment did not fail to reduce costs.")
    assert "negation" not in _codes(
        "Warming raised nest density.", "There is no doubt that warming raised nest density."
    )


# --- direction ------------------------------------------------------------------------------


def test_opposite_direction_about_the_same_thing_is_flagged() -> None:
    found = _codes("Warming increased nest density.", "Warming decreased nest density at the marsh sites.")
    assert found["direction-flip"] == CueFinding(
        "direction-flip",
        "increased",
        "decreased",
        'claim says "increased", source says "decreased" about "nest density"',
    )
    found = _codes("Body size is positively correlated with range.", "Body size was negatively correlated with range.")
    assert found["direction-flip"].source_cue == "negatively correlated"


def test_antonym_about_a_different_object_is_not_a_flip() -> None:
    assert "direction-flip" not in _codes(
        "Warming increased nest density.", "Warming decreased predation, which increased nest density."
    )
    assert "direction-flip" not in _codes(
        "Higher nest survival followed the cull.", "Decreased predation led to increased nest survival after the cull."
    )


def test_swapped_comparison_is_not_a_flip() -> None:
    claim = "Nest density was higher in restored marshes than in ditched marshes."
    assert "direction-flip" not in _codes(claim, "Nest density was lower in ditched marshes than in restored marshes.")
    assert "direction-flip" in _codes(claim, "Nest density was lower in restored marshes than in ditched marshes.")


def test_the_object_of_the_direction_word_outweighs_a_subject_the_passage_shares() -> None:
    # The passage's subject goes with another verb ("increased their fibre"); what the claim
    # says was increased is what the passage says was reduced.
    claim = "Treated women increased the share of their energy intake from saturated fats."
    passage = (
        "Treated women increased their fibre consumption, while reducing the share of their energy from saturated fats."
    )
    found = _codes(claim, passage)["direction-flip"]
    assert (found.claim_cue, found.source_cue) == ("increased", "reducing")
    agreeing = (
        "Treated women increased their fibre consumption and increased the share of their energy from saturated fats."
    )
    assert "direction-flip" not in _codes(claim, agreeing)


def test_a_comparison_turned_round_is_a_flip() -> None:
    # Both say "higher" (or "outperformed"), but of the other side: the fixture kind
    # "the two groups of a comparison swapped" (tests/fixtures/real_papers/README.md).
    claim = "Nest density was higher in restored marshes than in ditched marshes."
    found = _codes(claim, "Nest density was higher in ditched marshes than in restored marshes.")["direction-flip"]
    assert (found.claim_cue, found.source_cue) == ("higher", "higher") and "swapped" in found.message
    assert "direction-flip" not in _codes(claim, "Nest density was higher in restored marshes than in ditched marshes.")
    passage = "In the maze, the rats outperformed the mice in both trials, relying more on their whiskers."
    assert "direction-flip" in _codes("In the maze, the mice outperformed the rats in both trials.", passage)
    assert "direction-flip" not in _codes("In the maze, the rats outperformed the mice in both trials.", passage)


def test_same_direction_and_non_directions_are_not_flips() -> None:
    assert "direction-flip" not in _codes("Nest density rose in warm years.", "Nest density increased in warm years.")
    assert "direction-flip" not in _codes("Nest density fell by up to 20%.", "Nest density fell by up to 20%.")
    # A negated direction word is left to the negation check.
    found = _codes("Warming increased nest density.", "Warming did not decrease nest density.")
    assert "direction-flip" not in found and "negation" in found


# --- scope ----------------------------------------------------------------------------------


def test_animal_finding_claimed_for_humans_is_wider() -> None:
    # Inference to humans from animal studies, as coded by Sumner et al. (2014, BMJ 349:g7015), from memory.
    passage = "In mice, drug X reduced tumour growth by 40%."
    found = _codes("Drug X reduces tumour growth in humans.", passage)["scope-wider"]
    assert (found.claim_cue, found.source_cue) == ("humans", "In mice")
    dropped = _codes("Drug X reduces tumour growth.", passage)["scope-wider"]
    assert dropped.claim_cue == "" and dropped.message == 'claim drops the source\'s limit "In mice"'


def test_claim_that_keeps_the_restriction_is_not_wider() -> None:
    passage = "In mice, drug X reduced tumour growth by 40%."
    assert "scope-wider" not in _codes("Drug X reduces tumour growth in mice.", passage)
    assert "scope-wider" not in _codes("Drug X reduces tumour growth in animal models.", passage)
    assert "scope-wider" not in _codes("In cell lines drug X slowed growth.", "Drug X slowed growth in vitro.")


def test_passage_that_also_covers_humans_is_not_restricted() -> None:
    passage = "Drug X reduced tumour growth in mice and in patients."
    assert "scope-wider" not in _codes("Drug X reduces tumour growth.", passage)


def test_subgroup_dropped_or_widened() -> None:
    # The population of a well-built question (Richardson et al., 1995, ACP J Club 123:A12), from memory.
    passage = "Among older adults, exercise lowered blood pressure."
    found = _codes("Exercise lowers blood pressure in people.", passage)["scope-wider"]
    assert (found.claim_cue, found.source_cue) == ("people", "Among older adults")
    assert "scope-wider" not in _codes("Exercise lowers blood pressure in older adults.", passage)
    # Women together with men is the whole, not a subgroup.
    assert "scope-wider" not in _codes("Exercise lowers blood pressure.", "In women and men, exercise lowered it.")


def test_single_site_and_place_qualifiers() -> None:
    found = _codes("Nest density rose by 18%.", "At a single site, nest density rose by 18%.")["scope-wider"]
    assert found.source_cue == "single site"
    found = _codes("Nest density rose by 18% worldwide.", "Nest density rose by 18% in Norway.")["scope-wider"]
    assert (found.claim_cue, found.source_cue) == ("worldwide", "in Norway")
    assert "scope-wider" not in _codes("In Norway nest density rose by 18%.", "Nest density rose by 18% in Norway.")
    assert "scope-wider" not in _codes("Nest density rose by 18%.", "Nest density rose by 18% (in Table 2).")


def test_a_capitalised_arm_of_the_study_or_a_spelled_out_acronym_is_no_place() -> None:
    # "in the SRL case" names a task the claim spells out; "in the NDX-5 group" an arm of a
    # trial; "in the UK" still limits the finding to a place.
    claim = "For semantic role labelling, the new model needs a tenth of the training data."
    assert "scope-wider" not in _codes(claim, "In the SRL case, the new model needs a tenth of the training data.")
    claim = "Children given the extract recalled pictures more accurately."
    passage = "Children in the NDX-524 group recalled pictures more accurately."
    assert "scope-wider" not in _codes(claim, passage)
    found = _codes(claim, "Children in the UK recalled pictures more accurately.")["scope-wider"]
    assert found.source_cue == "in the UK"


@pytest.mark.parametrize(
    ("claim", "passage"),
    [
        ("Nest density rose by 18% between 2018 and 2019.", "Nest density rose by 18% between 2018 and 2019."),
        ("", "Warming did not raise nest density."),
        ("Warming raised nest density.", "   "),
    ],
)
def test_matching_or_empty_text_gives_no_findings(claim: str, passage: str) -> None:
    assert compare(claim, passage) == []


@pytest.mark.parametrize(
    ("claim", "passage", "said"),
    [
        # WordNet antonym pairs activate/inactivate and stabilize/destabilize (Fellbaum,
        # 1998; from memory); deactivate/activate as the field writes it.
        ("The enzyme deactivates the membrane receptor.", "The enzyme activates the membrane receptor.", "deactivates"),
        ("Salt inactivates the pump.", "Salt activated the pump within minutes.", "inactivates"),
        ("The protein stabilizes the spindle.", "The protein destabilizes the spindle.", "stabilizes"),
    ],
)
def test_switching_a_process_on_against_off_is_a_direction_flip(claim: str, passage: str, said: str) -> None:
    [finding] = [f for f in compare(claim, passage) if f.code == "direction-flip"]
    assert finding.claim_cue == said


def test_the_same_switch_in_claim_and_passage_is_no_flip() -> None:
    assert [f for f in compare("The kinase activates the receptor.", "The kinase activated the receptor.")] == []


@pytest.mark.parametrize(
    ("claim", "passage", "said"),
    [
        # WordNet antonyms central/peripheral and intracellular/extracellular (Fellbaum,
        # 1998; from memory).
        ("Cells act in the peripheral nervous system.", "Cells act in the central nervous system.", "peripheral"),
        ("The toxin binds an extracellular domain.", "The toxin binds an intracellular domain.", "extracellular"),
        # encourage ~ promote against inhibit (WordNet; from memory).
        ("Warm soil encourages larval growth.", "Warm soil inhibits larval growth.", "encourages"),
    ],
)
def test_site_and_effect_antonyms_are_direction_flips(claim: str, passage: str, said: str) -> None:
    [finding] = [f for f in compare(claim, passage) if f.code == "direction-flip"]
    assert finding.claim_cue == said


def test_a_knockout_group_named_as_subject_is_no_negation() -> None:
    # "Mice lacking X" names who was studied; BioScope marks negation only where it
    # negates a statement (Vincze et al., 2008; from memory).
    claim = "Mice lacking the receptor gain weight faster on a rich diet."
    passage = "Mice lacking the receptor gained weight faster on a rich diet than wild-type mice."
    assert [f for f in compare(claim, passage) if f.code == "negation"] == []
    # A real negation in the passage is still read.
    denied = "Mice lacking the receptor did not gain weight faster on a rich diet."
    assert [f.code for f in compare(claim, denied)] == ["negation"]


def test_nouns_holding_a_direction_word_are_no_direction() -> None:
    # "reuptake inhibitors" and "weight gain" name things, not changes (common practice, no source).
    claim = "Serotonin reuptake inhibitors raise the risk of falls in older adults."
    passage = "Use of serotonin reuptake inhibitors raised the risk of falls among older adults."
    assert [f for f in compare(claim, passage) if f.code == "direction-flip"] == []
    gain = compare("The diet reduced weight gain in rats.", "The diet lowered weight gain in rats.")
    assert [f for f in gain if f.code == "direction-flip"] == []


def test_a_relative_clause_negates_what_follows_the_comma_not_the_subject_before_it() -> None:
    # BioScope scopes a negation over the phrase it governs (Vincze et al., 2008; from
    # memory): in "the second receptor ligand, CF-9, which lacks a tail", only the tail is
    # negated, not CF-9 being a ligand.
    claim = "CF-9 is a ligand for the RX receptor."
    passage = "CF-4 resembles the second RX receptor ligand, CF-9, which lacks a tail and stays soluble."
    assert "negation" not in _codes(claim, passage)
    # Without the comma the words before the cue are its subject and count.
    assert "negation" in _codes("Warming raised nest density.", "Warming never raised nest density.")


def test_but_not_negates_only_the_phrase_it_introduces() -> None:
    # "A, but not B, ..." negates B alone (BioScope scope of contrastive "not"; Vincze et
    # al., 2008; from memory).
    claim = "Memory T cells raise chemokine production in the lung."
    passage = "The response of memory, but not naive, T cells raised chemokine production in the lung."
    assert "negation" not in _codes(claim, passage)
    denied = "Naive T cells, but not memory T cells raised chemokine production in the lung."
    assert "negation" in _codes(claim, denied)


@pytest.mark.parametrize("widening", ["is not restricted to", "is not limited to", "is not just", "is not confined to"])
def test_not_restricted_to_widens_a_finding_rather_than_denying_it(widening: str) -> None:
    # BioScope does not annotate "not only" as negation (Vincze et al., 2008; from memory);
    # "not restricted to" and its kin by analogy (no source). The idiom wins over the
    # auxiliary "is not" it overlaps.
    claim = "The variant is associated with joint disease in carriers of the B27 allele."
    passage = f"The association of the variant with joint disease {widening} carriers of the B27 allele."
    assert "negation" not in _codes(claim, passage)


def test_a_claim_that_writes_the_source_s_group_keeps_its_scope() -> None:
    # The passage's limit "women" is kept by a claim about "pregnant women" (BioScope-style
    # scope reading: the limiting term is present in the claim; common practice, no source).
    findings = compare(
        "The trial randomised 2,212 pregnant women to lifestyle advice or standard care",
        "We recruited and randomised 2,212 women to lifestyle advice or standard care.",
    )
    assert "scope-wider" not in {f.code for f in findings}
