"""The layer contract: which package may import which, and only through its face.

The pipeline is draft -> claims -> sources -> index -> judgment -> report, over three shared
layers (plain text, PDF text, model inference) and one vocabulary (model, errors, limits). A
stage reads another package only through that package's ``__init__`` (its face, with an explicit
``__all__``), and only the packages listed in ``ALLOWED`` below. Adding a cross-stage
import of a private module, or a new dependency between stages, fails here first.
"""

from __future__ import annotations

import ast
import importlib
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
PACKAGE = ROOT / "sourcecheck"

VOCABULARY = {"model", "errors", "limits"}
SHARED = {"text", "pdftext", "inference"}
STAGES = {"drafts", "claims", "sources", "index", "judge", "reports"}
#: What people do with reports (gates, review state, settings, batches): beside the stages, reading only the vocabulary.
WORKFLOW = {"workflow"}
TOP = {"pipeline", "verdicts", "api", "cli", "__init__", "__main__", "workspace", "review_commands"}

#: What each package may import besides itself. Drafts hand their prose to the claims stage.
ALLOWED: dict[str, set[str]] = {
    "model": {"limits"},
    "errors": set(),
    "limits": set(),
    "text": set(),
    "pdftext": {"text", "errors", "model"},
    "inference": {"errors"},
    "drafts": VOCABULARY | SHARED | {"claims"},
    "claims": VOCABULARY | {"text"},
    "sources": VOCABULARY | SHARED,
    "index": VOCABULARY | {"text", "inference"},
    "judge": VOCABULARY | {"text", "inference"},
    "reports": VOCABULARY | {"text"},
    "workflow": VOCABULARY,
}


def _unit(path: Path) -> str | None:
    """The package (or top-level module) a file of sourcecheck belongs to."""
    parts = path.relative_to(PACKAGE).with_suffix("").parts
    return parts[0]


def _imports(path: Path) -> list[tuple[int, str, list[str]]]:
    """(line, module, names) of every import of a sourcecheck module in ``path``."""
    tree = ast.parse(path.read_text(encoding="utf-8"))
    found = []
    for node in ast.walk(tree):
        if isinstance(node, ast.ImportFrom) and node.module and node.level == 0:
            if node.module == "sourcecheck" or node.module.startswith("sourcecheck."):
                found.append((node.lineno, node.module, [a.name for a in node.names]))
        elif isinstance(node, ast.Import):
            for alias in node.names:
                if alias.name.startswith("sourcecheck."):
                    found.append((node.lineno, alias.name, []))
    return found


def _violations(path: Path, unit: str | None) -> list[str]:
    """Imports in ``path`` that break the contract; ``unit`` is None for bench/ and scripts/."""
    wrong = []
    for line, module, names in _imports(path):
        parts = module.split(".")
        target = parts[1] if len(parts) > 1 else "__init__"
        where = f"{path.relative_to(ROOT)}:{line} imports {module}"
        if target == unit:
            continue
        if unit in ALLOWED and target not in ALLOWED[unit]:
            wrong.append(f"{where}: {unit} may not depend on {target}")
            continue
        if target in SHARED | STAGES | WORKFLOW:
            face_name = f"sourcecheck.{target}"
            if len(parts) > 2:
                # Tools (bench/, scripts/) may also use a sub-package's own face, e.g. the entry
                # parser's training functions; a module inside a package, never.
                if unit is not None or not hasattr(importlib.import_module(module), "__path__"):
                    wrong.append(f"{where}: import from the face `sourcecheck.{target}`, not a module inside it")
                    continue
                face_name = module
            face = importlib.import_module(face_name)
            missing = [n for n in names if n not in getattr(face, "__all__", ())]
            if missing:
                wrong.append(f"{where}: {missing} not in {face_name}.__all__")
    return wrong


def _python_files(folder: Path) -> list[Path]:
    return sorted(p for p in folder.rglob("*.py") if "__pycache__" not in p.parts)


def test_every_package_imports_only_what_the_layers_allow() -> None:
    wrong = [v for path in _python_files(PACKAGE) for v in _violations(path, _unit(path))]
    assert wrong == []


@pytest.mark.parametrize("folder", ["bench", "scripts"])
def test_bench_and_scripts_use_faces_only(folder: str) -> None:
    wrong = [v for path in _python_files(ROOT / folder) for v in _violations(path, None)]
    assert wrong == []


@pytest.mark.parametrize("name", sorted(SHARED | STAGES | WORKFLOW))
def test_every_face_declares_what_it_offers(name: str) -> None:
    face = importlib.import_module(f"sourcecheck.{name}")
    offered = getattr(face, "__all__", None)
    assert offered, f"sourcecheck.{name} has no __all__"
    assert all(hasattr(face, n) for n in offered)
    assert not [n for n in offered if n.startswith("_")]


def test_no_private_module_is_imported_from_outside_its_package() -> None:
    wrong = []
    for path in _python_files(PACKAGE):
        home = path.parent.relative_to(ROOT).as_posix().replace("/", ".")
        for line, module, _ in _imports(path):
            parts = module.split(".")
            for i, part in enumerate(parts):
                if part.startswith("_") and not part.startswith("__") and not home.startswith(".".join(parts[:i])):
                    wrong.append(f"{path.relative_to(ROOT)}:{line} imports private {module}")
    assert wrong == []


def test_the_contract_catches_a_cross_stage_private_import(tmp_path: Path) -> None:
    # The checker itself must fail on the very import this contract exists to stop.
    fake = PACKAGE / "drafts" / "_contract_probe.py"
    fake.write_text("from sourcecheck.sources._reader import read_source\n", encoding="utf-8")
    try:
        found = _violations(fake, "drafts")
    finally:
        fake.unlink()
    assert any("drafts may not depend on sources" in v for v in found)


def test_stages_never_import_the_pipeline() -> None:
    wrong = [
        f"{path.relative_to(ROOT)}:{line}"
        for path in _python_files(PACKAGE)
        if _unit(path) in STAGES | SHARED | VOCABULARY | WORKFLOW
        for line, module, _ in _imports(path)
        if module.split(".")[1:2] and module.split(".")[1] in TOP - {"__init__"}
    ]
    assert wrong == []


def test_no_module_is_over_four_hundred_lines() -> None:
    # Small modules that each hold one concern (DEVELOPERS.md, "Conventions").
    long = {
        str(p.relative_to(ROOT)): n
        for p in _python_files(PACKAGE)
        if (n := len(p.read_text(encoding="utf-8").splitlines())) > 400
    }
    assert long == {}
