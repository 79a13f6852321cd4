"""Solvers: elastic buckling (``eigen``) and nonlinear path following."""
