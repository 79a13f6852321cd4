"""The commented case-file template written by ``stanchion init``."""

TEMPLATE = '''\
# Stanchion case file (TOML).  Every dimensional value is a string: one number, then its unit
# ("4.5 m", "18.2e6 mm^4"): a decimal point, no thousands separators, no arithmetic.
# Heights are measured from the base; "base" and "top" may be used for the ends.
# Compression is positive.  Full format: cases/README.md.
# DEMO TEMPLATE: the numbers below are invented; replace them with your column.

title = "My column (edit me)"

[units]                      # display units for the summary and plots
length = "m"                 # m, cm, mm, in, ft
force = "kN"                 # N, kN, MN, lbf, kip, tf

[material]                   # defaults for every segment
E = "210 GPa"
fy = "355 MPa"

[analysis]
modes = 3                    # number of buckling modes per axis
tolerance = 1e-6             # relative tolerance of the lowest load factor

[[segment]]                  # listed from the base upward
name = "lower shaft"
length = "4.0 m"
I_major = "57.9e6 mm^4"      # or I = "..." alone for a one-plane study
I_minor = "20.0e6 mm^4"
A = "7810 mm^2"
# I_major_top = "..."        # tapered segment: value at the top
# taper_exponent = 1         # I^(1/n) varies linearly with height
# S = "5000 kN"              # shear stiffness of a laced or battened member

[[segment]]
name = "upper shaft"
length = "2.5 m"
I_major = "23.0e6 mm^4"
I_minor = "7.7e6 mm^4"
A = "5380 mm^2"

[[restraint]]                # base plate: rigid laterally, partly fixed in rotation
at = "base"
axis = "both"                # "major", "minor" or "both"
lateral = "rigid"            # "rigid", "free" or a stiffness such as "400 kN/m"
rotation = "4 MN*m/rad"      # "rigid", "free" or a stiffness

[[restraint]]                # roof level: held laterally by the roof bracing
at = "top"
lateral = "rigid"
# [[restraint.beam]]         # rotational restraint from a beam framing in
# I = "30e6 mm^4"            # c E I / span: far_end = "pinned" (3), "fixed" (4),
# span = "6 m"               # "double-curvature" (6) or "single-curvature" (2)
# far_end = "pinned"

[[restraint]]                # a girt on the minor axis only
at = "4.0 m"
axis = "minor"
lateral = "1.5 MN/m"

[[load]]
at = "top"
axial = "300 kN"             # variable: multiplied by the load factor

[[load]]
at = "4.0 m"
axial = "150 kN"
permanent = true             # held at its value while the variable loads are scaled

# [[distributed_load]]       # self weight or friction, per unit height
# from = "base"
# to = "top"
# axial = "0.6 kN/m"
# permanent = true

# [[foundation]]             # lateral elastic (Winkler) foundation over a range
# from = "base"
# to = "3 m"
# modulus_bottom = "8 MN/m^2"
# modulus_top = "0 MN/m^2"

# [[leaning]]                # gravity load of pinned columns leaning on this one
# at = "top"
# load = "600 kN"
# height = "6.5 m"
'''
