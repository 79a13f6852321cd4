"""The tool's version, from the installed package's metadata (the JSON result and reports name it).

Read on first use: looking up package metadata costs start-up time that most runs do not need.
"""

from functools import lru_cache

__all__ = ["version"]  # and ``__version__``, looked up on first use (module __getattr__)


@lru_cache(maxsize=1)
def version() -> str:
    """The version of the installed ``stanchion`` package ("0.0.0" when run from a plain checkout)."""
    from importlib.metadata import PackageNotFoundError
    from importlib.metadata import version as _metadata_version

    try:
        return _metadata_version("stanchion")
    except PackageNotFoundError:  # pragma: no cover - running from a plain checkout
        return "0.0.0"


def __getattr__(name: str) -> str:
    if name == "__version__":
        return version()
    raise AttributeError(f"module 'fea.version' has no attribute {name!r}")
