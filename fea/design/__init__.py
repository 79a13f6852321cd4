"""Design resistance of members by published column curves.

Each standard is one record in :mod:`fea.design.standards`; the curve functions
are gathered in :mod:`fea.design.curves` and exported here.
"""

from fea.design.curves import *  # noqa: F403 - the curve functions are this package's public names
from fea.design.curves import __all__ as __all__
