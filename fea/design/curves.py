"""Design resistance of axially loaded members by published column curves: the curve functions.

Pure functions, SI units throughout (Pa, m^2, N).  Each returns a frozen
result dataclass carrying the clause label, the slenderness used, the
reduction factor, the resistance and the intermediate values a checker
wants to see.  Every resistance is capped at the material's own limit (the
reduction factor never exceeds 1).  Each standard lives in its own module of
:mod:`fea.design.standards` with its constants and written-out formulas; this
module gathers their curve functions under one name.
"""

from __future__ import annotations

from .standards.aisc360 import AISC360Compression, aisc360_e3
from .standards.as4100 import AS4100_ALPHA_B, AS4100Compression, as4100_compression
from .standards.bs5950 import BS5950_ROBERTSON, BS5950Compression, bs5950_compression
from .standards.en1993 import (
    EN1993_IMPERFECTION,
    EN1993Buckling,
    EN1993Chi,
    EN1993Tension,
    en1993_buckling,
    en1993_chi,
    en1993_tension,
)
from .standards.perry_robertson import PerryRobertson, perry_robertson
from .standards.rankine_gordon import RankineGordon, rankine_gordon
from .standards.record import equivalent_slenderness
from .standards.working_stress import WorkingStress, working_stress

__all__ = [
    "EN1993_IMPERFECTION",
    "BS5950_ROBERTSON",
    "AS4100_ALPHA_B",
    "equivalent_slenderness",
    "EN1993Chi",
    "EN1993Buckling",
    "en1993_chi",
    "en1993_buckling",
    "AISC360Compression",
    "aisc360_e3",
    "AS4100Compression",
    "as4100_compression",
    "BS5950Compression",
    "bs5950_compression",
    "PerryRobertson",
    "perry_robertson",
    "RankineGordon",
    "rankine_gordon",
    "WorkingStress",
    "working_stress",
    "EN1993Tension",
    "en1993_tension",
]
