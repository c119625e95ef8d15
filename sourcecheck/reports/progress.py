"""A rich progress display: one line per stage, with counts, rate and time left.

Stages, in order: ``read`` (PDFs), ``load model`` (one step, shown because it takes
seconds), ``embed`` (passages) and ``judge`` (claims). A stage that has nothing to do in a
warm run (loading the model, embedding) never appears.
"""

from __future__ import annotations

from collections.abc import Callable, Iterator
from contextlib import contextmanager

from rich.console import Console
from rich.progress import (
    BarColumn,
    MofNCompleteColumn,
    Progress,
    ProgressColumn,
    Task,
    TaskID,
    TextColumn,
    TimeElapsedColumn,
    TimeRemainingColumn,
)
from rich.text import Text

LABELS = {
    "read": "Reading sources",
    "load model": "Loading the model",
    "embed": "Embedding passages",
    "judge": "Judging claims",
}
#: What each stage counts, for the rate column.
UNITS = {"read": "PDFs", "load model": "", "embed": "passages", "judge": "claims"}


class RateColumn(ProgressColumn):
    """Items per second of the stage, in its own unit ("12.3 PDFs/s")."""

    def render(self, task: Task) -> Text:
        speed = task.finished_speed or task.speed
        unit = task.fields.get("unit", "")
        if speed is None or not unit:
            return Text("")
        return Text(f"{speed:.1f} {unit}/s", style="progress.data.speed")


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
        RateColumn(),
        TimeElapsedColumn(),
        TextColumn("left"),
        TimeRemainingColumn(),
        console=console,
        transient=True,
    ) as bar:
        tasks: dict[str, TaskID] = {}

        def update(stage: str, done: int, total: int) -> None:
            if stage not in tasks:
                tasks[stage] = bar.add_task(LABELS.get(stage, stage), total=total, unit=UNITS.get(stage, ""))
            bar.update(tasks[stage], completed=done, total=total)

        yield update
