"""``python -m sourcecheck``: the same entry point as the console script."""

import sys

from sourcecheck.cli import main

sys.exit(main())
