"""The shipped verifier: its files are the published ones, it loads offline, and it reads invented pairs right.

The "right" answers below are invented pairs whose verdict is plain English (common practice,
no source): a sentence that says the claim, one that says its opposite in the same words, and
one about something else. The encoding checks follow the BERT sentence-pair input format
(Devlin et al. 2019, "BERT: Pre-training of Deep Bidirectional Transformers for Language
Understanding", section 3: [CLS] A [SEP] B [SEP], segment ids 0 then 1).
"""

from __future__ import annotations

import hashlib
import socket
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest
from scipy.special import softmax as reference_softmax

from sourcecheck.errors import ModelUnavailable
from sourcecheck.judge.verifier import LABELS, MODEL_DIR, Verifier, encode_pairs, load_tokenizer
from sourcecheck.judge.verifier.scorer import MODEL_FILE, TOKENIZER_FILE, softmax

SUPPORTS, CONTRADICTS, NEITHER = (LABELS.index(n) for n in ("supports", "contradicts", "neither"))

# (claim, sentence that says it, sentence that says the opposite in nearly the same words)
INVENTED = [
    (
        "Daily walking lowers blood pressure in older adults.",
        "In our trial, daily walking lowered blood pressure in older adults.",
        "In our trial, daily walking raised blood pressure in older adults.",
    ),
    (
        "The vaccine is effective against the new strain.",
        "The vaccine was effective against the new strain.",
        "The vaccine was not effective against the new strain.",
    ),
    (
        "Compound X increases the growth of tumour cells.",
        "Compound X increased the growth of tumour cells in culture.",
        "Compound X decreased the growth of tumour cells in culture.",
    ),
    (
        "Children who sleep less have more behavioural problems.",
        "Children who slept less had more behavioural problems.",
        "Children who slept less had fewer behavioural problems.",
    ),
]
# Known misses of the shipped model (MODEL_CARD.md, "Limits"), kept as strict expected
# failures so that a better model shows up as an unexpected pass instead of going unnoticed.
MISSES_MORE_FEWER = pytest.mark.xfail(strict=True, reason="shipped model reads 'more' vs 'fewer' as support")
UNRELATED_AS_CONTRADICTION = pytest.mark.xfail(
    strict=True, reason="SNLI labels an unrelated scene 'contradiction'; the shipped model learnt that for some claims"
)
UNRELATED = "The survey mapped the nesting sites of coastal birds along the northern shore."


@pytest.fixture(scope="module")
def verifier() -> Verifier:
    return Verifier()


def test_shipped_files_match_their_published_digests() -> None:
    listed = {}
    for line in (MODEL_DIR / "weights.sha256").read_text(encoding="ascii").splitlines():
        digest, name = line.split(maxsplit=1)
        listed[name] = digest
    assert set(listed) == {MODEL_FILE, TOKENIZER_FILE}
    for name, digest in listed.items():
        assert hashlib.sha256((MODEL_DIR / name).read_bytes()).hexdigest() == digest, name


def test_shipped_model_is_small_enough_to_package() -> None:
    assert (MODEL_DIR / MODEL_FILE).stat().st_size < 50 * 1024 * 1024


def test_importing_does_not_load_onnxruntime() -> None:
    code = "import sys, sourcecheck.judge.verifier as v; v.Verifier(); print('onnxruntime' in sys.modules)"
    result = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert result.stdout.strip() == "False"


def test_scoring_needs_no_network(monkeypatch: pytest.MonkeyPatch) -> None:
    def refuse(*args: object, **kwargs: object) -> None:
        raise AssertionError("the verifier tried to open a network connection")

    monkeypatch.setattr(socket.socket, "connect", refuse)
    monkeypatch.setattr(socket, "create_connection", refuse)
    probs = Verifier().score([INVENTED[0][:2]])
    assert probs.shape == (1, 3)


def test_scores_are_probabilities_in_label_order(verifier: Verifier) -> None:
    pairs = [(claim, sentence) for claim, *sentences in INVENTED for sentence in sentences]
    probs = verifier.score(pairs)
    assert probs.shape == (len(pairs), 3)
    assert np.all(probs >= 0) and np.all(probs <= 1)
    np.testing.assert_allclose(probs.sum(axis=1), 1.0, atol=1e-6)
    assert verifier.labels == ("supports", "contradicts", "neither")


def test_rows_come_back_in_the_callers_order() -> None:
    pairs = [(claim, sentence) for claim, *sentences in INVENTED for sentence in sentences] + [
        (INVENTED[0][0], UNRELATED)
    ]
    verifier = Verifier(batch_size=len(pairs))  # one batch either way, so the same activations
    forward = verifier.score(pairs)
    backward = verifier.score(pairs[::-1])
    np.testing.assert_allclose(backward[::-1], forward, atol=1e-6)


def test_batching_moves_scores_only_slightly() -> None:
    # Dynamic int8 quantisation scales activations per batch, so a pair's scores depend a
    # little on its batch mates (ONNX Runtime quantisation docs, "dynamic quantization"). On
    # these pairs the shipped model moved by at most 0.065; the top label did not change.
    pairs = [(claim, sentence) for claim, *sentences in INVENTED for sentence in sentences]
    one_by_one = np.vstack([Verifier(batch_size=1).score([pair]) for pair in pairs])
    batched = Verifier(batch_size=4).score(pairs)
    np.testing.assert_allclose(batched, one_by_one, atol=0.1)
    assert np.array_equal(batched.argmax(axis=1), one_by_one.argmax(axis=1))


def test_no_pairs_give_an_empty_table(verifier: Verifier) -> None:
    assert verifier.score([]).shape == (0, 3)


@pytest.mark.parametrize(
    ("claim", "saying", "opposite"), [*INVENTED[:3], pytest.param(*INVENTED[3], marks=MISSES_MORE_FEWER)]
)
def test_a_sentence_saying_the_opposite_contradicts(verifier: Verifier, claim: str, saying: str, opposite: str) -> None:
    probs = verifier.score([(claim, saying), (claim, opposite)])
    assert probs[0].argmax() == SUPPORTS
    assert probs[1].argmax() == CONTRADICTS
    assert probs[0, SUPPORTS] > probs[1, SUPPORTS]


@pytest.mark.parametrize(
    "claim",
    [
        pytest.param(INVENTED[0][0], marks=UNRELATED_AS_CONTRADICTION),
        INVENTED[1][0],
        INVENTED[2][0],
        pytest.param(INVENTED[3][0], marks=UNRELATED_AS_CONTRADICTION),
    ],
)
def test_an_unrelated_sentence_is_neither(verifier: Verifier, claim: str) -> None:
    assert verifier.score([(claim, UNRELATED)])[0].argmax() == NEITHER


def test_an_unrelated_sentence_never_supports(verifier: Verifier) -> None:
    probs = verifier.score([(claim, UNRELATED) for claim, *_ in INVENTED])
    assert np.all(probs[:, SUPPORTS] < 0.1)


def test_softmax_matches_scipy() -> None:
    logits = np.array([[2.0, -1.0, 0.5], [1000.0, 999.0, -1000.0]])
    np.testing.assert_allclose(softmax(logits), reference_softmax(logits, axis=1), rtol=1e-12)


def test_pairs_are_encoded_in_bert_pair_format() -> None:
    tokenizer = load_tokenizer(MODEL_DIR / TOKENIZER_FILE)
    arrays = encode_pairs(tokenizer, [("Walking helps.", "It does."), ("A much longer claim sentence here.", "Yes.")])
    ids, mask, types = arrays["input_ids"], arrays["attention_mask"], arrays["token_type_ids"]
    cls, sep = tokenizer.token_to_id("[CLS]"), tokenizer.token_to_id("[SEP]")
    assert ids.shape == mask.shape == types.shape and ids.dtype == np.int64
    first = ids[0][mask[0] == 1].tolist()
    assert first[0] == cls and first.count(sep) == 2 and first[-1] == sep
    second_segment = types[0][mask[0] == 1].tolist()
    assert second_segment == sorted(second_segment) and second_segment[-1] == 1 and second_segment[0] == 0
    assert mask[0].sum() < mask[1].sum() == ids.shape[1]  # padded to the longest pair only


def test_long_pairs_are_cut_to_the_maximum_length() -> None:
    tokenizer = load_tokenizer(MODEL_DIR / TOKENIZER_FILE, max_length=32)
    arrays = encode_pairs(tokenizer, [("word " * 100, "other " * 100)])
    assert arrays["input_ids"].shape == (1, 32)


def test_a_missing_model_is_one_clear_error(tmp_path: Path) -> None:
    with pytest.raises(ModelUnavailable, match=str(tmp_path)):
        Verifier(tmp_path).score([("a", "b")])


def test_another_local_model_folder_can_be_used(tmp_path: Path) -> None:
    for name in (MODEL_FILE, TOKENIZER_FILE):
        (tmp_path / name).write_bytes((MODEL_DIR / name).read_bytes())
    pair = [INVENTED[1][:2]]
    np.testing.assert_allclose(Verifier(tmp_path).score(pair), Verifier().score(pair), atol=1e-6)


def test_a_broken_model_file_is_one_clear_error(tmp_path: Path) -> None:
    (tmp_path / MODEL_FILE).write_bytes(b"not an onnx graph")
    (tmp_path / TOKENIZER_FILE).write_bytes((MODEL_DIR / TOKENIZER_FILE).read_bytes())
    with pytest.raises(ModelUnavailable, match="not a loadable ONNX model"):
        Verifier(tmp_path).score([("a", "b")])


# Reversals in the same words that the shipped model still reads as agreement (MODEL_CARD.md,
# "Limits"; DEVELOPERS.md, the second training stage that caught some of them and was not
# shipped). Strict expected failures, so a model that reads them shows up as an unexpected pass.
MISSES_SAME_WORDS = pytest.mark.xfail(
    strict=True, reason="shipped model reads this reversal in the same words as support"
)


@pytest.mark.parametrize(
    ("claim", "opposite"),
    [
        pytest.param(
            "Sites with more nests were wetter in spring.",
            "Sites with more nests were drier in spring.",
            marks=MISSES_SAME_WORDS,
        ),
        pytest.param(
            "Males emerged earlier than females.", "Females emerged earlier than males.", marks=MISSES_SAME_WORDS
        ),
        pytest.param(
            "Scraped plots held more nests than unscraped controls.",
            "Unscraped controls held more nests than scraped plots.",
            marks=MISSES_SAME_WORDS,
        ),
    ],
)
def test_a_reversal_in_the_same_words_is_not_support(verifier: Verifier, claim: str, opposite: str) -> None:
    assert verifier.score([(claim, opposite)])[0].argmax() != SUPPORTS


def test_a_paraphrase_of_absence_is_not_a_contradiction(verifier: Verifier) -> None:
    # The guard a retrained model must pass: "left unmanaged" and "in the absence of disturbance"
    # say the same thing (plain English, common practice, no source); a second training stage
    # that read this as a reversal was not shipped.
    claim = "Left unmanaged, bare patches on lowland heath become overgrown by heather and grasses within a few years."
    source = (
        "In the absence of disturbance, bare patches on lowland heath are overgrown by heather and grasses "
        "within a few years."
    )
    assert verifier.score([(claim, source)])[0].argmax() == SUPPORTS
