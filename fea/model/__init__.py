"""The model: the column (``column``), its imperfections and lateral actions
(``imperfection``) and the parsed case (``case``), all in SI units, immutable and
validated when built.  The column's names are re-exported here.
"""

from .column import (
    FREE,
    RIGID,
    STATION_TOL,
    Column,
    DistributedLoad,
    Foundation,
    LeaningLoad,
    PointLoad,
    Restraint,
    Segment,
)

__all__ = ["STATION_TOL", "FREE", "RIGID", "Segment", "Restraint", "Foundation", "PointLoad", "DistributedLoad",
           "LeaningLoad", "Column"]
