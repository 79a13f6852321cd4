"""The cautions every result carries, on screen, in JSON and in reports."""

CAUTION = ("Stanchion assists a competent engineer; it does not replace the governing design code, its national "
           "annex, or a licensed engineer's judgement. Check every input and result.")

LIMITATIONS = (
    "Flexural buckling of a straight member about each principal axis; torsional and flexural-torsional "
    "buckling only where the thin-walled analysis runs (two planes, every segment given by a section shape, no "
    "distributed load, foundation, leaning load, taper or shear flexibility); no member check with bending (a "
    "column that carries bending is not verified on its axial checks), no local buckling.",
    "Restraints are taken as given: their adequacy (strength, stiffness, connection detail) is not checked.",
    "All axial load is carried down the column to its base.",
)
