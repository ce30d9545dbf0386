"""``python -m calcfuncs``: a cell function over the columns of a CSV (see cli.py)."""

import sys

from .cli import main

sys.exit(main())
