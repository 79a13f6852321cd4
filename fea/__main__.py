"""``python -m fea`` runs the ``stanchion`` command."""

import sys

from .cli import main

sys.exit(main())
