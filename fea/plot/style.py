"""Style of the column figures: font sizes, greys, symbol sizes and page layout.

Plain numbers only (no matplotlib), shared by the drawing modules of
:mod:`fea.plot`.  Symbol sizes are in printer's points, layout sizes in inches.
"""

from __future__ import annotations

# -- text [pt] ---------------------------------------------------------------------
FS = 8.5          # labels
FS_TICK = 8.0     # tick labels and key
FS_TITLE = 9.0    # panel titles
FS_HEAD = 10.0    # group headings
FS_SUPTITLE = 11.0

# -- greys -------------------------------------------------------------------------
INK = "black"
AXIS_GREY = "0.5"
BAND_FILL = "0.82"
BAND_EDGE = "0.35"
GRID_GREY = "0.78"
LEADER_GREY = "0.45"

# -- symbols [pt] ------------------------------------------------------------------
#: Largest half-width of the segment band [pt].
BAND_MAX = 5.0
#: Smallest half-width of the segment band [pt].
BAND_MIN = 0.9
#: Horizontal amplitude limit of the mode panels (modes are scaled to 1).
MODE_XLIM = 1.35
#: Smallest vertical distance between two labels or tick labels [pt].
LABEL_GAP = 2.0
#: Length of a lateral spring from its wall to the axis [pt].
SPRING_LEN = 26.0

# x positions in the model panel [pt from the axis]
X_RIGHT_LOAD = BAND_MAX + 20.0     # intermediate point-load arrows
X_RIGHT_DIST = BAND_MAX + 31.0     # distributed-load arrows
X_LEFT_LABEL = -(BAND_MAX + SPRING_LEN + 8.0)

# -- page layout [in] ----------------------------------------------------------------
AX_HEIGHT = 4.4
LEFT_MARGIN = 0.72
RIGHT_MARGIN = 0.12
MODEL_GAP = 0.22     # model panel to first mode panel
MODE_GAP = 0.10      # between mode panels
GROUP_GAP = 0.55     # between bending planes (room for height tick labels)
TOP_SUPTITLE = 0.34
TOP_HEADING = 0.26
TOP_TITLES = 0.40    # panel titles above the panels of a mode figure
TOP_BARE = 0.06      # above the panels of a sketch without mode panels (no panel titles)
BOTTOM_AXIS = 0.46   # below the panels when mode panels (with their x axis) are drawn
BOTTOM_BARE = 0.12   # below the panels of a sketch without mode panels
KEY_ROW = 0.22
KEY_PAD = 0.10
FORCE_WIDTH = 0.80   # the axial-force diagram beside the model
FORCE_GAP = 0.08     # model panel to the axial-force diagram
MODE_WIDTH = 1.40
MODE_WIDTH_MIN = 0.75
MAX_WIDTH = 10.0
SKETCH_MIN_WIDTH = 5.0  # a sketch without mode panels (the report's)

# -- key [pt] ------------------------------------------------------------------------
KEY_SYMBOL_W = 26.0
KEY_ENTRY_GAP = 14.0
