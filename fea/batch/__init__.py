"""Many runs of a case: column schedules (``stanchion batch``) and Monte Carlo strength (``stanchion reliability``).

Two layers share this folder (``tests/test_imports.py``):

* the case-file input, below :mod:`fea.pipeline` (which lists ``[reliability]`` among its tables):
  ``keys.py`` (key paths into a case document), ``distributions.py`` (the random variables' laws) and
  ``reliability_input.py`` (the ``[reliability]`` table);
* the engines, above :mod:`fea.pipeline`: ``schedule.py`` and ``combinations.py`` (a schedule file -> one job
  per row and combination), ``sampling.py`` (one seed per sample index), ``statistics.py`` (mean, fractiles,
  probability of failure with their sampling errors), ``run.py`` (the work of one task: a chunk of rows or
  samples), ``reliability.py`` (samples -> strengths -> statistics), ``output.py``, ``page.py`` and
  ``figures.py`` (tables, the summary page, the charts) and ``execute.py``, the only module that uses Dask
  (imported inside the functions that run chunks).

Nothing here prints; the commands are :mod:`fea.cli.batch` and :mod:`fea.cli.reliability`.
"""
