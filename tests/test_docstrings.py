"""Every registered method documents each argument with a unit and cites a reference."""
import inspect
import re

import pytest

from rating.correlations import REGISTRY

UNIT = re.compile(r"\[[^\]]+\]")


def _parameter_block(doc: str) -> str:
    m = re.search(r"Parameters\n\s*-+\n(.*?)(\n\s*(Returns|Notes|References|Examples)\n\s*-+|\Z)", doc, re.S)
    return m.group(1) if m else ""


@pytest.mark.parametrize("name", sorted(REGISTRY))
def test_every_argument_has_a_unit(name):
    method = REGISTRY[name]
    doc = inspect.getdoc(method.function) or ""
    block = _parameter_block(doc)
    assert block, f"{name}: no Parameters section"
    for arg in inspect.signature(method.function).parameters:
        m = re.search(rf"^{re.escape(arg)} :.*?\n((?:[ \t]+.*\n?)*)", block, re.M)
        assert m, f"{name}: argument {arg!r} is not documented"
        assert UNIT.search(m.group(0)), f"{name}: argument {arg!r} has no [unit]"


@pytest.mark.parametrize("name", sorted(REGISTRY))
def test_every_method_has_a_reference(name):
    method = REGISTRY[name]
    assert method.references and all(len(r) > 15 for r in method.references), name
    assert "References" in (inspect.getdoc(method.function) or ""), name


@pytest.mark.parametrize("name", sorted(REGISTRY))
def test_validity_keys_are_arguments_or_derived_groups(name):
    from rating.correlations.registry import DERIVED
    method = REGISTRY[name]
    args = set(inspect.signature(method.function).parameters)
    for key in method.validity:
        assert key in args or (key in DERIVED and set(DERIVED[key][0]) <= args), (name, key)
