"""``stanchion explore``: a local web page with sliders for the uncertain inputs of a case.

Modules: :mod:`~fea.explore.inputs` (the sliders), :mod:`~fea.explore.state` (the changed values and their
results: the exact one-spring path of :mod:`~fea.explore.fast`, a re-solve, or every analysis),
:mod:`~fea.explore.view` (what the page shows), :mod:`~fea.explore.svg` (its figure),
:mod:`~fea.explore.save` (a new case file, comments kept) and :mod:`~fea.explore.server` (the loopback
server and its checks).  Nothing here prints: :mod:`fea.cli.explore` does.  See ``docs/explorer.md``.
"""
