"""The passage and vector cache: round trips, atomic writes, corrupt entries rebuilt."""

import json
from dataclasses import replace
from pathlib import Path

import numpy as np

from sourcecheck.index.cache import Cache
from sourcecheck.model import Passage, Source, SourceIdentity


def _source(path: str = "src/a.pdf") -> Source:
    return Source(
        path=path,
        sha256="ab" * 32,
        pages=2,
        title="Tidal heron survey",
        doi="10.55555/x1",
        first_page_text="Tidal heron survey",
        passages=[Passage(path, 1, "Heron nests rose by 18%.", 0), Passage(path, 2, "Tides fell.", 1)],
    )


def test_source_round_trip_takes_the_new_display_path(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    cache.save_source(_source(), "x1")
    loaded = cache.load_source("ab" * 32, "x1", "renamed/b.pdf")
    assert loaded is not None
    assert loaded.path == "renamed/b.pdf"
    assert [p.source for p in loaded.passages] == ["renamed/b.pdf"] * 2
    assert [p.page for p in loaded.passages] == [1, 2]
    assert loaded.doi == "10.55555/x1"


def test_other_extractor_version_is_a_miss(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    cache.save_source(_source(), "x1")
    assert cache.load_source("ab" * 32, "x2", "a.pdf") is None
    assert cache.warnings == []


def test_corrupt_source_entry_is_a_miss_with_a_warning(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    cache.save_source(_source(), "x1")
    entry = next((tmp_path / "sources").glob("*.json"))
    entry.write_text('{"format": 1, "sha256": ', encoding="utf-8")
    assert cache.load_source("ab" * 32, "x1", "a.pdf") is None
    assert len(cache.warnings) == 1 and "rebuilt" in cache.warnings[0]


def test_vectors_round_trip_and_wrong_shape_is_rebuilt(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    vectors = np.random.default_rng(0).random((3, 4)).astype(np.float32)
    cache.save_vectors("passages", "k", vectors)
    assert np.array_equal(cache.load_vectors("passages", "k", 3), vectors)
    assert cache.load_vectors("passages", "k", 5) is None
    (tmp_path / "passages" / "k.npy").write_bytes(b"\x93NUMPY garbage")
    assert cache.load_vectors("passages", "k", 3) is None
    assert len(cache.warnings) == 2


def test_writes_leave_no_temporary_files(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    cache.save_source(_source(), "x1")
    cache.save_vectors("verdicts", "k", np.zeros((1, 2)))
    cache.vector_store().put_many([("k", np.zeros(2))])
    leftovers = [p for p in tmp_path.rglob("*") if p.name.startswith(".tmp-")]
    assert leftovers == []
    assert cache.vectors_written == 2


def test_printed_page_numbers_survive_the_round_trip(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    source = _source()
    source.printed_pages = ("305", None)
    cache.save_source(source, "x1")
    loaded = cache.load_source("ab" * 32, "x1", "a.pdf")
    assert loaded is not None and loaded.printed_pages == ("305", None)


def test_entry_of_the_older_format_is_rebuilt(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    cache.save_source(_source(), "x1")
    entry = tmp_path / "sources" / f"{'ab' * 32}-x1.json"
    old = json.loads(entry.read_text(encoding="utf-8"))
    old["format"] = 1
    del old["printed_pages"]
    entry.write_text(json.dumps(old), encoding="utf-8")
    assert cache.load_source("ab" * 32, "x1", "a.pdf") is None
    assert len(cache.warnings) == 1


def test_section_and_place_of_passages_survive_the_round_trip(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    source = _source()
    source.passages = [
        Passage(source.path, 1, "Herons avoid dredged shores.", 0, section="background", place=0.0),
        Passage(source.path, 2, "Nest counts rose by 18%.", 1, section="results", place=0.3333),
    ]
    cache.save_source(source, "x1")
    loaded = cache.load_source("ab" * 32, "x1", "a.pdf")
    assert loaded is not None
    assert [(p.section, p.place) for p in loaded.passages] == [("background", 0.0), ("results", 0.3333)]


def test_source_identity_survives_the_round_trip(tmp_path: Path) -> None:
    identity = SourceIdentity(
        title="Tidal heron survey",
        metadata_title="Tidal Heron Survey",
        dois=("10.55555/x1", "10.55555/x1.2"),
        arxiv_ids=("2101.01234",),
        authors=("Ada Okafor", "Bo Lund"),
        title_page=2,
    )
    cache = Cache(tmp_path)
    cache.save_source(replace(_source(), identity=identity), "x1")
    loaded = cache.load_source("ab" * 32, "x1", "src/a.pdf")
    assert loaded is not None and loaded.identity == identity


def test_entry_without_an_identity_loads_with_an_empty_one(tmp_path: Path) -> None:
    cache = Cache(tmp_path)
    cache.save_source(_source(), "x1")
    path = next((tmp_path / "sources").glob("*.json"))
    data = json.loads(path.read_text(encoding="utf-8"))
    del data["identity"]
    path.write_text(json.dumps(data), encoding="utf-8")
    loaded = cache.load_source("ab" * 32, "x1", "src/a.pdf")
    assert loaded is not None and loaded.identity == SourceIdentity()


def test_a_cache_path_that_is_a_file_is_reported_once_and_the_run_goes_on(tmp_path: Path) -> None:
    blocker = tmp_path / "cache"
    blocker.write_text("not a folder", encoding="utf-8")
    cache = Cache(blocker)
    assert cache.load_source("ab" * 32, "x1", "a.pdf") is None
    cache.save_source(_source(), "x1")
    cache.save_vectors("passages", "k", np.ones((2, 3), dtype=np.float32))
    cache.vector_store().put_many([("k", np.ones(3))])
    assert cache.writable is False and cache.vectors_written == 0
    assert cache.warnings == ["cache folder cannot be written (Not a directory); this run goes on without saving to it"]


def test_a_read_only_cache_still_serves_what_it_holds(tmp_path: Path, monkeypatch) -> None:
    cache = Cache(tmp_path)
    cache.save_source(_source(), "x1")

    def refuse(*args: object, **kwargs: object) -> None:  # a read-only folder, even for root
        raise PermissionError(13, "Permission denied")

    monkeypatch.setattr("sourcecheck.index.cache.tempfile.mkstemp", refuse)
    assert cache.load_source("ab" * 32, "x1", "b.pdf") is not None
    cache.save_vectors("passages", "k", np.ones((2, 3), dtype=np.float32))
    said = "cache folder cannot be written (Permission denied); this run goes on without saving to it"
    assert cache.warnings == [said]
    assert cache.vectors_written == 0
