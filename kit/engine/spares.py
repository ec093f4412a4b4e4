# SPDX-License-Identifier: MIT
"""The spares policy: what to keep on board, per component kind, and why.

The default policy ships as ``kit/data/spares_policy.toml``; a company file overrides any part of
it (see that file's header). Each item names its basis: a rule (``SOLAS II-1/29.12.3``),
``common practice`` or ``company policy``.

A company file is refused, naming the key, when it holds a key or table kit does not know
(:data:`SCHEMA`: a typing error must not silently leave the default in force), a rating that is
not a positive pressure of at most :data:`MAX_RATING_BAR` bar, an oil package smaller than
:data:`MIN_PACKAGE_L` litres, a whole number past its bound, or text with a control character.
"""

from __future__ import annotations

import tomllib
from dataclasses import dataclass
from importlib import resources
from typing import Any

from kit.errors import InputError
from kit.engine.housings import LENGTHS as HOUSING_LENGTHS
from kit.engine.oil import Package
from kit.engine.text_checks import checked_text
from kit.engine.units import to_si

PER = ("unit", "actuator", "actuator_size", "voltage", "valve_block", "hose_size", "pump_model")
ITEM_KINDS = ("seal_set", "storage_oil", "solenoid_coil", "valve_seal_kit", "relief_cartridge", "hose", "pump_shaft_seal",
              "carrier_seal_set", "carrier_bearing_parts")
DEFAULT_SOURCE = "kit default spares policy"

# The keys a policy file may hold: a table's known keys, or for an array of tables the keys of
# each. ``ratings`` names components freely (every rating is checked against the working pressure).
SCHEMA: dict[str, Any] = {
    "policy": {"name", "spare_filter_sets", "housing_length"},
    "ratings": None,
    "oil": {"package": [{"name", "volume"}]},
    "item": [{"kind", "text", "per", "quantity", "basis"}],
}
MAX_SPARE_SETS = 100  # spare filter element sets
MAX_ITEM_QUANTITY = 1000  # of one item per unit, actuator, voltage ...
# Hydraulic components are rated to at most some 700 bar; a rating above 10,000 bar is a slip of
# the unit (psi for bar) rather than a component (common practice).
MAX_RATING_BAR = 10_000
# The smallest container hydraulic oil is sold in is the 1 L bottle; a package below 0.5 L is a
# slip of the unit (mL for L), and a tiny one would turn a tank of oil into millions of packages
# (common practice).
MIN_PACKAGE_L = 0.5


@dataclass(frozen=True)
class PolicyItem:
    kind: str
    text: str
    per: str
    quantity: int
    basis: str


@dataclass(frozen=True)
class Policy:
    name: str
    spare_filter_sets: int
    housing_length: str
    ratings: dict[str, float]  # Pa; 0 = not checked
    packages: tuple[Package, ...]
    items: tuple[PolicyItem, ...]
    source: str

    def item(self, kind: str) -> PolicyItem | None:
        return next((i for i in self.items if i.kind == kind), None)


WHERE = "_where"  # the item's place in the file it came from, for error messages


def _merge(base: dict[str, Any], override: dict[str, Any], source: str) -> dict[str, Any]:
    merged = dict(base)
    for key, value in override.items():
        if key == "item":
            if not isinstance(value, list):
                raise InputError(source, "item", "an array of tables ([[item]])", got=type(value).__name__)
            items = {i.get("kind"): {**i, WHERE: f"{DEFAULT_SOURCE}: item[{n}]"} for n, i in enumerate(base.get("item", []))}
            for n, i in enumerate(value):
                if not isinstance(i, dict):
                    raise InputError(source, f"item[{n}]", "a table", got=repr(i))
                items[i.get("kind")] = {**i, WHERE: f"item[{n}]"}
            merged["item"] = list(items.values())
        elif isinstance(value, dict) and isinstance(base.get(key), dict):
            merged[key] = _merge(base[key], value, source)
        else:
            merged[key] = value
    return merged


def _refuse_unknown(data: Any, schema: Any, source: str, path: str) -> None:
    """Refuse, naming it, the first key of ``data`` that ``schema`` (see :data:`SCHEMA`) does not know."""
    if schema is None:
        return
    if isinstance(schema, list):
        if not isinstance(data, list):
            raise InputError(source, path, f"an array of tables ([[{path}]])", got=type(data).__name__)
        for n, item in enumerate(data):
            _refuse_unknown(item, schema[0], source, f"{path}[{n}]")
        return
    if not isinstance(data, dict):
        raise InputError(source, path, f"a table ([{path}])", got=type(data).__name__)
    for key, value in data.items():
        name = f"{path}.{key}" if path else key
        if key not in schema:
            known = ", ".join(sorted(schema))
            raise InputError(source, name, f"a known key here ({known})", got="an unknown key")
        if isinstance(schema, dict):
            _refuse_unknown(value, schema[key], source, name)


def _text(value: Any, source: str, field: str) -> str:
    """A policy's text field: a string with no control characters."""
    if not isinstance(value, str):
        raise InputError(source, field, "text", got=repr(value))
    return checked_text(value, source=source, field=field)


def _build(data: dict[str, Any], source: str) -> Policy:
    def bad(field: str, expected: str, got: Any) -> InputError:
        return InputError(source, field, expected, got=repr(got))

    head = data.get("policy", {})
    sets = head.get("spare_filter_sets", 1)
    if isinstance(sets, bool) or not isinstance(sets, int) or not 0 <= sets <= MAX_SPARE_SETS:
        raise bad("policy.spare_filter_sets", f"a whole number from 0 to {MAX_SPARE_SETS}", sets)
    length = head.get("housing_length", "medium")
    if length not in HOUSING_LENGTHS:
        raise bad("policy.housing_length", "one of " + ", ".join(HOUSING_LENGTHS), length)
    ratings = {}
    for k, v in data.get("ratings", {}).items():
        field = f"ratings.{_text(k, source, 'ratings')}"
        ratings[k] = to_si(v, "pressure", source=source, field=field)
        if not 0 < ratings[k] <= MAX_RATING_BAR * 1e5:  # 1 bar = 1e5 Pa (ISO 80000-4)
            raise bad(field, f"a positive pressure of at most {MAX_RATING_BAR:,} bar (leave out what is not rated)", v)
    packages = []
    for i, p in enumerate(data.get("oil", {}).get("package", [])):
        if not isinstance(p, dict) or not isinstance(p.get("name"), str):
            raise bad(f"oil.package[{i}].name", "a package name", p)
        vol = to_si(p.get("volume"), "volume", source=source, field=f"oil.package[{i}].volume")
        if not vol >= MIN_PACKAGE_L / 1000:  # L to m^3
            raise bad(f"oil.package[{i}].volume", f"a volume of at least {MIN_PACKAGE_L:g} L", p.get("volume"))
        packages.append(Package(_text(p["name"], source, f"oil.package[{i}].name"), vol))
    if not packages:
        raise InputError(source, "oil.package", "at least one oil package", got="none")
    items = []
    for i, it in enumerate(data.get("item", [])):
        if not isinstance(it, dict):
            raise bad(f"item[{i}]", "a table", it)
        where = it.get(WHERE, f"item[{i}]")
        kind, per, qty = it.get("kind"), it.get("per"), it.get("quantity")
        if kind not in ITEM_KINDS:
            raise bad(f"{where}.kind", "one of " + ", ".join(ITEM_KINDS), kind)
        if per not in PER:
            raise bad(f"{where}.per", "one of " + ", ".join(PER), per)
        if isinstance(qty, bool) or not isinstance(qty, int) or not 0 <= qty <= MAX_ITEM_QUANTITY:
            raise bad(f"{where}.quantity", f"a whole number from 0 to {MAX_ITEM_QUANTITY}", qty)
        basis = it.get("basis")
        if not isinstance(basis, str) or not basis.strip():
            raise bad(f"{where}.basis", 'the basis, e.g. "common practice" or "company policy"', basis)
        if qty:
            items.append(PolicyItem(kind, _text(it.get("text", kind), source, f"{where}.text"), per, qty,
                                    _text(basis, source, f"{where}.basis").strip()))
    return Policy(_text(head.get("name", "unnamed"), source, "policy.name"), sets, length, ratings, tuple(packages),
                  tuple(items), source)


def default_policy_data() -> dict[str, Any]:
    return tomllib.loads(resources.files("kit.data").joinpath("spares_policy.toml").read_text(encoding="utf-8"))


def policy_from_data(data: dict[str, Any] | None, source: str = DEFAULT_SOURCE) -> Policy:
    """The default policy with ``data`` (a company policy file's parsed TOML, from a file or as
    stored in the fleet database; see :mod:`kit.files.policy_file`) merged over it; ``None`` is the
    default policy itself. Errors name ``source``."""
    merged = default_policy_data()
    if data is not None:
        _refuse_unknown(data, SCHEMA, source, "")
        merged = _merge(merged, data, source)
    return _build(merged, source)
