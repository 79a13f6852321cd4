"""The tool's version, from the installed package's metadata (the JSON result and reports name it)."""

from importlib.metadata import PackageNotFoundError, version

__all__ = ["__version__"]

try:
    __version__ = version("stanchion")
except PackageNotFoundError:  # pragma: no cover - running from a plain checkout
    __version__ = "0.0.0"
