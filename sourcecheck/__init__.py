"""sourcecheck: does each cited claim in a manuscript stand in the source it cites?

Everything runs on this machine: no network connection is ever opened.
"""

__version__ = "0.1.0"
