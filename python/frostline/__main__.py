"""``python -m frostline``: the command line (the same as the ``frostline`` script)."""
import sys

from .cli import main

sys.exit(main())
