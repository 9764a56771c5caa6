"""Case files: TOML with units ("150 kg/h", "40 degC") -> a validated ``Case`` in SI.

The format is described in cases/README.md. ``load_case(path)`` and ``parse_case(text, where)``
return a ``Case`` or raise ``traywise.errors.CaseError`` naming the file, the key path, what
was found and what would be valid.
"""

from .load import Case, load_case, parse_case

__all__ = ["Case", "load_case", "parse_case"]
