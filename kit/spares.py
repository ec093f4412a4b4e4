# SPDX-License-Identifier: MIT
"""The spares policy: what to keep on board, per component kind, and why.

The default policy ships as ``kit/data/spares_policy.toml``; a company file overrides any part of
it (see that file's header). Each item names its basis: a rule (``SOLAS II-1/29.12.3``),
``common practice`` or ``company policy``.
"""

from __future__ import annotations

import tomllib
from dataclasses import dataclass
from importlib import resources
from pathlib import Path
from typing import Any

from kit.errors import InputError
from kit.housings import LENGTHS as HOUSING_LENGTHS
from kit.input_files import TOML_POLICY, read_text
from kit.oil import Package
from kit.toml_text import parse_toml
from kit.units import to_si

PER = ("unit", "actuator", "actuator_size", "voltage", "valve_block", "hose_size", "pump_model")
ITEM_KINDS = ("seal_set", "storage_oil", "solenoid_coil", "valve_seal_kit", "relief_cartridge", "hose", "pump_shaft_seal",
              "carrier_seal_set", "carrier_bearing_parts")
DEFAULT_SOURCE = "kit default spares policy"


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


def read_policy_text(path: str | Path) -> str:
    """The text of a company policy file (a regular file, see :mod:`kit.input_files`)."""
    return read_text(path, TOML_POLICY)


def _parse(text: str, source: str) -> dict[str, Any]:
    return parse_toml(text, source)


def _build(data: dict[str, Any], source: str) -> Policy:
    def bad(field: str, expected: str, got: Any) -> InputError:
        return InputError(source, field, expected, got=repr(got))

    head = data.get("policy", {})
    sets = head.get("spare_filter_sets", 1)
    if isinstance(sets, bool) or not isinstance(sets, int) or sets < 0:
        raise bad("policy.spare_filter_sets", "a whole number of 0 or more", sets)
    length = head.get("housing_length", "medium")
    if length not in HOUSING_LENGTHS:
        raise bad("policy.housing_length", "one of " + ", ".join(HOUSING_LENGTHS), length)
    ratings = {k: to_si(v, "pressure", source=source, field=f"ratings.{k}") for k, v in data.get("ratings", {}).items()}
    packages = []
    for i, p in enumerate(data.get("oil", {}).get("package", [])):
        if not isinstance(p, dict) or not isinstance(p.get("name"), str):
            raise bad(f"oil.package[{i}].name", "a package name", p)
        vol = to_si(p.get("volume"), "volume", source=source, field=f"oil.package[{i}].volume")
        if vol <= 0:
            raise bad(f"oil.package[{i}].volume", "a positive volume", p.get("volume"))
        packages.append(Package(p["name"], vol))
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
        if isinstance(qty, bool) or not isinstance(qty, int) or qty < 0:
            raise bad(f"{where}.quantity", "a whole number of 0 or more", qty)
        basis = it.get("basis")
        if not isinstance(basis, str) or not basis.strip():
            raise bad(f"{where}.basis", 'the basis, e.g. "common practice" or "company policy"', basis)
        if qty:
            items.append(PolicyItem(kind, str(it.get("text", kind)), per, qty, basis.strip()))
    return Policy(str(head.get("name", "unnamed")), sets, length, ratings, tuple(packages), tuple(items), source)


def default_policy_data() -> dict[str, Any]:
    return tomllib.loads(resources.files("kit.data").joinpath("spares_policy.toml").read_text(encoding="utf-8"))


def policy_from_text(text: str | None, source: str = DEFAULT_SOURCE) -> Policy:
    """The default policy with ``text`` (a company policy file's TOML, e.g. as stored in the fleet
    database) merged over it; ``None`` is the default policy itself. Errors name ``source``."""
    data = default_policy_data()
    if text is not None:
        data = _merge(data, _parse(text, source), source)
    return _build(data, source)


def load_policy(override: str | Path | None = None) -> Policy:
    """The default policy, with ``override`` (a company policy file) merged over it."""
    if override is None:
        return policy_from_text(None)
    return policy_from_text(read_policy_text(override), str(override))
