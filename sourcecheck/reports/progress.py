"""A rich progress bar for the slow stages (reading and embedding sources)."""

from __future__ import annotations

from collections.abc import Callable, Iterator
from contextlib import contextmanager

from rich.console import Console
from rich.progress import (
    BarColumn,
    MofNCompleteColumn,
    Progress,
    TaskID,
    TextColumn,
    TimeElapsedColumn,
)

LABELS = {"read": "Reading sources", "embed": "Embedding passages"}


@contextmanager
def progress_bar(console: Console, enabled: bool = True) -> Iterator[Callable[[str, int, int], None]]:
    """Yield a ``progress(stage, done, total)`` callable that drives one bar per stage."""
    if not enabled:
        yield lambda stage, done, total: None
        return
    with Progress(
        TextColumn("{task.description}"),
        BarColumn(),
        MofNCompleteColumn(),
        TimeElapsedColumn(),
        console=console,
        transient=True,
    ) as bar:
        tasks: dict[str, TaskID] = {}

        def update(stage: str, done: int, total: int) -> None:
            if stage not in tasks:
                tasks[stage] = bar.add_task(LABELS.get(stage, stage), total=total)
            bar.update(tasks[stage], completed=done, total=total)

        yield update
