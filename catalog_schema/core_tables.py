# SPDX-License-Identifier: MIT
"""The fleet tables as SQLAlchemy Core tables, for commands that run Core statements only.

Generated from catalog_schema/tables.py by ``python -m catalog_schema.render_core``; do not edit.
"""

from sqlalchemy import (
    Boolean,
    CheckConstraint,
    Column,
    Date,
    DateTime,
    Float,
    ForeignKeyConstraint,
    Index,
    Integer,
    MetaData,
    PrimaryKeyConstraint,
    String,
    Table,
    Text,
    UniqueConstraint,
)
from sqlalchemy.sql.elements import conv

metadata = MetaData()

AUDIT_EVENTS = Table(
    "audit_events",
    metadata,
    Column("id", Integer, nullable=False),
    Column("at", DateTime, nullable=False),
    Column("person", String, nullable=False),
    Column("via", String, nullable=False),
    Column("action", String, nullable=False),
    Column("subject", String, nullable=False),
    Column("before", Text, nullable=True),
    Column("after", Text, nullable=True),
    PrimaryKeyConstraint("id", name=conv("pk_audit_events")),
    Index(conv("ix_audit_events_at"), "at", unique=False),
)

COMPANIES = Table(
    "companies",
    metadata,
    Column("id", Integer, nullable=False),
    Column("name", String, nullable=False),
    PrimaryKeyConstraint("id", name=conv("pk_companies")),
    UniqueConstraint("name", name=conv("uq_companies_name")),
)

ENQUIRIES = Table(
    "enquiries",
    metadata,
    Column("id", String, nullable=False),
    Column("supplier", String, nullable=True),
    Column("written_on", Date, nullable=False),
    Column("reply_by", Date, nullable=False),
    PrimaryKeyConstraint("id", name=conv("pk_enquiries")),
)

EXCHANGE_RATES = Table(
    "exchange_rates",
    metadata,
    Column("id", Integer, nullable=False),
    Column("currency", String, nullable=False),
    Column("base", String, nullable=False),
    Column("rate", Float, nullable=False),
    Column("set_on", Date, nullable=False),
    Column("source", String, nullable=False),
    PrimaryKeyConstraint("id", name=conv("pk_exchange_rates")),
    UniqueConstraint("currency", "base", "set_on", name=conv("uq_exchange_rates_currency_base_set_on")),
    CheckConstraint("length(currency) = 3 AND length(base) = 3 AND currency <> base", name=conv("ck_exchange_rates_currencies")),
    CheckConstraint("rate > 0", name=conv("ck_exchange_rates_rate")),
)

LOGIN_FAILURES = Table(
    "login_failures",
    metadata,
    Column("id", Integer, nullable=False),
    Column("login", String, nullable=False),
    Column("address", String, nullable=False),
    Column("at", DateTime, nullable=False),
    PrimaryKeyConstraint("id", name=conv("pk_login_failures")),
    Index(conv("ix_login_failures_address"), "address", unique=False),
    Index(conv("ix_login_failures_login"), "login", unique=False),
)

PARTS = Table(
    "parts",
    metadata,
    Column("id", Integer, nullable=False),
    Column("key", String, nullable=False),
    Column("kind", String, nullable=False),
    Column("designation", String, nullable=False),
    Column("standard", String, nullable=True),
    PrimaryKeyConstraint("id", name=conv("pk_parts")),
    UniqueConstraint("key", name=conv("uq_parts_key")),
)

PEOPLE = Table(
    "people",
    metadata,
    Column("id", Integer, nullable=False),
    Column("login", String, nullable=False),
    Column("name", String, nullable=False),
    Column("role", String, nullable=False),
    Column("password_hash", String, nullable=False),
    Column("created_at", DateTime, nullable=False),
    Column("disabled_at", DateTime, nullable=True),
    PrimaryKeyConstraint("id", name=conv("pk_people")),
    UniqueConstraint("login", name=conv("uq_people_login")),
    CheckConstraint("login = lower(login) AND length(login) >= 2", name=conv("ck_people_login")),
    CheckConstraint("role IN ('administrator', 'buyer', 'vessel_keeper', 'reader')", name=conv("ck_people_role")),
)

PURCHASING = Table(
    "purchasing",
    metadata,
    Column("id", Integer, nullable=False, default=1),
    Column("base_currency", String, nullable=True),
    Column("handling_days", Integer, nullable=True),
    PrimaryKeyConstraint("id", name=conv("pk_purchasing")),
    CheckConstraint("base_currency IS NULL OR length(base_currency) = 3", name=conv("ck_purchasing_base_currency")),
    CheckConstraint("handling_days IS NULL OR (handling_days >= 0 AND handling_days <= 365)", name=conv("ck_purchasing_handling_days")),
    CheckConstraint("id = 1", name=conv("ck_purchasing_one_row")),
)

SUPPLIERS = Table(
    "suppliers",
    metadata,
    Column("id", Integer, nullable=False),
    Column("name", String, nullable=False),
    Column("preferred", Boolean, nullable=False, default=False, server_default="0"),
    PrimaryKeyConstraint("id", name=conv("pk_suppliers")),
    UniqueConstraint("name", name=conv("uq_suppliers_name")),
)

CATALOGUE_ENTRIES = Table(
    "catalogue_entries",
    metadata,
    Column("id", Integer, nullable=False),
    Column("supplier_id", Integer, nullable=False),
    Column("supplier_ref", String, nullable=False),
    Column("part_key", String, nullable=False),
    Column("part_id", Integer, nullable=True),
    Column("description", String, nullable=True),
    Column("pack_qty", Integer, nullable=False, default=1),
    Column("price", Float, nullable=True),
    Column("currency", String, nullable=False),
    Column("lead_time_days", Integer, nullable=True),
    Column("pack_content", Float, nullable=True),
    Column("pack_label", String, nullable=True),
    PrimaryKeyConstraint("id", name=conv("pk_catalogue_entries")),
    ForeignKeyConstraint(["part_id"], ["parts.id"], ondelete="SET NULL", name=conv("fk_catalogue_entries_part_id_parts")),
    ForeignKeyConstraint(["supplier_id"], ["suppliers.id"], ondelete="CASCADE", name=conv("fk_catalogue_entries_supplier_id_suppliers")),
    UniqueConstraint("supplier_id", "supplier_ref", name=conv("uq_catalogue_entries_supplier_id_supplier_ref")),
    CheckConstraint("length(currency) = 3", name=conv("ck_catalogue_entries_currency")),
    CheckConstraint("lead_time_days IS NULL OR lead_time_days >= 0", name=conv("ck_catalogue_entries_lead_time_days")),
    CheckConstraint("pack_content IS NULL OR pack_content > 0", name=conv("ck_catalogue_entries_pack_content")),
    CheckConstraint("pack_qty >= 1", name=conv("ck_catalogue_entries_pack_qty")),
    CheckConstraint("price IS NULL OR price >= 0", name=conv("ck_catalogue_entries_price")),
    Index(conv("ix_catalogue_entries_part_key"), "part_key", unique=False),
)

ENQUIRY_LINES = Table(
    "enquiry_lines",
    metadata,
    Column("enquiry_id", String, nullable=False),
    Column("line", Integer, nullable=False),
    Column("ref", String, nullable=False),
    Column("part_key", String, nullable=False),
    Column("designation", String, nullable=False),
    Column("quantity", Float, nullable=False),
    Column("uom", String, nullable=False),
    Column("standard", String, nullable=True),
    Column("compound", String, nullable=True),
    Column("service", String, nullable=True),
    PrimaryKeyConstraint("enquiry_id", "line", name=conv("pk_enquiry_lines")),
    ForeignKeyConstraint(["enquiry_id"], ["enquiries.id"], ondelete="CASCADE", name=conv("fk_enquiry_lines_enquiry_id_enquiries")),
    UniqueConstraint("ref", name=conv("uq_enquiry_lines_ref")),
    CheckConstraint("quantity > 0", name=conv("ck_enquiry_lines_quantity")),
)

PART_SUPPLIERS = Table(
    "part_suppliers",
    metadata,
    Column("part_id", Integer, nullable=False),
    Column("supplier_id", Integer, nullable=False),
    Column("note", String, nullable=True),
    PrimaryKeyConstraint("part_id", name=conv("pk_part_suppliers")),
    ForeignKeyConstraint(["part_id"], ["parts.id"], ondelete="CASCADE", name=conv("fk_part_suppliers_part_id_parts")),
    ForeignKeyConstraint(["supplier_id"], ["suppliers.id"], ondelete="CASCADE", name=conv("fk_part_suppliers_supplier_id_suppliers")),
)

VESSELS = Table(
    "vessels",
    metadata,
    Column("id", String, nullable=False),
    Column("name", String, nullable=False),
    Column("ship_type", String, nullable=False),
    Column("gross_tonnage", Float, nullable=False),
    Column("company_id", Integer, nullable=True),
    Column("source", String, nullable=True),
    PrimaryKeyConstraint("id", name=conv("pk_vessels")),
    ForeignKeyConstraint(["company_id"], ["companies.id"], ondelete="RESTRICT", name=conv("fk_vessels_company_id_companies")),
    CheckConstraint("gross_tonnage >= 1", name=conv("ck_vessels_gross_tonnage")),
    CheckConstraint("ship_type IN ('cargo', 'passenger', 'tanker', 'chemical_tanker', 'gas_carrier')", name=conv("ck_vessels_ship_type")),
)

WEB_SESSIONS = Table(
    "web_sessions",
    metadata,
    Column("id", String, nullable=False),
    Column("person_id", Integer, nullable=False),
    Column("csrf", String, nullable=False),
    Column("started_at", DateTime, nullable=False),
    Column("seen_at", DateTime, nullable=False),
    Column("ended_at", DateTime, nullable=True),
    PrimaryKeyConstraint("id", name=conv("pk_web_sessions")),
    ForeignKeyConstraint(["person_id"], ["people.id"], ondelete="CASCADE", name=conv("fk_web_sessions_person_id_people")),
)

DELIVERIES = Table(
    "deliveries",
    metadata,
    Column("id", Integer, nullable=False),
    Column("vessel_id", String, nullable=False),
    Column("port", String, nullable=False),
    Column("due_on", Date, nullable=False),
    Column("note", String, nullable=True),
    PrimaryKeyConstraint("id", name=conv("pk_deliveries")),
    ForeignKeyConstraint(["vessel_id"], ["vessels.id"], ondelete="CASCADE", name=conv("fk_deliveries_vessel_id_vessels")),
    UniqueConstraint("vessel_id", "due_on", name=conv("uq_deliveries_vessel_id_due_on")),
)

FILTER_COUNTS = Table(
    "filter_counts",
    metadata,
    Column("vessel_id", String, nullable=False),
    Column("unit_ref", String, nullable=False),
    Column("position", String, nullable=False),
    Column("run_since_change", Float, nullable=False),
    Column("counted_on", Date, nullable=False),
    PrimaryKeyConstraint("vessel_id", "unit_ref", "position", name=conv("pk_filter_counts")),
    ForeignKeyConstraint(["vessel_id"], ["vessels.id"], ondelete="CASCADE", name=conv("fk_filter_counts_vessel_id_vessels")),
    CheckConstraint("run_since_change >= 0", name=conv("ck_filter_counts_run_since_change")),
)

PERSON_VESSELS = Table(
    "person_vessels",
    metadata,
    Column("person_id", Integer, nullable=False),
    Column("vessel_id", String, nullable=False),
    PrimaryKeyConstraint("person_id", "vessel_id", name=conv("pk_person_vessels")),
    ForeignKeyConstraint(["person_id"], ["people.id"], ondelete="CASCADE", name=conv("fk_person_vessels_person_id_people")),
    ForeignKeyConstraint(["vessel_id"], ["vessels.id"], ondelete="CASCADE", name=conv("fk_person_vessels_vessel_id_vessels")),
)

SPARES_POLICIES = Table(
    "spares_policies",
    metadata,
    Column("id", Integer, nullable=False),
    Column("company_id", Integer, nullable=True),
    Column("vessel_id", String, nullable=True),
    Column("name", String, nullable=False),
    Column("cover_days", Integer, nullable=False),
    Column("in_force_from", Date, nullable=False),
    Column("note", String, nullable=True),
    Column("content", Text, nullable=True),
    PrimaryKeyConstraint("id", name=conv("pk_spares_policies")),
    ForeignKeyConstraint(["company_id"], ["companies.id"], ondelete="CASCADE", name=conv("fk_spares_policies_company_id_companies")),
    ForeignKeyConstraint(["vessel_id"], ["vessels.id"], ondelete="CASCADE", name=conv("fk_spares_policies_vessel_id_vessels")),
    UniqueConstraint("company_id", "in_force_from", name=conv("uq_spares_policies_company_id_in_force_from")),
    UniqueConstraint("vessel_id", "in_force_from", name=conv("uq_spares_policies_vessel_id_in_force_from")),
    CheckConstraint("cover_days >= 0", name=conv("ck_spares_policies_cover_days")),
    CheckConstraint("(company_id IS NULL) <> (vessel_id IS NULL)", name=conv("ck_spares_policies_one_scope")),
)

STOCK = Table(
    "stock",
    metadata,
    Column("id", Integer, nullable=False),
    Column("vessel_id", String, nullable=False),
    Column("part_id", Integer, nullable=False),
    Column("location", String, nullable=False, default="unassigned", server_default="unassigned"),
    Column("quantity", Float, nullable=False),
    Column("counted_on", Date, nullable=True),
    PrimaryKeyConstraint("id", name=conv("pk_stock")),
    ForeignKeyConstraint(["part_id"], ["parts.id"], ondelete="RESTRICT", name=conv("fk_stock_part_id_parts")),
    ForeignKeyConstraint(["vessel_id"], ["vessels.id"], ondelete="CASCADE", name=conv("fk_stock_vessel_id_vessels")),
    UniqueConstraint("vessel_id", "part_id", "location", name=conv("uq_stock_vessel_id_part_id_location")),
    CheckConstraint("quantity >= 0", name=conv("ck_stock_quantity")),
)

UNITS = Table(
    "units",
    metadata,
    Column("id", Integer, nullable=False),
    Column("vessel_id", String, nullable=False),
    Column("ref", String, nullable=False),
    Column("seq", Integer, nullable=False),
    Column("service", String, nullable=False),
    Column("actuator", String, nullable=False),
    Column("count", Integer, nullable=False),
    Column("working_pressure", Float, nullable=False),
    Column("fluid_category", String, nullable=False),
    Column("fluid_grade", Integer, nullable=False),
    Column("max_rudder_angle", Float, nullable=True),
    Column("isolation_valves", Boolean, nullable=False, default=False),
    Column("rudder_carrier", String, nullable=True),
    Column("maker", String, nullable=True),
    Column("model", String, nullable=True),
    PrimaryKeyConstraint("id", name=conv("pk_units")),
    ForeignKeyConstraint(["vessel_id"], ["vessels.id"], ondelete="CASCADE", name=conv("fk_units_vessel_id_vessels")),
    UniqueConstraint("vessel_id", "ref", name=conv("uq_units_vessel_id_ref")),
    CheckConstraint("actuator IN ('ram', 'rotary_vane', 'cylinder')", name=conv("ck_units_actuator")),
    CheckConstraint("count >= 1", name=conv("ck_units_count")),
    CheckConstraint("fluid_grade > 0", name=conv("ck_units_fluid_grade")),
    CheckConstraint("rudder_carrier IS NULL OR rudder_carrier = 'separate' OR (rudder_carrier = 'in_actuator' AND actuator = 'rotary_vane')", name=conv("ck_units_rudder_carrier")),
    CheckConstraint("working_pressure > 0", name=conv("ck_units_working_pressure")),
)

ACTUATORS = Table(
    "actuators",
    metadata,
    Column("unit_id", Integer, nullable=False),
    Column("ram_diameter", Float, nullable=True),
    Column("bore", Float, nullable=True),
    Column("rod", Float, nullable=True),
    Column("stroke", Float, nullable=True),
    Column("tiller_radius", Float, nullable=True),
    Column("vanes", Integer, nullable=True),
    Column("vane_height", Float, nullable=True),
    Column("housing_bore", Float, nullable=True),
    Column("hub_diameter", Float, nullable=True),
    Column("stock_diameter", Float, nullable=True),
    Column("vane_angle", Float, nullable=True),
    Column("trunnion_distance", Float, nullable=True),
    Column("gland_spigot_bore", Float, nullable=True),
    PrimaryKeyConstraint("unit_id", name=conv("pk_actuators")),
    ForeignKeyConstraint(["unit_id"], ["units.id"], ondelete="CASCADE", name=conv("fk_actuators_unit_id_units")),
    CheckConstraint("gland_spigot_bore IS NULL OR gland_spigot_bore > 0", name=conv("ck_actuators_gland_spigot_bore")),
    CheckConstraint("stroke IS NULL OR stroke > 0", name=conv("ck_actuators_stroke")),
    CheckConstraint("trunnion_distance IS NULL OR trunnion_distance > 0", name=conv("ck_actuators_trunnion_distance")),
    CheckConstraint("vanes IS NULL OR vanes >= 1", name=conv("ck_actuators_vanes")),
)

FILTER_POSITIONS = Table(
    "filter_positions",
    metadata,
    Column("unit_id", Integer, nullable=False),
    Column("seq", Integer, nullable=False),
    Column("position", String, nullable=False),
    Column("elements", Integer, nullable=False),
    Column("change_interval", Float, nullable=False),
    Column("duty_hours_per_day", Float, nullable=False, default=24.0),
    Column("element_ref", String, nullable=True),
    Column("run_since_change", Float, nullable=True),
    Column("run_read_on", Date, nullable=True),
    PrimaryKeyConstraint("unit_id", "seq", name=conv("pk_filter_positions")),
    ForeignKeyConstraint(["unit_id"], ["units.id"], ondelete="CASCADE", name=conv("fk_filter_positions_unit_id_units")),
    CheckConstraint("change_interval > 0", name=conv("ck_filter_positions_change_interval")),
    CheckConstraint("duty_hours_per_day >= 0 AND duty_hours_per_day <= 24", name=conv("ck_filter_positions_duty")),
    CheckConstraint("elements >= 1", name=conv("ck_filter_positions_elements")),
    CheckConstraint("run_since_change IS NULL OR run_since_change >= 0", name=conv("ck_filter_positions_run_since_change")),
)

HOSES = Table(
    "hoses",
    metadata,
    Column("unit_id", Integer, nullable=False),
    Column("seq", Integer, nullable=False),
    Column("bore", Float, nullable=False),
    Column("count", Integer, nullable=False),
    PrimaryKeyConstraint("unit_id", "seq", name=conv("pk_hoses")),
    ForeignKeyConstraint(["unit_id"], ["units.id"], ondelete="CASCADE", name=conv("fk_hoses_unit_id_units")),
    CheckConstraint("bore > 0 AND count >= 1", name=conv("ck_hoses_sizes")),
)

PIPES = Table(
    "pipes",
    metadata,
    Column("unit_id", Integer, nullable=False),
    Column("seq", Integer, nullable=False),
    Column("outside_diameter", Float, nullable=False),
    Column("wall", Float, nullable=False),
    Column("length", Float, nullable=False),
    PrimaryKeyConstraint("unit_id", "seq", name=conv("pk_pipes")),
    ForeignKeyConstraint(["unit_id"], ["units.id"], ondelete="CASCADE", name=conv("fk_pipes_unit_id_units")),
    CheckConstraint("wall > 0 AND outside_diameter > 2 * wall AND length > 0", name=conv("ck_pipes_sizes")),
)

POWER_UNITS = Table(
    "power_units",
    metadata,
    Column("unit_id", Integer, nullable=False),
    Column("pumps", Integer, nullable=False),
    Column("pump_flow", Float, nullable=False),
    Column("reservoir", Float, nullable=False),
    Column("system_oil", Float, nullable=True),
    Column("oil_leakage", Float, nullable=True),
    Column("pump_model", String, nullable=True),
    Column("valve_blocks", Integer, nullable=False, default=1),
    Column("max_working_pressure", Float, nullable=True),
    Column("design_pressure", Float, nullable=True),
    Column("pump_maker", String, nullable=True),
    Column("valve_maker", String, nullable=True),
    Column("valve_model", String, nullable=True),
    PrimaryKeyConstraint("unit_id", name=conv("pk_power_units")),
    ForeignKeyConstraint(["unit_id"], ["units.id"], ondelete="CASCADE", name=conv("fk_power_units_unit_id_units")),
    CheckConstraint("oil_leakage IS NULL OR oil_leakage >= 0", name=conv("ck_power_units_oil_leakage")),
    CheckConstraint("pump_flow > 0", name=conv("ck_power_units_pump_flow")),
    CheckConstraint("pumps >= 1", name=conv("ck_power_units_pumps")),
    CheckConstraint("reservoir > 0", name=conv("ck_power_units_reservoir")),
    CheckConstraint("system_oil IS NULL OR system_oil > 0", name=conv("ck_power_units_system_oil")),
    CheckConstraint("valve_blocks >= 0", name=conv("ck_power_units_valve_blocks")),
)

RUDDERS = Table(
    "rudders",
    metadata,
    Column("unit_id", Integer, nullable=False),
    Column("area", Float, nullable=False),
    Column("mean_height", Float, nullable=False),
    Column("area_forward", Float, nullable=False),
    Column("ahead_speed", Float, nullable=False),
    Column("profile", String, nullable=False),
    Column("position", String, nullable=False),
    Column("astern_speed", Float, nullable=True),
    PrimaryKeyConstraint("unit_id", name=conv("pk_rudders")),
    ForeignKeyConstraint(["unit_id"], ["units.id"], ondelete="CASCADE", name=conv("fk_rudders_unit_id_units")),
    CheckConstraint("area_forward >= 0 AND area_forward < area / 2", name=conv("ck_rudders_area_forward")),
    CheckConstraint("position IN ('outside_jet', 'propeller_jet', 'behind_nozzle')", name=conv("ck_rudders_position")),
    CheckConstraint("profile IN ('naca', 'flat_side', 'mixed', 'hollow', 'high_lift', 'fish_tail', 'single_plate')", name=conv("ck_rudders_profile")),
    CheckConstraint("area > 0 AND mean_height > 0", name=conv("ck_rudders_sizes")),
    CheckConstraint("ahead_speed > 0 AND (astern_speed IS NULL OR astern_speed > 0)", name=conv("ck_rudders_speeds")),
)

SOLENOID_COILS = Table(
    "solenoid_coils",
    metadata,
    Column("unit_id", Integer, nullable=False),
    Column("seq", Integer, nullable=False),
    Column("voltage", String, nullable=False),
    Column("count", Integer, nullable=False),
    PrimaryKeyConstraint("unit_id", "seq", name=conv("pk_solenoid_coils")),
    ForeignKeyConstraint(["unit_id"], ["units.id"], ondelete="CASCADE", name=conv("fk_solenoid_coils_unit_id_units")),
    CheckConstraint("count >= 1", name=conv("ck_solenoid_coils_count")),
)

STATED_HOUSINGS = Table(
    "stated_housings",
    metadata,
    Column("unit_id", Integer, nullable=False),
    Column("seq", Integer, nullable=False),
    Column("role", String, nullable=False),
    Column("d_inner", Float, nullable=False),
    Column("d_outer", Float, nullable=False),
    Column("length", Float, nullable=False),
    PrimaryKeyConstraint("unit_id", "seq", name=conv("pk_stated_housings")),
    ForeignKeyConstraint(["unit_id"], ["units.id"], ondelete="CASCADE", name=conv("fk_stated_housings_unit_id_units")),
    CheckConstraint("d_inner > 0 AND d_outer > d_inner AND length > 0", name=conv("ck_stated_housings_sizes")),
)
