"""Restraint studies: parameter sweeps, brace stiffness, sensitivities and fixity bounds.

Modules
-------
:mod:`fea.study.paths`
    Case-file key paths (``restraint[1].rotation``) and a small TOML writer.
:mod:`fea.study.target`
    A case with its document; which plane restraint a [[restraint]] table drives.
:mod:`fea.study.spring_set`
    :class:`SpringModel`: load factors with several springs varying, on one mesh.
:mod:`fea.study.sweep`
    One- and two-parameter sweeps (fast spring path, general re-solve path in parallel).
:mod:`fea.study.brace`
    Threshold brace stiffness beside Winter's rule and AISC 360 Appendix 6; brace force.
:mod:`fea.study.sensitivity`
    d lam / d k of every spring from the mode shape, checked by finite differences.
:mod:`fea.study.bounds`
    Load factor and K bounds over a box of uncertain springs (corners bound it).
:mod:`fea.study.commands`
    The ``sweep``, ``brace``, ``sensitivity`` and ``bounds`` subcommands and the [study] table.

The kernels here use SI floats and never print; the commands module does the I/O.
"""
