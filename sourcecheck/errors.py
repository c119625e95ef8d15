"""Errors that stop a run, as opposed to problems that are reported and passed over.

    SourcecheckError            anything the CLI turns into one line and exit code 2
    ├── DraftUnreadable         the draft file is missing, a folder, or cannot be opened
    ├── SourcesUnreadable       the --sources folder is missing or not a folder
    ├── MappingError            the --map file is missing or malformed
    ├── ModelUnavailable        the embedding model folder is missing or will not load
    └── SettingsError           a configuration or review file is malformed, or an asked-for claim is not there

Bad content inside an otherwise readable file (a broken PDF, a marker with no entry) is
never an exception past its stage: it becomes a :class:`sourcecheck.model.Problem`.
"""

from __future__ import annotations


class SourcecheckError(Exception):
    """Base class: the message is the one line the user sees."""


class DraftUnreadable(SourcecheckError):
    """The draft cannot be opened at all."""


class SourcesUnreadable(SourcecheckError):
    """The sources folder cannot be listed."""


class MappingError(SourcecheckError):
    """The reference-to-file mapping cannot be read."""


class BibliographyUnreadable(SourcecheckError):
    """The bibliography the user named (``--bib``) cannot be opened: like a missing ``--map``, it stops the run."""


class ModelUnavailable(SourcecheckError):
    """The embedding model cannot be loaded from local disk."""


class SettingsError(SourcecheckError):
    """A configuration or review file cannot be read, or a review names a claim the draft lacks."""
