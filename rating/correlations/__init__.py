"""Published correlations, one module per physics family, all in one registry.

Importing this package imports every family module so that the registry is
complete; use ``registry.methods(family)`` and ``registry.get(name)``.
"""
from __future__ import annotations

import importlib
import pkgutil

from .registry import REGISTRY, FAMILIES, Method, get, methods, register  # noqa: F401

for _info in sorted(pkgutil.iter_modules(__path__), key=lambda i: i.name):
    if _info.name not in ("registry",):
        importlib.import_module(f"{__name__}.{_info.name}")
