"""Small helpers shared by every layer: numbers for JSON, read-only arrays, scalar checks, atomic files.

Imports nothing of the project but :mod:`fea.errors`.
"""
