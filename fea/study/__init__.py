"""Restraint studies: parameter sweeps, brace stiffness, sensitivities and fixity bounds.

Modules
-------
:mod:`fea.study.paths`
    Case-file key paths (``restraint[1].rotation``): read and set one input of a case document.
:mod:`fea.study.target`
    A parsed case as the studies see it: which plane restraint a [[restraint]] table drives;
    springs changed on the case, other inputs through its document and a rebuild function.
:mod:`fea.study.spec`
    The settings a case's ``[study]`` table gives (read by :mod:`fea.io.study_input`).
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
:mod:`fea.study.run`
    The kernels applied to the planes and [[restraint]] tables of a case.

The engines here change a parsed case, never TOML text, use SI floats and never
print.  The subcommands are :mod:`fea.cli.sweep`, :mod:`fea.cli.brace`,
:mod:`fea.cli.sensitivity` and :mod:`fea.cli.bounds`; their JSON, CSV and
summaries are built by :mod:`fea.io.study_output`.
"""
