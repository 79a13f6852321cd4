"""The design standards, one module and one :class:`~fea.design.standards.record.Standard` record each.

:data:`STANDARDS` lists them by the name a case gives in ``[design] standard``.
"""

from __future__ import annotations

from types import MappingProxyType

from .aisc360 import AISC360
from .as4100 import AS4100
from .bs5950 import BS5950
from .en1993 import EN1993
from .perry_robertson import PERRY_ROBERTSON
from .rankine_gordon import RANKINE_GORDON
from .record import PASSES, UTILISATION, MemberData, Standard, Step
from .working_stress import WORKING_STRESS

__all__ = ["STANDARDS", "Standard", "Step", "MemberData", "UTILISATION", "PASSES"]

STANDARDS: MappingProxyType[str, Standard] = MappingProxyType({s.name: s for s in (
    EN1993, AISC360, AS4100, BS5950, PERRY_ROBERTSON, RANKINE_GORDON, WORKING_STRESS)})
"""Every standard a case may name, by that name."""
