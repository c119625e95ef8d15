"""Finding a source's own title inside a reference entry, whatever the entry's style."""

from __future__ import annotations

import pytest

from sourcecheck.sources._evidence import family_name, squash, title_in_entry

TITLE = "Grazing pressure and seed rain on coastal dune grassland"


@pytest.mark.parametrize(
    "entry",
    [
        f"Okafor, A., & Lin, B. (2021). {TITLE}. Journal of Coasts, 12, 40-49.",  # APA-like
        f"A. Okafor and B. Lin, “{TITLE},” J. Coasts, vol. 12, 2021.",  # IEEE-like
        f"Okafor A, Lin B. {TITLE.upper()}. J Coasts. 2021;12:40-9.",  # capitals
        f"Ada Okafor, Bo Lin. {TITLE.replace('grassland', 'grass-land')}. Coasts, 2021.",  # hyphen
        TITLE,  # the title alone
    ],
)
def test_title_is_found_in_any_style(entry: str) -> None:
    score, _ = title_in_entry(TITLE, entry)
    assert score >= 0.9


@pytest.mark.parametrize(
    "entry",
    [
        "Okafor A. Grazing pressure and seed rain on inland dune grassland. 2021.",  # one word changed
        "Okafor A. Seed rain on coastal dunes. 2021.",  # another, shorter work
        "Berg C. Ice cores of the polar plateau. 2001.",
    ],
)
def test_another_title_is_not_found(entry: str) -> None:
    score, closeness = title_in_entry(TITLE, entry)
    assert score == 0.0 and closeness < 1.0


def test_title_without_word_spaces_is_compared_by_its_letters() -> None:
    # Some extractions lose the spaces of a whole page (Royal Society Open Science in the
    # real set); the letters still match the entry's.
    squashed = "Prolongedtransitiontime betweencolostrumand maturemilkinabear"
    entry = "Griffiths K. Prolonged transition time between colostrum and mature milk in a bear. 2015."
    assert title_in_entry(squashed, entry)[0] >= 0.95
    assert title_in_entry(squashed, "Griffiths K. Prolonged labour in a bear. 2015.")[0] == 0.0


def test_short_titles_need_the_exact_words() -> None:
    assert title_in_entry("Rhythmic attentional scanning", "Fries P. Rhythmic attentional scanning. Neuron.")[0] == 1.0
    assert title_in_entry("Rhythmic attentional scanning", "Fries P. Rhythmic attention scans. Neuron.")[0] == 0.0


@pytest.mark.parametrize(
    ("entry", "found"),
    [
        ("Lin B. Sleep and memory. J Sleep. 2020.", True),
        ("Lin, B. (2020). “Sleep and Memory,” J. Sleep.", True),
        ("Sleep and memory", True),
        ("Lin B. Sleep and memory consolidation in adults. J Sleep. 2020.", False),
        ("Lin B. Effects of sleep and memory training. J Sleep. 2020.", False),
    ],
)
def test_a_short_title_must_be_set_off_by_punctuation(entry: str, found: bool) -> None:
    assert (title_in_entry("Sleep and memory", entry)[0] == 1.0) is found


def test_squash_and_family_name() -> None:
    assert squash("Székely-Hungarian  Village") == "szekelyhungarianvillage"
    assert family_name("William B. Driggers III") == "Driggers"
    assert family_name("Esther M F van Sluijs") == "Sluijs"
