"""``python -m compare.cli ...``: the command line (the installed script is ``shaftcheck``)."""
import sys

from .main import main

sys.exit(main())
