# SPDX-License-Identifier: MIT
"""Vessels and their units in the fleet database: save (idempotent upsert) and read back.

:func:`save_vessels` writes :class:`kit.engine.particulars.Vessel` objects keyed by the vessel id and,
within a vessel, the unit id: loading the same particulars again rewrites identical rows, a unit
dropped from the file is dropped from the database, and stock of the vessel is left alone.
:func:`read_vessels` rebuilds the same dataclasses, so a round trip compares equal.
"""

from __future__ import annotations

from dataclasses import replace
from typing import Iterable

from sqlalchemy import bindparam, delete, insert, select, update
from sqlalchemy.engine import Connection

from catalog_schema.core_tables import (
    ACTUATORS,
    COMPANIES,
    FILTER_COUNTS,
    FILTER_POSITIONS,
    HOSES,
    PIPES,
    POWER_UNITS,
    RUDDERS,
    SOLENOID_COILS,
    STATED_HOUSINGS,
    UNITS,
    VESSELS,
)
from catalog_schema.refusals import located
from catalog_schema.sql import in_batches, upsert
from kit.errors import UnknownVesselError
from kit.store.vessel_ids import refuse_case_twins
from kit.engine.particulars import (
    CylinderGeometry,
    FilterPosition,
    Fluid,
    Hose,
    Pipe,
    RamGeometry,
    SolenoidCoils,
    StatedHousing,
    Unit,
    VaneGeometry,
    Vessel,
)
from kit.engine.rudder import Rudder

# Child tables of a unit: table -> (rows of a unit as dicts, a row back to its dataclass).
_CHILDREN = {
    "filters": (FILTER_POSITIONS, lambda u: [
        {"position": f.position, "elements": f.elements, "change_interval": f.change_interval,
         "duty_hours_per_day": f.duty_hours_per_day, "element_ref": f.element_ref,
         "run_since_change": f.run_since_change, "run_read_on": f.run_read_on} for f in u.filters],
        lambda r: FilterPosition(r.position, r.elements, r.change_interval, r.duty_hours_per_day, r.element_ref,
                                 r.run_since_change, r.run_read_on)),
    "pipes": (PIPES, lambda u: [{"outside_diameter": p.outside_diameter, "wall": p.wall, "length": p.length} for p in u.pipes],
              lambda r: Pipe(r.outside_diameter, r.wall, r.length)),
    "housings": (STATED_HOUSINGS, lambda u: [{"role": h.role, "d_inner": h.d, "d_outer": h.D, "length": h.L} for h in u.housings],
                 lambda r: StatedHousing(r.role, r.d_inner, r.d_outer, r.length)),
    "solenoids": (SOLENOID_COILS, lambda u: [{"voltage": s.voltage, "count": s.count} for s in u.solenoids],
                  lambda r: SolenoidCoils(r.voltage, r.count)),
    "hoses": (HOSES, lambda u: [{"bore": h.bore, "count": h.count} for h in u.hoses], lambda r: Hose(r.bore, r.count)),
}

_GEOMETRY_COLUMNS = ("ram_diameter", "bore", "rod", "stroke", "tiller_radius", "vanes", "vane_height",
                     "housing_bore", "hub_diameter", "stock_diameter", "vane_angle", "trunnion_distance",
                     "gland_spigot_bore")
_RUDDER_COLUMNS = ("area", "mean_height", "area_forward", "ahead_speed", "profile", "position", "astern_speed")


def company_id(conn: Connection, name: str | None) -> int | None:
    """The id of the company called ``name``, added if new (None for no company)."""
    if name is None:
        return None
    conn.execute(upsert(conn, COMPANIES, ["name"]), [{"name": name}])
    return conn.execute(select(COMPANIES.c.id).where(COMPANIES.c.name == name)).scalar_one()


def vessel_company(conn: Connection, vessel_id: str) -> int | None:
    """The id of the vessel's company (None: it has none); :class:`UnknownVesselError` when the
    database holds no such vessel. The one place that asks whether a vessel exists."""
    row = conn.execute(select(VESSELS.c.company_id).where(VESSELS.c.id == vessel_id)).first()
    if row is None:
        raise UnknownVesselError(vessel_id)
    return row.company_id


def _unit_row(u: Unit, seq: int) -> dict:
    return {
        "ref": u.id, "seq": seq, "service": u.service, "actuator": u.actuator, "count": u.count,
        "working_pressure": u.working_pressure, "fluid_category": u.fluid.category, "fluid_grade": u.fluid.grade,
        "max_rudder_angle": u.max_rudder_angle, "isolation_valves": u.isolation_valves, "rudder_carrier": u.rudder_carrier,
        "maker": u.maker, "model": u.model,
    }


def _geometry_row(u: Unit) -> dict:
    g = u.geometry
    row = dict.fromkeys(_GEOMETRY_COLUMNS)
    if isinstance(g, RamGeometry):
        row.update(ram_diameter=g.ram_diameter, stroke=g.stroke, tiller_radius=g.tiller_radius,
                   gland_spigot_bore=g.gland_spigot_bore)
    elif isinstance(g, CylinderGeometry):
        row.update(bore=g.bore, rod=g.rod, stroke=g.stroke, tiller_radius=g.tiller_radius,
                   trunnion_distance=g.trunnion_distance)
    else:
        row.update(vanes=g.vanes, vane_height=g.vane_height, housing_bore=g.housing_bore,
                   hub_diameter=g.hub_diameter, vane_angle=g.vane_angle)
    row["stock_diameter"] = u.stock_diameter  # a rotary vane's is its geometry's too
    return row


def _power_row(u: Unit) -> dict:
    return {"pumps": u.pumps, "pump_flow": u.pump_flow, "reservoir": u.reservoir, "system_oil": u.system_oil,
            "oil_leakage": u.oil_leakage, "pump_model": u.pump_model, "valve_blocks": u.valve_blocks,
            "pump_maker": u.pump_maker, "valve_maker": u.valve_maker, "valve_model": u.valve_model,
            "max_working_pressure": u.max_working_pressure, "design_pressure": u.design_pressure}


def save_vessels(conn: Connection, vessels: Iterable[Vessel]) -> list[str]:
    """Save every vessel in the caller's transaction; return their ids.

    The fleet is written a table at a time (one statement per table and chunk of ids, not a
    handful per vessel and unit), so a thousand vessels are a few dozen round trips. A vessel id
    given twice is saved as its last occurrence, as saving them one after the other would.
    """
    given = list(vessels)
    ids = [v.id for v in given]
    latest = list({v.id: v for v in given}.values())
    if not latest:
        return ids
    refuse_case_twins(conn, latest)
    companies = {name: company_id(conn, name) for name in dict.fromkeys(v.company for v in given if v.company is not None)}
    rows = [{"id": v.id, "name": v.name, "ship_type": v.ship_type, "gross_tonnage": v.gross_tonnage,
             "company_id": companies.get(v.company), "source": v.source or None} for v in latest]
    located(conn, VESSELS, (), rows, lambda c, some: c.execute(upsert(c, VESSELS, ["id"], update=[k for k in rows[0] if k != "id"]), list(some)),
            lambda i: latest[i].source or f"vessel {latest[i].id}")

    def unit_ids_of(vessel_ids: list[str]) -> dict[tuple[str, str], int]:
        found: dict[tuple[str, str], int] = {}
        for chunk in in_batches(conn, vessel_ids):
            query = select(UNITS.c.vessel_id, UNITS.c.ref, UNITS.c.id).where(UNITS.c.vessel_id.in_(chunk))
            found.update({(vid, ref): uid for vid, ref, uid in conn.execute(query)})
        return found

    vessel_ids_ = [v.id for v in latest]
    existing = unit_ids_of(vessel_ids_)
    wanted = {(v.id, u.id) for v in latest for u in v.units}
    gone = [uid for key, uid in existing.items() if key not in wanted]
    for chunk in in_batches(conn, gone):
        conn.execute(delete(UNITS).where(UNITS.c.id.in_(chunk)))
    changed, added = [], []  # (where, row): the database's refusal of a row names its file and unit
    for v in latest:
        for seq, unit in enumerate(v.units):
            values = _unit_row(unit, seq)
            where = f"{v.source or 'vessel ' + v.id}, unit {unit.id}"
            if (v.id, unit.id) in existing:
                changed.append((where, {"uid": existing[(v.id, unit.id)], **{f"new_{k}": x for k, x in values.items()}}))
            else:
                added.append((where, {"vessel_id": v.id, **values}))
    if changed:
        statement = (update(UNITS).where(UNITS.c.id == bindparam("uid"))
                     .values({k.removeprefix("new_"): bindparam(k) for k in changed[0][1] if k != "uid"}))
        _located(conn, UNITS, changed, statement, {f"new_{c}": f"column {c}" for c in UNITS.c.keys()})
    _located(conn, UNITS, added, insert(UNITS))
    unit_id = unit_ids_of(vessel_ids_)
    units = [(unit_id[(v.id, u.id)], u, f"{v.source or 'vessel ' + v.id}, unit {u.id}") for v in latest for u in v.units]

    tables = [ACTUATORS, POWER_UNITS, RUDDERS] + [t for t, _, _ in _CHILDREN.values()]
    for chunk in in_batches(conn, [uid for uid, _, _ in units]):
        for table in tables:
            conn.execute(delete(table).where(table.c.unit_id.in_(chunk)))
    _located(conn, ACTUATORS, [(w, {"unit_id": uid, **_geometry_row(u)}) for uid, u, w in units], insert(ACTUATORS))
    _located(conn, POWER_UNITS, [(w, {"unit_id": uid, **_power_row(u)}) for uid, u, w in units], insert(POWER_UNITS))
    rudders = [(w, {"unit_id": uid, **{c: getattr(u.rudder, c) for c in _RUDDER_COLUMNS}}) for uid, u, w in units if u.rudder]
    _located(conn, RUDDERS, rudders, insert(RUDDERS))
    for table, rows_of, _ in _CHILDREN.values():
        child_rows = [(w, {"unit_id": uid, "seq": i, **r}) for uid, u, w in units for i, r in enumerate(rows_of(u))]
        _located(conn, table, child_rows, insert(table))
    return ids


def _located(conn: Connection, table, rows: list[tuple[str, dict]], statement, fields: dict[str, str] | None = None) -> None:
    """Run ``statement`` for the rows (each with the file and unit it came from), naming the one
    the database refuses (:func:`catalog_schema.refusals.located`)."""
    located(conn, table, (), [r for _, r in rows], lambda c, some: c.execute(statement, list(some)),
            lambda i: rows[i][0], fields)


def filter_counts(conn: Connection, vessel_ids: list[str] | None) -> dict[tuple[str, str, str], tuple[float, object]]:
    """(vessel, unit, position) -> (running time since the change in s, the day counted), as
    counts on board recorded them (all vessels, or those of ``vessel_ids``)."""
    query = select(FILTER_COUNTS)
    found = {}
    for chunk in ([None] if vessel_ids is None else in_batches(conn, vessel_ids)):
        rows = conn.execute(query if chunk is None else query.where(FILTER_COUNTS.c.vessel_id.in_(chunk)))
        found.update({(r.vessel_id, r.unit_ref, r.position): (r.run_since_change, r.counted_on) for r in rows})
    return found


def _newer_count(f: FilterPosition, count: tuple | None) -> FilterPosition:
    """``f`` with the count's running time when the count is newer than the particulars' figure
    (or the particulars give none, or give it undated)."""
    if count is None:
        return f
    run, day = count
    if f.run_since_change is not None and f.run_read_on is not None and f.run_read_on >= day:
        return f
    return replace(f, run_since_change=run, run_read_on=day)


def save_filter_counts(conn: Connection, vessel_id: str, counts: list[tuple[str, str, float, object]]) -> None:
    """Record (unit, position, running time since the change in s, day counted) of ``vessel_id``,
    replacing an older count of the same position (a count older than the one recorded is kept out)."""
    rows = [{"vessel_id": vessel_id, "unit_ref": unit, "position": position, "run_since_change": run, "counted_on": day}
            for unit, position, run, day in counts]
    if not rows:
        return
    held = filter_counts(conn, [vessel_id])
    newer = [r for r in rows if (k := (vessel_id, r["unit_ref"], r["position"])) not in held or held[k][1] <= r["counted_on"]]
    if newer:
        conn.execute(upsert(conn, FILTER_COUNTS, ["vessel_id", "unit_ref", "position"], update=["run_since_change", "counted_on"]),
                     newer)


def _geometry(actuator: str, g) -> RamGeometry | CylinderGeometry | VaneGeometry:
    if actuator == "ram":
        return RamGeometry(g.ram_diameter, g.stroke, g.tiller_radius, g.gland_spigot_bore)
    if actuator == "cylinder":
        return CylinderGeometry(g.bore, g.rod, g.stroke, g.tiller_radius, g.trunnion_distance)
    return VaneGeometry(g.vanes, g.vane_height, g.housing_bore, g.hub_diameter, g.stock_diameter, g.vane_angle)


def _rudder(rows: list | None) -> Rudder | None:
    return Rudder(**{c: getattr(rows[0], c) for c in _RUDDER_COLUMNS}) if rows else None


def read_vessels(conn: Connection, ids: Iterable[str] | None = None) -> list[Vessel]:
    """Rebuild vessels (all, or those in ``ids``) from the database, sorted by id."""
    query = select(VESSELS, COMPANIES.c.name.label("company")).outerjoin(COMPANIES, VESSELS.c.company_id == COMPANIES.c.id)
    if ids is not None:
        query = query.where(VESSELS.c.id.in_(list(ids)))
    vessel_rows = conn.execute(query.order_by(VESSELS.c.id)).all()
    # The whole fleet is read without id lists: a statement with thousands of parameters costs
    # more to send and plan than the few rows of vessels not asked for would.
    units_query = select(UNITS).order_by(UNITS.c.vessel_id, UNITS.c.seq)
    if ids is not None:
        units_query = units_query.where(UNITS.c.vessel_id.in_([v.id for v in vessel_rows]))
    unit_rows = conn.execute(units_query).all()
    uids = None if ids is None else [u.id for u in unit_rows]

    def by_unit(table) -> dict[int, list]:
        found: dict[int, list] = {}
        query = select(table).order_by(table.c.unit_id, *([table.c.seq] if "seq" in table.c else []))
        for r in conn.execute(query if uids is None else query.where(table.c.unit_id.in_(uids))).all():
            found.setdefault(r.unit_id, []).append(r)
        return found

    geometry, power, rudders = by_unit(ACTUATORS), by_unit(POWER_UNITS), by_unit(RUDDERS)
    children = {name: (by_unit(table), back) for name, (table, _, back) in _CHILDREN.items()}
    counts = filter_counts(conn, None if ids is None else [v.id for v in vessel_rows])
    units_of: dict[str, list[Unit]] = {}
    for u in unit_rows:
        p = power[u.id][0]
        units_of.setdefault(u.vessel_id, []).append(Unit(
            id=u.ref, service=u.service, actuator=u.actuator, count=u.count, working_pressure=u.working_pressure,
            fluid=Fluid(u.fluid_category, u.fluid_grade), pumps=p.pumps, pump_flow=p.pump_flow, reservoir=p.reservoir,
            geometry=_geometry(u.actuator, geometry[u.id][0]), max_rudder_angle=u.max_rudder_angle,
            system_oil=p.system_oil, oil_leakage=p.oil_leakage, isolation_valves=bool(u.isolation_valves),
            rudder=_rudder(rudders.get(u.id)), rudder_carrier=u.rudder_carrier,
            pump_model=p.pump_model, valve_blocks=p.valve_blocks, stock_diameter=geometry[u.id][0].stock_diameter,
            max_working_pressure=p.max_working_pressure, design_pressure=p.design_pressure,
            maker=u.maker, model=u.model, pump_maker=p.pump_maker, valve_maker=p.valve_maker, valve_model=p.valve_model,
            **{name: tuple(back(r) for r in rows.get(u.id, [])) for name, (rows, back) in children.items()},
        ))
        last = units_of[u.vessel_id][-1]
        if last.filters and counts:
            units_of[u.vessel_id][-1] = replace(last, filters=tuple(
                _newer_count(f, counts.get((u.vessel_id, u.ref, f.position))) for f in last.filters))
    return [Vessel(v.id, v.name, v.ship_type, v.gross_tonnage, tuple(units_of.get(v.id, ())), v.company, v.source or "")
            for v in vessel_rows]
