# SPDX-License-Identifier: MIT
"""Vessel particulars as a workbook, for people who prefer to type into cells.

The workbook holds the same fields as the TOML particulars file (see the README), with the same
rules: every length, pressure, flow, volume and time is text with a unit ("280 mm"), because a
bare number could be read in more than one unit. Sheets:

- ``vessel``: two columns, ``field`` and ``value``; fields ``id``, ``name``, ``ship_type``,
  ``gross_tonnage``, ``company``.
- ``units``: one row per unit; columns as the ``[[unit]]`` fields (:data:`UNIT_COLUMNS`), and the
  unit's ``[unit.rudder]`` table in columns ``rudder_area``, ``rudder_mean_height`` and so on
  (:data:`RUDDER_COLUMNS`; all empty for a unit without one).
- ``filters``, ``pipes``, ``housings``, ``solenoids``, ``hoses``: one row per item, the column
  ``unit`` naming the unit's id, then the fields of ``[[unit.filter]]`` and so on.

Reading builds the same document a TOML file gives and checks it with
:func:`kit.engine.particulars.vessel_from_dict`, so both inputs obey one set of rules; an error is
reported at its sheet, row and column.
"""

from __future__ import annotations

import re
from pathlib import Path
from typing import Any

from kit.errors import InputError
from kit.files.input_files import TOML_PARTICULARS, read_text
from kit.engine.particulars import Vessel, vessel_from_dict
from kit.engine.rudder import POSITION_K3, PROFILE_K2
from kit.files.sheets import Sheet, read_sheets, write_sheets
from kit.files.toml_text import parse_toml

VESSEL_FIELDS = ("id", "name", "ship_type", "gross_tonnage", "company")
UNIT_COLUMNS = (
    "id", "service", "actuator", "count", "working_pressure", "fluid", "pumps", "pump_flow", "reservoir",
    "max_rudder_angle", "system_oil", "oil_leakage", "isolation_valves", "maker", "model", "pump_maker", "pump_model",
    "valve_blocks", "valve_maker", "valve_model",
    "ram_diameter", "bore", "rod", "stroke", "tiller_radius",
    "vanes", "vane_height", "housing_bore", "hub_diameter", "stock_diameter",
    "vane_angle", "max_working_pressure", "design_pressure", "trunnion_distance", "gland_spigot_bore", "rudder_carrier",
)
# The ``[unit.rudder]`` table, one column per field on the units sheet: column -> field.
RUDDER_COLUMNS = {f"rudder_{name}": name for name in
                  ("area", "mean_height", "area_forward", "ahead_speed", "astern_speed", "profile", "position")}
UNIT_SHEET_COLUMNS = UNIT_COLUMNS + tuple(RUDDER_COLUMNS)
# sheet -> (the unit's array of tables in TOML, columns after ``unit``)
CHILD_SHEETS = {
    "filters": ("filter", ("position", "elements", "change_interval", "duty", "element", "hours_since_change", "hours_read_on")),
    "pipes": ("pipe", ("outside_diameter", "wall", "length")),
    "housings": ("housing", ("role", "d", "D", "L")),
    "solenoids": ("solenoid", ("voltage", "count")),
    "hoses": ("hose", ("bore", "count")),
}
NOTES = {
    "field": "one of " + ", ".join(VESSEL_FIELDS),
    "value": 'ship_type: cargo, passenger, tanker, chemical_tanker or gas_carrier; gross_tonnage: a number',
    "id": "the unit's id, unique on the vessel (e.g. SG1)",
    "service": "steering, or what else the unit drives",
    "actuator": "ram, rotary_vane or cylinder",
    "working_pressure": 'e.g. "160 bar"',
    "fluid": 'ISO 6743-4 category and ISO 3448 grade, e.g. "HM 46"',
    "pump_flow": 'per pump, e.g. "120 L/min"',
    "reservoir": 'e.g. "400 L"',
    "isolation_valves": "TRUE or FALSE",
    "maker": "the gear's (or unit's) maker as on its name plate, optional; suppliers quote spares by it",
    "model": "the gear's (or unit's) model as on its name plate, optional",
    "pump_maker": "the pumps' maker, optional (pump_model: their model)",
    "valve_maker": "the valve block's maker, optional; valve seal kits, relief cartridges and coils name it",
    "valve_model": "the valve block's model, optional",
    "unit": "the id of the unit on the units sheet",
    "change_interval": 'e.g. "2000 h"',
    "duty": 'hours a day the filter sees flow, 0 to 24, e.g. "12 h/day" or 12',
    "hours_since_change": 'optional: running hours of the element in place since it was changed, e.g. "1200 h"',
    "hours_read_on": "optional: the date those hours were read, YYYY-MM-DD (a count on board that is newer wins)",
    "rudder_carrier": "separate, or in_actuator (a rotary vane actuator carrying the rudder)",
    "rudder_area": 'the rudder\'s [unit.rudder] table, e.g. "12.5 m^2"; leave the rudder_ columns empty for none',
    "rudder_profile": ", ".join(PROFILE_K2),
    "rudder_position": ", ".join(POSITION_K3),
}
_BOOLEANS = {"true": True, "yes": True, "false": False, "no": False}


def particulars_sheets(document: dict[str, Any] | None = None) -> list[Sheet]:
    """The template's sheets, filled from a parsed particulars document when one is given."""
    doc = document or {}
    vessel = dict(doc.get("vessel", {}))
    if "company" in doc:
        vessel["company"] = doc["company"].get("name")
    units = doc.get("unit", [])
    sheets = [
        Sheet("vessel", ("field", "value"), [(f, vessel.get(f)) for f in VESSEL_FIELDS], NOTES),
        Sheet("units", UNIT_SHEET_COLUMNS,
              [[row.get(c) for c in UNIT_SHEET_COLUMNS] for row in ({**u, **_rudder_cells(u)} for u in units)], NOTES),
    ]
    for name, (array, columns) in CHILD_SHEETS.items():
        rows = [[u.get("id"), *[item.get(c) for c in columns]] for u in units for item in u.get(array, [])]
        sheets.append(Sheet(name, ("unit", *columns), rows, NOTES))
    return sheets


def _rudder_cells(unit: dict[str, Any]) -> dict[str, Any]:
    rudder = unit.get("rudder", {})
    return {column: rudder.get(name) for column, name in RUDDER_COLUMNS.items()}


def write_particulars_template(path: str | Path, from_toml: str | Path | None = None, paper: str = "a4") -> None:
    """Write the particulars workbook, empty or filled from a TOML particulars file, to print on ``paper``."""
    document = None
    if from_toml is not None:
        document = parse_toml(read_text(from_toml, TOML_PARTICULARS), str(from_toml))
        vessel_from_dict(document, str(from_toml))  # refuse a bad file before writing anything
    vessel = (document or {}).get("vessel", {})
    what = f"Particulars of {vessel.get('name')} ({vessel.get('id')})" if vessel.get("id") else "Particulars (template)"
    write_sheets(path, particulars_sheets(document), what, paper)


def _cell(value: Any) -> Any:
    if isinstance(value, float) and value.is_integer():
        return int(value)
    if isinstance(value, str) and value.lower() in _BOOLEANS:
        return _BOOLEANS[value.lower()]
    return value


def _records(source: str, sheet: str, lines: list, columns: tuple[str, ...]) -> list[tuple[int, dict[str, Any]]]:
    """Rows under a header that names each column once, from ``columns`` (in any order). A value
    under a blank header cell would be dropped, and a second column of a name would hide the
    first, so both are refused."""
    from openpyxl.utils import get_column_letter

    where = f"{source}, sheet {sheet}"
    if not lines:
        return []
    top, header = lines[0][0], [None if c is None else str(c) for c in lines[0][1]]
    first: dict[str, int] = {}
    for i, name in enumerate(header):
        if name is None:
            continue
        if name not in columns:
            raise InputError(where, f"column {name}", "one of " + ", ".join(columns), got="an unknown column")
        if name in first:
            raise InputError(f"{where}, row {top}", f"column {name}", f"each column named once (first in column {get_column_letter(first[name] + 1)})",
                             got=f"a second one in column {get_column_letter(i + 1)}")
        first[name] = i
    out = []
    for line, cells in lines[1:]:
        for i, value in enumerate(cells):
            if value is not None and (i >= len(header) or header[i] is None):
                raise InputError(f"{where}, row {line}", f"cell {get_column_letter(i + 1)}{line}",
                                 f"a value only under a column named in row {top}", got=repr(value))
        values = {h: _cell(v) for h, v in zip(header, cells) if h is not None and v is not None}
        if values:
            out.append((line, values))
    return out


def load_particulars_sheet(path: str | Path) -> Vessel:
    """Read a particulars workbook into a checked :class:`Vessel`."""
    source = str(path)
    sheets = read_sheets(path)
    for name in ("vessel", "units", *CHILD_SHEETS):
        if name not in sheets:
            raise InputError(source, "sheet", f"a sheet named {name!r} (kit template particulars writes them)", got="none")
    places: dict[str, tuple[str, int]] = {}  # path in the document -> (sheet, row)
    vessel: dict[str, Any] = {}
    given: dict[str, int] = {}  # field -> its row
    for line, values in _records(source, "vessel", sheets["vessel"], ("field", "value")):
        field = values.get("field")
        if field not in VESSEL_FIELDS:
            raise InputError(f"{source}, sheet vessel, row {line}", "column field", "one of " + ", ".join(VESSEL_FIELDS), got=repr(field))
        if field in given:
            raise InputError(f"{source}, sheet vessel, row {line}", "column field", f"each field on one row (row {given[field]} gives {field})",
                             got=repr(field))
        given[field] = line
        if "value" in values:
            vessel[field] = values["value"]
            places[f"vessel.{field}" if field != "company" else "company.name"] = ("vessel", line)
    document: dict[str, Any] = {"vessel": vessel}
    if "company" in vessel:
        document["company"] = {"name": vessel.pop("company")}
    units: list[dict[str, Any]] = []
    by_id: dict[Any, int] = {}
    for line, values in _records(source, "units", sheets["units"], UNIT_SHEET_COLUMNS):
        places[f"unit[{len(units)}]"] = ("units", line)
        rudder = {name: values.pop(column) for column, name in RUDDER_COLUMNS.items() if column in values}
        if rudder:
            values["rudder"] = rudder
        by_id.setdefault(values.get("id"), len(units))
        units.append(values)
    document["unit"] = units
    for name, (array, columns) in CHILD_SHEETS.items():
        for line, values in _records(source, name, sheets[name], ("unit", *columns)):
            owner = values.pop("unit", None)
            if owner not in by_id:
                raise InputError(f"{source}, sheet {name}, row {line}", "column unit", "the id of a unit on the units sheet", got=repr(owner))
            items = units[by_id[owner]].setdefault(array, [])
            places[f"unit[{by_id[owner]}].{array}[{len(items)}]"] = (name, line)
            items.append(values)
    try:
        return vessel_from_dict(document, source)
    except InputError as exc:
        raise _located(exc, source, places) from None


def _column(field: str) -> str:
    """The units sheet's column of a unit's field: ``rudder.area`` is in ``rudder_area``."""
    if field == "rudder":
        return "rudder_*"
    return field.replace("rudder.", "rudder_", 1) if field.startswith("rudder.") else field


def _located(exc: InputError, source: str, places: dict[str, tuple[str, int]]) -> InputError:
    """Turn ``unit[0].filter[1].elements`` into ``sheet filters, row 3``, ``column elements``."""
    field = exc.field
    if field in places:  # vessel sheet: the field is a row, its value sits in column value
        sheet, line = places[field]
        return InputError(f"{source}, sheet {sheet}, row {line}", "column value", exc.expected, exc.got)
    for cut in reversed([m.start() for m in re.finditer(r"[.\[]", field)]):
        prefix = field[:cut]
        if prefix in places:
            sheet, line = places[prefix]
            return InputError(f"{source}, sheet {sheet}, row {line}", f"column {_column(field[cut:].lstrip('.'))}",
                              exc.expected, exc.got)
    sheet = {"vessel": "vessel", "company": "vessel", "unit": "units"}.get(re.split(r"[.\[]", field)[0], "")
    where = f"{source}, sheet {sheet}" if sheet else source
    return InputError(where, field, exc.expected, exc.got)
