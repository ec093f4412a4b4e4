# SPDX-License-Identifier: MIT
"""Base schema: vessels and their units, generic parts, suppliers' catalogues, on-board stock.

Revision ID: 0001
Revises:
"""

import sqlalchemy as sa
from alembic import op

revision = "0001"
down_revision = None
branch_labels = None
depends_on = None


def _unit_child(name: str, *columns: sa.Column, checks: tuple[tuple[str, str], ...] = (), seq: bool = True) -> None:
    """A table hanging off ``units`` (cascade delete), keyed by unit and order in the file."""
    keys = [sa.Column("unit_id", sa.Integer(), nullable=False)]
    if seq:
        keys.append(sa.Column("seq", sa.Integer(), nullable=False))
    op.create_table(
        name,
        *keys,
        *columns,
        sa.PrimaryKeyConstraint(*[c.name for c in keys], name=f"pk_{name}"),
        sa.ForeignKeyConstraint(["unit_id"], ["units.id"], name=f"fk_{name}_unit_id_units", ondelete="CASCADE"),
        *[sa.CheckConstraint(sql, name=op.f(f"ck_{name}_{label}")) for label, sql in checks],
    )


def _float(name: str, nullable: bool = False) -> sa.Column:
    return sa.Column(name, sa.Float(), nullable=nullable)


def _text(name: str, nullable: bool = False) -> sa.Column:
    return sa.Column(name, sa.String(), nullable=nullable)


def _int(name: str, nullable: bool = False) -> sa.Column:
    return sa.Column(name, sa.Integer(), nullable=nullable)


def upgrade() -> None:
    op.create_table(
        "companies",
        sa.Column("id", sa.Integer(), nullable=False),
        _text("name"),
        sa.PrimaryKeyConstraint("id", name="pk_companies"),
        sa.UniqueConstraint("name", name="uq_companies_name"),
    )
    op.create_table(
        "vessels",
        _text("id"), _text("name"), _text("ship_type"), _float("gross_tonnage"),
        _int("company_id", True), _text("source", True),
        sa.PrimaryKeyConstraint("id", name="pk_vessels"),
        sa.ForeignKeyConstraint(["company_id"], ["companies.id"], name="fk_vessels_company_id_companies", ondelete="RESTRICT"),
        sa.CheckConstraint("ship_type IN ('cargo', 'passenger', 'tanker')", name=op.f("ck_vessels_ship_type")),
        sa.CheckConstraint("gross_tonnage >= 1", name=op.f("ck_vessels_gross_tonnage")),
    )
    op.create_table(
        "units",
        sa.Column("id", sa.Integer(), nullable=False),
        _text("vessel_id"), _text("ref"), _int("seq"), _text("service"), _text("actuator"), _int("count"),
        _float("working_pressure"), _text("fluid_category"), _int("fluid_grade"),
        _float("max_rudder_angle", True), sa.Column("isolation_valves", sa.Boolean(), nullable=False),
        sa.PrimaryKeyConstraint("id", name="pk_units"),
        sa.ForeignKeyConstraint(["vessel_id"], ["vessels.id"], name="fk_units_vessel_id_vessels", ondelete="CASCADE"),
        sa.UniqueConstraint("vessel_id", "ref", name="uq_units_vessel_id_ref"),
        sa.CheckConstraint("actuator IN ('ram', 'rotary_vane', 'cylinder')", name=op.f("ck_units_actuator")),
        sa.CheckConstraint("count >= 1", name=op.f("ck_units_count")),
        sa.CheckConstraint("working_pressure > 0", name=op.f("ck_units_working_pressure")),
        sa.CheckConstraint("fluid_grade > 0", name=op.f("ck_units_fluid_grade")),
    )
    _unit_child(
        "actuators",
        *[_float(n, True) for n in ("ram_diameter", "bore", "rod", "stroke", "tiller_radius")],
        _int("vanes", True),
        *[_float(n, True) for n in ("vane_height", "housing_bore", "hub_diameter", "stock_diameter")],
        checks=(("stroke", "stroke IS NULL OR stroke > 0"), ("vanes", "vanes IS NULL OR vanes >= 1")),
        seq=False,
    )
    _unit_child(
        "power_units",
        _int("pumps"), _float("pump_flow"), _float("reservoir"), _float("system_oil", True),
        _float("oil_leakage", True), _text("pump_model", True), _int("valve_blocks"),
        checks=(
            ("pumps", "pumps >= 1"), ("pump_flow", "pump_flow > 0"), ("reservoir", "reservoir > 0"),
            ("system_oil", "system_oil IS NULL OR system_oil > 0"),
            ("oil_leakage", "oil_leakage IS NULL OR oil_leakage >= 0"), ("valve_blocks", "valve_blocks >= 0"),
        ),
        seq=False,
    )
    _unit_child(
        "filter_positions",
        _text("position"), _int("elements"), _float("change_interval"), _float("duty_hours_per_day"),
        _text("element_ref", True),
        checks=(
            ("elements", "elements >= 1"), ("change_interval", "change_interval > 0"),
            ("duty", "duty_hours_per_day >= 0 AND duty_hours_per_day <= 24"),
        ),
    )
    _unit_child("pipes", _float("outside_diameter"), _float("wall"), _float("length"),
                checks=(("sizes", "wall > 0 AND outside_diameter > 2 * wall AND length > 0"),))
    _unit_child("stated_housings", _text("role"), _float("d_inner"), _float("d_outer"), _float("length"),
                checks=(("sizes", "d_inner > 0 AND d_outer > d_inner AND length > 0"),))
    _unit_child("solenoid_coils", _text("voltage"), _int("count"), checks=(("count", "count >= 1"),))
    _unit_child("hoses", _float("bore"), _int("count"), checks=(("sizes", "bore > 0 AND count >= 1"),))
    op.create_table(
        "parts",
        sa.Column("id", sa.Integer(), nullable=False),
        _text("key"), _text("kind"), _text("designation"), _text("standard", True),
        sa.PrimaryKeyConstraint("id", name="pk_parts"),
        sa.UniqueConstraint("key", name="uq_parts_key"),
    )
    op.create_table(
        "suppliers",
        sa.Column("id", sa.Integer(), nullable=False),
        _text("name"),
        sa.PrimaryKeyConstraint("id", name="pk_suppliers"),
        sa.UniqueConstraint("name", name="uq_suppliers_name"),
    )
    op.create_table(
        "catalogue_entries",
        sa.Column("id", sa.Integer(), nullable=False),
        _int("supplier_id"), _text("supplier_ref"), _text("part_key"), _int("part_id", True),
        _text("description", True), _int("pack_qty"), _float("price", True), _text("currency"),
        _int("lead_time_days", True),
        sa.PrimaryKeyConstraint("id", name="pk_catalogue_entries"),
        sa.ForeignKeyConstraint(["supplier_id"], ["suppliers.id"], name="fk_catalogue_entries_supplier_id_suppliers", ondelete="CASCADE"),
        sa.ForeignKeyConstraint(["part_id"], ["parts.id"], name="fk_catalogue_entries_part_id_parts", ondelete="SET NULL"),
        sa.UniqueConstraint("supplier_id", "supplier_ref", name="uq_catalogue_entries_supplier_id_supplier_ref"),
        sa.CheckConstraint("pack_qty >= 1", name=op.f("ck_catalogue_entries_pack_qty")),
        sa.CheckConstraint("price IS NULL OR price >= 0", name=op.f("ck_catalogue_entries_price")),
        sa.CheckConstraint("lead_time_days IS NULL OR lead_time_days >= 0", name=op.f("ck_catalogue_entries_lead_time_days")),
        sa.CheckConstraint("length(currency) = 3", name=op.f("ck_catalogue_entries_currency")),
    )
    op.create_index("ix_catalogue_entries_part_key", "catalogue_entries", ["part_key"])
    op.create_table(
        "stock",
        sa.Column("id", sa.Integer(), nullable=False),
        _text("vessel_id"), _int("part_id"), _float("quantity"), sa.Column("counted_on", sa.Date(), nullable=True),
        sa.PrimaryKeyConstraint("id", name="pk_stock"),
        sa.ForeignKeyConstraint(["vessel_id"], ["vessels.id"], name="fk_stock_vessel_id_vessels", ondelete="CASCADE"),
        sa.ForeignKeyConstraint(["part_id"], ["parts.id"], name="fk_stock_part_id_parts", ondelete="RESTRICT"),
        sa.UniqueConstraint("vessel_id", "part_id", name="uq_stock_vessel_id_part_id"),
        sa.CheckConstraint("quantity >= 0", name=op.f("ck_stock_quantity")),
    )


def downgrade() -> None:
    for name in ("stock", "catalogue_entries", "suppliers", "parts", "hoses", "solenoid_coils", "stated_housings",
                 "pipes", "filter_positions", "power_units", "actuators", "units", "vessels", "companies"):
        op.drop_table(name)
