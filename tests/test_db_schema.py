# SPDX-License-Identifier: MIT
"""Schema and migrations on SQLite and PostgreSQL: the head schema equals the tables, an old
database upgrades with every row intact, and the database itself refuses bad rows."""

from __future__ import annotations

import datetime as dt

import pytest
from alembic.autogenerate import compare_metadata
from alembic.runtime.migration import MigrationContext
from sqlalchemy import MetaData, delete, insert, select, text, update
from sqlalchemy.exc import IntegrityError

from catalog_schema import core_tables
from catalog_schema.engine import make_engine
from catalog_schema.errors import SchemaVersionError
from catalog_schema.migrate import current, head, require_current, upgrade
from catalog_schema.render_core import TARGET, render
from catalog_schema.tables import (DEFAULT_LOCATION, ActuatorRow, PartRow, RudderRow, SQLModel, StockRow, UnitRow,
                                   VesselRow)
from db_support import db_url, engine  # noqa: F401  (fixtures)
from kit.store.policy_store import policy_in_force


def test_fresh_database_reaches_the_tables_schema(db_url):
    eng = make_engine(db_url)
    assert upgrade(eng) == (None, head())
    with eng.connect() as conn:
        for metadata in (SQLModel.metadata, core_tables.metadata):  # the commands' Core tables too
            diff = compare_metadata(MigrationContext.configure(conn, opts={"compare_type": True}), metadata)
            assert diff == []
    eng.dispose()


def test_core_tables_are_rendered_from_the_current_sqlmodel_tables():
    assert TARGET.read_text(encoding="utf-8") == render(SQLModel.metadata), "run: python -m catalog_schema.render_core"


def _described(metadata: MetaData) -> dict:
    """Everything about each table that a statement or the DDL depends on, as plain values."""
    from sqlalchemy.dialects import postgresql, sqlite

    def name(thing) -> str:
        return str(thing.name)

    out = {}
    for table in metadata.sorted_tables:
        out[table.name] = {
            "columns": [(c.name, c.type.compile(dialect=sqlite.dialect()), c.type.compile(dialect=postgresql.dialect()),
                         c.nullable, c.primary_key, c.autoincrement, None if c.default is None else c.default.arg,
                         None if c.server_default is None else str(c.server_default.arg)) for c in table.columns],
            "primary key": (name(table.primary_key), [c.name for c in table.primary_key.columns]),
            "foreign keys": sorted((name(f), [c.name for c in f.columns], [e.target_fullname for e in f.elements], f.ondelete)
                                   for f in table.foreign_key_constraints),
            "constraints": sorted((type(c).__name__, name(c), [col.name for col in getattr(c, "columns", [])],
                                   str(getattr(c, "sqltext", ""))) for c in table.constraints),
            "indexes": sorted((name(i), [c.name for c in i.columns], i.unique) for i in table.indexes),
        }
    return out


def test_core_tables_describe_the_same_schema_as_the_sqlmodel_tables():
    assert _described(core_tables.metadata) == _described(SQLModel.metadata)


def _fill_revision_0001(conn) -> dict[str, list[dict]]:
    rows = {
        "companies": [{"id": 1, "name": "Brackwater Test Shipping"}],
        "vessels": [{"id": "V1", "name": "One", "ship_type": "cargo", "gross_tonnage": 5000.0, "company_id": 1, "source": "v1.toml"},
                    {"id": "V2", "name": "Two", "ship_type": "tanker", "gross_tonnage": 30000.5, "company_id": None, "source": None}],
        "units": [{"id": 7, "vessel_id": "V1", "ref": "SG1", "seq": 0, "service": "steering", "actuator": "ram", "count": 2,
                   "working_pressure": 16e6, "fluid_category": "HM", "fluid_grade": 46, "max_rudder_angle": 0.61, "isolation_valves": True}],
        "actuators": [{"unit_id": 7, "ram_diameter": 0.28, "bore": None, "rod": None, "stroke": 0.9, "tiller_radius": 0.6,
                       "vanes": None, "vane_height": None, "housing_bore": None, "hub_diameter": None, "stock_diameter": None}],
        "power_units": [{"unit_id": 7, "pumps": 2, "pump_flow": 0.002, "reservoir": 0.3, "system_oil": None,
                         "oil_leakage": 0.0, "pump_model": None, "valve_blocks": 1}],
        "filter_positions": [{"unit_id": 7, "seq": 0, "position": "return", "elements": 1, "change_interval": 7.2e6,
                              "duty_hours_per_day": 24.0, "element_ref": None}],
        "parts": [{"id": 3, "key": "o_ring:id=236:cs=5.3:nbr", "kind": "o_ring", "designation": "O-ring ID 236 x CS 5.3", "standard": "ISO 3601-1"}],
        "suppliers": [{"id": 4, "name": "Test Seals"}],
        "catalogue_entries": [{"id": 9, "supplier_id": 4, "supplier_ref": "OR-236", "part_key": "o_ring:id=236:cs=5.3:nbr", "part_id": 3,
                               "description": None, "pack_qty": 10, "price": 12.5, "currency": "EUR", "lead_time_days": 5}],
        "stock": [{"id": 11, "vessel_id": "V1", "part_id": 3, "quantity": 4.0, "counted_on": dt.date(2025, 3, 1)}],
    }
    _insert_as_built(conn, rows)
    return rows


def _insert_as_built(conn, rows: dict[str, list[dict]]) -> None:
    old = MetaData()
    old.reflect(conn)  # the tables as the old revision built them, not as the head models are
    for name, values in rows.items():
        conn.execute(insert(old.tables[name]).values(values))


def _fill_revision_0002(conn) -> dict[str, list[dict]]:
    """Policy rows as revision 0002 stored them: a name and dates, no content."""
    rows = {"spares_policies": [
        {"id": 1, "company_id": 1, "vessel_id": None, "name": "fleet-2025", "cover_days": 90,
         "in_force_from": dt.date(2025, 1, 1), "note": "approved by the technical manager"},
        {"id": 2, "company_id": None, "vessel_id": "V1", "name": "long-voyage", "cover_days": 180,
         "in_force_from": dt.date(2025, 6, 1), "note": None}]}
    _insert_as_built(conn, rows)
    return rows


def _fill_revision_0004(conn) -> dict[str, list[dict]]:
    """Rows only revision 0004 could hold: a gas carrier, a rotary vane gear with its vane angle, a
    cylinder gear and a deck unit with pressures; none says where its rudder carrier is."""
    rows = {
        "vessels": [{"id": "V3", "name": "Three", "ship_type": "gas_carrier", "gross_tonnage": 12000.0, "company_id": 1,
                     "source": "v3.toml"}],
        "units": [{"id": 8, "vessel_id": "V3", "ref": "SG1", "seq": 0, "service": "steering", "actuator": "rotary_vane",
                   "count": 1, "working_pressure": 8e6, "fluid_category": "HM", "fluid_grade": 46, "max_rudder_angle": 0.61,
                   "isolation_valves": False},
                  {"id": 9, "vessel_id": "V3", "ref": "SG2", "seq": 1, "service": "steering", "actuator": "cylinder",
                   "count": 2, "working_pressure": 12.5e6, "fluid_category": "HM", "fluid_grade": 46, "max_rudder_angle": 0.61,
                   "isolation_valves": False},
                  {"id": 10, "vessel_id": "V3", "ref": "HC1", "seq": 2, "service": "hatch covers", "actuator": "cylinder",
                   "count": 4, "working_pressure": 20e6, "fluid_category": "HM", "fluid_grade": 32, "max_rudder_angle": None,
                   "isolation_valves": False}],
        "actuators": [{"unit_id": 8, "ram_diameter": None, "bore": None, "rod": None, "stroke": None, "tiller_radius": None,
                       "vanes": 3, "vane_height": 0.8, "housing_bore": 1.1, "hub_diameter": 0.62, "stock_diameter": 0.45,
                       "vane_angle": 0.49},
                      {"unit_id": 9, "ram_diameter": None, "bore": 0.2, "rod": 0.14, "stroke": 0.45, "tiller_radius": 0.28,
                       "vanes": None, "vane_height": None, "housing_bore": None, "hub_diameter": None, "stock_diameter": 0.14,
                       "vane_angle": None},
                      {"unit_id": 10, "ram_diameter": None, "bore": 0.1, "rod": 0.06, "stroke": 1.2, "tiller_radius": None,
                       "vanes": None, "vane_height": None, "housing_bore": None, "hub_diameter": None, "stock_diameter": None,
                       "vane_angle": None}],
        "power_units": [{"unit_id": u, "pumps": 2, "pump_flow": 0.001, "reservoir": 0.2, "system_oil": None, "oil_leakage": None,
                         "pump_model": None, "valve_blocks": 1, "max_working_pressure": mwp, "design_pressure": dp}
                        for u, mwp, dp in ((8, 7e6, 10e6), (9, None, None), (10, 18e6, 25e6))],
    }
    _insert_as_built(conn, rows)
    return rows


def _added_later(table: str, row: dict) -> dict:
    """What a row written before a column existed holds in it after the upgrade."""
    if table == "stock":
        return {"location": DEFAULT_LOCATION}  # revision 0002
    if table == "units":  # revision 0005: a ram or cylinder steering gear's carrier can only be separate
        separate = row["service"] == "steering" and row["actuator"] in ("ram", "cylinder")
        return {"rudder_carrier": "separate" if separate else None}
    if table == "suppliers":
        return {"preferred": False}  # revision 0006: no supplier preferred until someone says so
    return {}  # every other added column: null, the particulars did not say


def test_upgrade_from_first_revision_keeps_every_row(db_url):
    eng = make_engine(db_url)
    upgrade(eng, "0001")
    with eng.begin() as conn:
        before = _fill_revision_0001(conn)
    with pytest.raises(SchemaVersionError, match=f"schema is at revision 0001, this kit needs {head()}; run: kit db upgrade"):
        require_current(eng)
    assert upgrade(eng, "0002") == ("0001", "0002")
    with eng.begin() as conn:
        before.update(_fill_revision_0002(conn))
    with pytest.raises(SchemaVersionError, match=f"schema is at revision 0002, this kit needs {head()}; run: kit db upgrade"):
        require_current(eng)
    assert upgrade(eng, "0004") == ("0002", "0004")
    with eng.begin() as conn:
        for name, rows in _fill_revision_0004(conn).items():
            before.setdefault(name, []).extend(rows)
    assert upgrade(eng) == ("0004", head())
    with eng.connect() as conn:  # an old database reaches the same schema as a fresh one
        assert compare_metadata(MigrationContext.configure(conn, opts={"compare_type": True}), SQLModel.metadata) == []
    with eng.connect() as conn:
        for name, rows in before.items():
            table = SQLModel.metadata.tables[name]
            found = [r._asdict() for r in conn.execute(table.select().order_by(*table.primary_key.columns))]
            assert len(found) == len(rows), name
            for got, row in zip(found, rows):
                later = {column: got.pop(column) for column in set(got) - set(row)}
                assert later == dict.fromkeys(later) | _added_later(name, row), (name, row)
            assert found == rows, name
        assert conn.execute(SQLModel.metadata.tables["rudders"].select()).all() == []
    with eng.connect() as conn:  # and the rows still say which policy is in force
        found = policy_in_force(conn, "V1", dt.date(2025, 7, 1))
    assert (found.name, found.scope, found.content, found.policy().name) == ("long-voyage", "vessel", None, "kit default")
    # The new natural key lets the same part be kept in a second place.
    with eng.begin() as conn:
        conn.execute(insert(StockRow.__table__).values(vessel_id="V1", part_id=3, location="steering gear room", quantity=2.0))
    # Revision 0004: the ship types SOLAS II-1/29.16.1 names beside tankers are accepted, others still refused.
    with eng.begin() as conn:
        conn.execute(insert(VesselRow.__table__).values(id="V9", name="Nine", ship_type="gas_carrier", gross_tonnage=12000.0))
    with pytest.raises(IntegrityError):
        with eng.begin() as conn:
            conn.execute(insert(VesselRow.__table__).values(id="V10", name="Ten", ship_type="yacht", gross_tonnage=100.0))
    # Revision 0005 rebuilt units and actuators on SQLite: their keys still cascade a unit's rows away.
    with eng.begin() as conn:
        conn.execute(insert(RudderRow.__table__).values(unit_id=7, **RUDDER))
        conn.execute(delete(UnitRow.__table__).where(UnitRow.__table__.c.id == 7))
    with eng.connect() as conn:
        for name in ("actuators", "power_units", "filter_positions", "rudders"):
            table = SQLModel.metadata.tables[name]
            assert conn.execute(table.select().where(table.c.unit_id == 7)).all() == [], name
    # Revision 0008: running hours since a filter change are never negative, in the particulars or a count.
    counts = SQLModel.metadata.tables["filter_counts"]
    with pytest.raises(IntegrityError):
        with eng.begin() as conn:
            conn.execute(insert(counts).values(vessel_id="V1", unit_ref="SG1", position="return", run_since_change=-1.0,
                                               counted_on=dt.date(2026, 1, 1)))
    with pytest.raises(IntegrityError):
        with eng.begin() as conn:
            unit = conn.execute(select(UnitRow.__table__.c.id)).scalars().first()
            conn.execute(insert(SQLModel.metadata.tables["filter_positions"]).values(
                unit_id=unit, seq=99, position="return", elements=1, change_interval=7.2e6, run_since_change=-1.0))
    eng.dispose()


# A rudder as the particulars give one, in SI: 12 m^2, 4 m high, 2.4 m^2 forward, 14 kn ahead.
RUDDER = {"area": 12.0, "mean_height": 4.0, "area_forward": 2.4, "ahead_speed": 7.2, "astern_speed": None,
          "profile": "naca", "position": "propeller_jet"}


def _steering_units(conn) -> dict[str, int]:
    """A ram and a rotary vane steering unit, by actuator -> unit id."""
    conn.execute(insert(VesselRow.__table__).values(id="V1", name="One", ship_type="cargo", gross_tonnage=100.0))
    ids = {}
    for seq, actuator in enumerate(("ram", "rotary_vane")):
        ids[actuator] = conn.execute(insert(UnitRow.__table__).values(
            vessel_id="V1", ref=f"SG{seq}", seq=seq, service="steering", actuator=actuator, count=2 if actuator == "ram" else 1,
            working_pressure=16e6, fluid_category="HM", fluid_grade=46).returning(UnitRow.__table__.c.id)).scalar_one()
    return ids


@pytest.mark.parametrize("bad", [
    {"area": 0.0},                          # CHECK area > 0
    {"mean_height": -4.0},                  # CHECK mean_height > 0
    {"area_forward": -0.1},                 # CHECK area_forward >= 0
    {"area_forward": 6.0},                  # CHECK area_forward < area / 2 (as kit.engine.particulars refuses it)
    {"ahead_speed": 0.0},                   # CHECK ahead_speed > 0
    {"astern_speed": 0.0},                  # CHECK astern_speed > 0 when given
    {"profile": "wedge"},                   # CHECK profile in the set kit.engine.rudder knows
    {"position": "in_front"},               # CHECK position in the set kit.engine.rudder knows
    {"unit_id": 10_000},                    # foreign key: no such unit
], ids=["area", "height", "forward-negative", "forward-half", "ahead", "astern", "profile", "position", "foreign-key"])
def test_database_refuses_bad_rudder_rows(engine, bad):
    with engine.begin() as conn:
        ids = _steering_units(conn)
    with pytest.raises(IntegrityError):
        with engine.begin() as conn:
            conn.execute(insert(RudderRow.__table__).values(**{"unit_id": ids["ram"], **RUDDER, **bad}))


def test_database_keeps_every_profile_and_position_kit_knows_and_one_rudder_a_unit(engine):
    from kit.engine.rudder import POSITION_K3, PROFILE_K2

    with engine.begin() as conn:
        ids = _steering_units(conn)
    for profile, position in zip(PROFILE_K2, [*POSITION_K3] * len(PROFILE_K2)):
        with engine.begin() as conn:
            conn.execute(insert(RudderRow.__table__).values(unit_id=ids["ram"], **{**RUDDER, "profile": profile, "position": position}))
            conn.execute(delete(RudderRow.__table__))
    with engine.begin() as conn:
        conn.execute(insert(RudderRow.__table__).values(unit_id=ids["ram"], **RUDDER))
    with pytest.raises(IntegrityError):  # primary key: one rudder a unit
        with engine.begin() as conn:
            conn.execute(insert(RudderRow.__table__).values(unit_id=ids["ram"], **RUDDER))


@pytest.mark.parametrize(("actuator", "carrier", "stored"), [
    ("rotary_vane", "in_actuator", True),
    ("rotary_vane", "separate", True),
    ("ram", "separate", True),
    ("ram", "in_actuator", False),        # a ram gear has no housing to carry the rudder in
    ("rotary_vane", "in_the_hull", False),
])
def test_database_checks_where_the_rudder_carrier_is(engine, actuator, carrier, stored):
    with engine.begin() as conn:
        uid = _steering_units(conn)[actuator]
    change = update(UnitRow.__table__).where(UnitRow.__table__.c.id == uid).values(rudder_carrier=carrier)
    if stored:
        with engine.begin() as conn:
            conn.execute(change)
        return
    with pytest.raises(IntegrityError):
        with engine.begin() as conn:
            conn.execute(change)


def _set_geometry(engine, **values) -> None:
    with engine.begin() as conn:
        uid = _steering_units(conn)["ram"]
        conn.execute(insert(ActuatorRow.__table__).values(unit_id=uid, ram_diameter=0.2, stroke=0.8, tiller_radius=0.5, **values))


@pytest.mark.parametrize("column", ["trunnion_distance", "gland_spigot_bore"])
def test_database_refuses_a_geometry_length_that_is_not_positive(engine, column):
    with pytest.raises(IntegrityError):
        _set_geometry(engine, **{column: 0.0})


@pytest.mark.parametrize("bad", [
    {"quantity": -1.0},                      # CHECK quantity >= 0
    {"vessel_id": "NO-SUCH-VESSEL"},         # foreign key
    {"location": "store"},                   # unique (vessel, part, location): second row
], ids=["negative", "foreign-key", "duplicate"])
def test_database_refuses_bad_stock_rows(engine, bad):
    with engine.begin() as conn:
        conn.execute(insert(VesselRow.__table__).values(id="V1", name="One", ship_type="cargo", gross_tonnage=100.0))
        pid = conn.execute(insert(PartRow.__table__).values(key="spare:x", kind="spare", designation="x")
                           .returning(PartRow.__table__.c.id)).scalar_one()
        conn.execute(insert(StockRow.__table__).values(vessel_id="V1", part_id=pid, location="store", quantity=1.0))
    row = {"vessel_id": "V1", "part_id": pid, "location": "other", "quantity": 1.0, **bad}
    with pytest.raises(IntegrityError):
        with engine.begin() as conn:
            conn.execute(insert(StockRow.__table__).values(**row))


def test_part_key_is_unique(engine):
    parts = PartRow.__table__
    with engine.begin() as conn:
        conn.execute(insert(parts).values(key="oil:hm 46", kind="oil", designation="hydraulic oil HM 46"))
    with pytest.raises(IntegrityError):
        with engine.begin() as conn:
            conn.execute(insert(parts).values(key="oil:hm 46", kind="oil", designation="again"))


def test_sqlite_is_shared_safely(tmp_path):
    eng = make_engine(f"sqlite:///{tmp_path / 'f.sqlite'}")
    with eng.connect() as conn:
        assert conn.execute(text("PRAGMA journal_mode")).scalar() == "wal"
        assert conn.execute(text("PRAGMA busy_timeout")).scalar() == 30000
        assert conn.execute(text("PRAGMA foreign_keys")).scalar() == 1
    assert current(eng) is None
    eng.dispose()


def test_check_constraints_are_in_the_database_as_named_in_the_tables(engine):
    from sqlalchemy import CheckConstraint, inspect

    found = inspect(engine)
    for table in SQLModel.metadata.sorted_tables:
        declared = {c.name for c in table.constraints if isinstance(c, CheckConstraint)}
        assert {c["name"] for c in found.get_check_constraints(table.name)} == declared, table.name


def test_head_constant_is_alembics_head():
    # the one-query schema check compares with HEAD; alembic's own reading of migrations/ must agree
    from catalog_schema.migrate import HEAD

    assert HEAD == head()
