"""The cautions every result carries, on screen, in JSON and in reports."""

CAUTION = ("Stanchion assists a competent engineer; it does not replace the governing design code, its national "
           "annex, or a licensed engineer's judgement. Check every input and result.")

LIMITATIONS = (
    "Flexural buckling of a straight member about each principal axis; torsional and flexural-torsional "
    "buckling only where the thin-walled analysis runs (two planes, every segment given by a section shape, no "
    "distributed load, foundation, leaning load, taper or shear flexibility). Members with bending are checked by "
    "EN 1993-1-1 (6.3.3 and a second-order analysis with member imperfections) and AISC 360 (direct analysis, "
    "H1.1) only, for doubly symmetric I and hollow sections given by shape in two planes, classes 1 to 3 "
    "(compact for AISC 360), with M_cr from the thin-walled analysis where they may buckle laterally-torsionally; "
    "any other member with bending is not verified. No local buckling: the checks take the gross section, so an "
    "I, channel or hollow section slender in compression (EN 1993-1-1 class 4, AISC 360 slender) is not verified.",
    "Restraints are taken as given: their adequacy (strength, stiffness, connection detail) is not checked.",
    "All axial load is carried down the column to its base.",
)
