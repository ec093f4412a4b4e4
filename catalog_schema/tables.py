# SPDX-License-Identifier: MIT
"""The fleet database's tables (SQLModel), at the head revision of ``migrations/``.

Lengths, pressures, flows, volumes and times are SI floats (m, Pa, m^3/s, m^3, s, rad), as in
:mod:`kit.engine.particulars`. Child rows of a unit (filters, pipes, housings, coils, hoses) are keyed
by the unit and their order in the particulars file, so loading the same file again writes the
same rows. Every constraint that guards the data is declared here and in the migrations, so the
database refuses bad rows whichever program writes them.
"""

from __future__ import annotations

import datetime as dt
from typing import Optional

from sqlalchemy import CheckConstraint, Column, DateTime, ForeignKey, Integer, String, Text, UniqueConstraint
from sqlmodel import Field, SQLModel

from catalog_schema.conventions import DEFAULT_LOCATION, NAMING

SQLModel.metadata.naming_convention = NAMING


def _unit_fk() -> Column:
    return Column(Integer, ForeignKey("units.id", ondelete="CASCADE"), primary_key=True)


class CompanyRow(SQLModel, table=True):
    __tablename__ = "companies"

    id: Optional[int] = Field(default=None, primary_key=True)
    name: str = Field(sa_column_kwargs={"unique": True, "nullable": False})


class VesselRow(SQLModel, table=True):
    __tablename__ = "vessels"
    __table_args__ = (
        CheckConstraint("ship_type IN ('cargo', 'passenger', 'tanker', 'chemical_tanker', 'gas_carrier')", name="ship_type"),
        CheckConstraint("gross_tonnage >= 1", name="gross_tonnage"),
    )

    id: str = Field(primary_key=True)
    name: str
    ship_type: str
    gross_tonnage: float
    company_id: Optional[int] = Field(default=None, foreign_key="companies.id", ondelete="RESTRICT")
    source: Optional[str] = None


class UnitRow(SQLModel, table=True):
    """A hydraulic unit on board (steering gear or other service), by its id in the particulars."""

    __tablename__ = "units"
    __table_args__ = (
        UniqueConstraint("vessel_id", "ref"),
        CheckConstraint("actuator IN ('ram', 'rotary_vane', 'cylinder')", name="actuator"),
        CheckConstraint("count >= 1", name="count"),
        CheckConstraint("working_pressure > 0", name="working_pressure"),
        CheckConstraint("fluid_grade > 0", name="fluid_grade"),
        # Only a rotary vane actuator can carry the rudder in its housing (revision 0005).
        CheckConstraint("rudder_carrier IS NULL OR rudder_carrier = 'separate' "
                        "OR (rudder_carrier = 'in_actuator' AND actuator = 'rotary_vane')", name="rudder_carrier"),
    )

    id: Optional[int] = Field(default=None, primary_key=True)
    vessel_id: str = Field(foreign_key="vessels.id", ondelete="CASCADE")
    ref: str
    seq: int
    service: str
    actuator: str
    count: int
    working_pressure: float
    fluid_category: str
    fluid_grade: int
    max_rudder_angle: Optional[float] = None
    isolation_valves: bool = False
    rudder_carrier: Optional[str] = None  # where the rudder carrier bearing is; null when not said
    maker: Optional[str] = None  # the gear's maker and model, as on its name plate (revision 0006)
    model: Optional[str] = None


class ActuatorRow(SQLModel, table=True):
    """Actuator geometry of a unit; the columns of its actuator type are filled, the rest null."""

    __tablename__ = "actuators"
    __table_args__ = (
        CheckConstraint("stroke IS NULL OR stroke > 0", name="stroke"),
        CheckConstraint("vanes IS NULL OR vanes >= 1", name="vanes"),
        CheckConstraint("trunnion_distance IS NULL OR trunnion_distance > 0", name="trunnion_distance"),
        CheckConstraint("gland_spigot_bore IS NULL OR gland_spigot_bore > 0", name="gland_spigot_bore"),
    )

    unit_id: int = Field(sa_column=_unit_fk())
    ram_diameter: Optional[float] = None
    bore: Optional[float] = None
    rod: Optional[float] = None
    stroke: Optional[float] = None
    tiller_radius: Optional[float] = None
    vanes: Optional[int] = None
    vane_height: Optional[float] = None
    housing_bore: Optional[float] = None
    hub_diameter: Optional[float] = None
    stock_diameter: Optional[float] = None
    vane_angle: Optional[float] = None
    trunnion_distance: Optional[float] = None  # a cylinder gear's trunnion axis to tiller pin at midships
    gland_spigot_bore: Optional[float] = None  # a ram gland's spigot bore, as the maker's drawing gives it


class RudderRow(SQLModel, table=True):
    """The rudder a steering unit turns, for its torque by the classification-rule formula
    (:mod:`kit.engine.rudder`): area [m^2], mean height [m], area forward of the stock axis [m^2],
    ahead and astern speeds [m/s], profile and position. One row per unit, none when not given.
    (Added in revision 0005.)"""

    __tablename__ = "rudders"
    __table_args__ = (
        CheckConstraint("area > 0 AND mean_height > 0", name="sizes"),
        CheckConstraint("area_forward >= 0 AND area_forward < area / 2", name="area_forward"),
        CheckConstraint("ahead_speed > 0 AND (astern_speed IS NULL OR astern_speed > 0)", name="speeds"),
        CheckConstraint("profile IN ('naca', 'flat_side', 'mixed', 'hollow', 'high_lift', 'fish_tail', 'single_plate')",
                        name="profile"),
        CheckConstraint("position IN ('outside_jet', 'propeller_jet', 'behind_nozzle')", name="position"),
    )

    unit_id: int = Field(sa_column=_unit_fk())
    area: float
    mean_height: float
    area_forward: float
    ahead_speed: float
    profile: str
    position: str
    astern_speed: Optional[float] = None


class PowerUnitRow(SQLModel, table=True):
    """The pumps, reservoir and valve blocks that drive a unit."""

    __tablename__ = "power_units"
    __table_args__ = (
        CheckConstraint("pumps >= 1", name="pumps"),
        CheckConstraint("pump_flow > 0", name="pump_flow"),
        CheckConstraint("reservoir > 0", name="reservoir"),
        CheckConstraint("system_oil IS NULL OR system_oil > 0", name="system_oil"),
        CheckConstraint("oil_leakage IS NULL OR oil_leakage >= 0", name="oil_leakage"),
        CheckConstraint("valve_blocks >= 0", name="valve_blocks"),
    )

    unit_id: int = Field(sa_column=_unit_fk())
    pumps: int
    pump_flow: float
    reservoir: float
    system_oil: Optional[float] = None
    oil_leakage: Optional[float] = None
    pump_model: Optional[str] = None
    valve_blocks: int = 1
    max_working_pressure: Optional[float] = None
    design_pressure: Optional[float] = None
    pump_maker: Optional[str] = None  # makers and models for the lines a supplier quotes (revision 0006)
    valve_maker: Optional[str] = None
    valve_model: Optional[str] = None


class FilterPositionRow(SQLModel, table=True):
    __tablename__ = "filter_positions"
    __table_args__ = (
        CheckConstraint("elements >= 1", name="elements"),
        CheckConstraint("change_interval > 0", name="change_interval"),
        CheckConstraint("duty_hours_per_day >= 0 AND duty_hours_per_day <= 24", name="duty"),
        CheckConstraint("run_since_change IS NULL OR run_since_change >= 0", name="run_since_change"),
    )

    unit_id: int = Field(sa_column=_unit_fk())
    seq: int = Field(primary_key=True)
    position: str
    elements: int
    change_interval: float
    duty_hours_per_day: float = 24.0
    element_ref: Optional[str] = None
    # s run since the element was changed, and the day read, as the particulars state them (revision 0008)
    run_since_change: Optional[float] = None
    run_read_on: Optional[dt.date] = None


class FilterCountRow(SQLModel, table=True):
    """Running time since the last change of a filter position, as a count on board read it
    (revision 0008). Keyed by the vessel, the unit's id in the particulars and the position, so it
    outlives loading the particulars again; the newer of it and the particulars' figure is used."""

    __tablename__ = "filter_counts"
    __table_args__ = (CheckConstraint("run_since_change >= 0", name="run_since_change"),)

    vessel_id: str = Field(foreign_key="vessels.id", ondelete="CASCADE", primary_key=True)
    unit_ref: str = Field(primary_key=True)
    position: str = Field(primary_key=True)
    run_since_change: float
    counted_on: dt.date


class PipeRow(SQLModel, table=True):
    __tablename__ = "pipes"
    __table_args__ = (CheckConstraint("wall > 0 AND outside_diameter > 2 * wall AND length > 0", name="sizes"),)

    unit_id: int = Field(sa_column=_unit_fk())
    seq: int = Field(primary_key=True)
    outside_diameter: float
    wall: float
    length: float


class StatedHousingRow(SQLModel, table=True):
    """A seal housing as the maker's drawing states it: bore d, outer D, length L (m)."""

    __tablename__ = "stated_housings"
    __table_args__ = (CheckConstraint("d_inner > 0 AND d_outer > d_inner AND length > 0", name="sizes"),)

    unit_id: int = Field(sa_column=_unit_fk())
    seq: int = Field(primary_key=True)
    role: str
    d_inner: float
    d_outer: float
    length: float


class SolenoidCoilRow(SQLModel, table=True):
    __tablename__ = "solenoid_coils"
    __table_args__ = (CheckConstraint("count >= 1", name="count"),)

    unit_id: int = Field(sa_column=_unit_fk())
    seq: int = Field(primary_key=True)
    voltage: str
    count: int


class HoseRow(SQLModel, table=True):
    __tablename__ = "hoses"
    __table_args__ = (CheckConstraint("bore > 0 AND count >= 1", name="sizes"),)

    unit_id: int = Field(sa_column=_unit_fk())
    seq: int = Field(primary_key=True)
    bore: float
    count: int


class PartRow(SQLModel, table=True):
    """A generic part: one row per normalised key (:func:`kit.engine.parts.part_key`)."""

    __tablename__ = "parts"

    id: Optional[int] = Field(default=None, primary_key=True)
    key: str = Field(sa_column=Column(String, unique=True, nullable=False))
    kind: str
    designation: str
    standard: Optional[str] = None


class SupplierRow(SQLModel, table=True):
    """A supplier; a preferred one wins over price for every part it offers (revision 0006)."""

    __tablename__ = "suppliers"

    id: Optional[int] = Field(default=None, primary_key=True)
    name: str = Field(sa_column_kwargs={"unique": True, "nullable": False})
    preferred: bool = Field(default=False, sa_column_kwargs={"server_default": "0", "nullable": False})


class CatalogueEntryRow(SQLModel, table=True):
    """One line of a supplier's catalogue. ``part_id`` is null when it matched no generic part."""

    __tablename__ = "catalogue_entries"
    __table_args__ = (
        UniqueConstraint("supplier_id", "supplier_ref"),
        CheckConstraint("pack_qty >= 1", name="pack_qty"),
        CheckConstraint("price IS NULL OR price >= 0", name="price"),
        CheckConstraint("lead_time_days IS NULL OR lead_time_days >= 0", name="lead_time_days"),
        CheckConstraint("length(currency) = 3", name="currency"),
        CheckConstraint("pack_content IS NULL OR pack_content > 0", name="pack_content"),
    )

    id: Optional[int] = Field(default=None, primary_key=True)
    supplier_id: int = Field(foreign_key="suppliers.id", ondelete="CASCADE")
    supplier_ref: str
    part_key: str = Field(index=True)
    part_id: Optional[int] = Field(default=None, foreign_key="parts.id", ondelete="SET NULL")
    description: Optional[str] = None
    pack_qty: int = 1
    price: Optional[float] = None
    currency: str
    lead_time_days: Optional[int] = None
    # One pack's content in the part's unit of measure, and the pack as the catalogue wrote it
    # ("208 L", "5 US_gal"); null for entries imported before revision 0006 (then pack_qty).
    pack_content: Optional[float] = None
    pack_label: Optional[str] = None


class StockRow(SQLModel, table=True):
    """On-board stock of one generic part at one location on one vessel."""

    __tablename__ = "stock"
    __table_args__ = (
        UniqueConstraint("vessel_id", "part_id", "location"),
        CheckConstraint("quantity >= 0", name="quantity"),
    )

    id: Optional[int] = Field(default=None, primary_key=True)
    vessel_id: str = Field(foreign_key="vessels.id", ondelete="CASCADE")
    part_id: int = Field(foreign_key="parts.id", ondelete="RESTRICT")
    location: str = Field(default=DEFAULT_LOCATION, sa_column_kwargs={"server_default": DEFAULT_LOCATION})
    quantity: float
    counted_on: Optional[dt.date] = None


class SparesPolicyRow(SQLModel, table=True):
    """The spares policy in force for a whole company or for one vessel, from a date.

    Exactly one of ``company_id`` and ``vessel_id`` is set; a vessel's own policy wins over its
    company's. ``content`` is the company policy file's TOML text, validated by :mod:`kit.engine.spares`
    before it is stored; null means kit's default policy. (Added in revision 0002; content in 0003.)
    """

    __tablename__ = "spares_policies"
    __table_args__ = (
        CheckConstraint("(company_id IS NULL) <> (vessel_id IS NULL)", name="one_scope"),
        CheckConstraint("cover_days >= 0", name="cover_days"),
        UniqueConstraint("company_id", "in_force_from"),
        UniqueConstraint("vessel_id", "in_force_from"),
    )

    id: Optional[int] = Field(default=None, primary_key=True)
    company_id: Optional[int] = Field(default=None, foreign_key="companies.id", ondelete="CASCADE")
    vessel_id: Optional[str] = Field(default=None, foreign_key="vessels.id", ondelete="CASCADE")
    name: str
    cover_days: int
    in_force_from: dt.date
    note: Optional[str] = None
    content: Optional[str] = Field(default=None, sa_type=Text)


class PartSupplierRow(SQLModel, table=True):
    """The supplier preferred for one generic part: wins over price and over a supplier
    preferred for everything (revision 0006)."""

    __tablename__ = "part_suppliers"

    part_id: int = Field(sa_column=Column(Integer, ForeignKey("parts.id", ondelete="CASCADE"), primary_key=True))
    supplier_id: int = Field(foreign_key="suppliers.id", ondelete="CASCADE")
    note: Optional[str] = None


class PurchasingRow(SQLModel, table=True):
    """The office's purchasing settings, one row: the base currency offers are compared in, and the
    handling margin in days between an order's arrival with the supplier's lead time and its
    delivery on board (null: kit's default). (Revision 0006.)"""

    __tablename__ = "purchasing"
    __table_args__ = (
        CheckConstraint("id = 1", name="one_row"),
        CheckConstraint("base_currency IS NULL OR length(base_currency) = 3", name="base_currency"),
        CheckConstraint("handling_days IS NULL OR (handling_days >= 0 AND handling_days <= 365)", name="handling_days"),
    )

    id: int = Field(default=1, primary_key=True)
    base_currency: Optional[str] = None
    handling_days: Optional[int] = None


class ExchangeRateRow(SQLModel, table=True):
    """One unit of ``currency`` is worth ``rate`` units of ``base``, as set on ``set_on`` and
    taken from ``source`` (a bank's reference rate, an invoice): kit fetches none. The rate in
    force on a day is the latest set on or before it. (Revision 0006.)"""

    __tablename__ = "exchange_rates"
    __table_args__ = (
        UniqueConstraint("currency", "base", "set_on"),
        CheckConstraint("length(currency) = 3 AND length(base) = 3 AND currency <> base", name="currencies"),
        CheckConstraint("rate > 0", name="rate"),
    )

    id: Optional[int] = Field(default=None, primary_key=True)
    currency: str
    base: str
    rate: float
    set_on: dt.date
    source: str


class DeliveryRow(SQLModel, table=True):
    """Where and when an order must be on board a vessel: the port and the day (revision 0006)."""

    __tablename__ = "deliveries"
    __table_args__ = (UniqueConstraint("vessel_id", "due_on"),)

    id: Optional[int] = Field(default=None, primary_key=True)
    vessel_id: str = Field(foreign_key="vessels.id", ondelete="CASCADE")
    port: str
    due_on: dt.date
    note: Optional[str] = None


class EnquiryRow(SQLModel, table=True):
    """An enquiry kit wrote (request for quotation): its reference, the supplier it asks (null: an
    open enquiry, for any supplier), the day it was written and the day a reply is asked by.
    (Revision 0007.)"""

    __tablename__ = "enquiries"

    id: str = Field(primary_key=True)
    supplier: Optional[str] = None
    written_on: dt.date
    reply_by: dt.date


class EnquiryLineRow(SQLModel, table=True):
    """One line of an enquiry: our line reference as the workbook shows it, the generic part it
    asks for, and the designation, quantity, standard, compound and service conditions written (a
    reply must hand them back unchanged). (Revision 0007; the last three, revision 0010.)"""

    __tablename__ = "enquiry_lines"
    __table_args__ = (CheckConstraint("quantity > 0", name="quantity"),)

    enquiry_id: str = Field(foreign_key="enquiries.id", ondelete="CASCADE", primary_key=True)
    line: int = Field(primary_key=True)
    ref: str = Field(sa_column_kwargs={"unique": True, "nullable": False})
    part_key: str
    designation: str
    quantity: float
    uom: str
    # the locked cells written beside the designation (revision 0010; null on older enquiries)
    standard: Optional[str] = None
    compound: Optional[str] = None
    service: Optional[str] = None


# The roles a person may hold on the office server (revision 0009; kit/engine/access.py says what each may do).
ROLES = ("administrator", "buyer", "vessel_keeper", "reader")


class PersonRow(SQLModel, table=True):
    """Someone who signs in to the office server: a login (kept in lower case), a name, one role and
    an argon2 hash of the password (never the password). A person who leaves is disabled, never
    deleted, so the audit trail keeps saying who did what. (Revision 0009.)"""

    __tablename__ = "people"
    __table_args__ = (CheckConstraint("role IN ('administrator', 'buyer', 'vessel_keeper', 'reader')", name="role"),
                      CheckConstraint("login = lower(login) AND length(login) >= 2", name="login"))

    id: Optional[int] = Field(default=None, primary_key=True)
    login: str = Field(sa_column_kwargs={"unique": True, "nullable": False})
    name: str
    role: str
    password_hash: str
    created_at: dt.datetime = Field(sa_type=DateTime)
    disabled_at: Optional[dt.datetime] = Field(default=None, sa_type=DateTime)


class PersonVesselRow(SQLModel, table=True):
    """A vessel a vessel keeper keeps (counts its stock and filter hours). (Revision 0009.)"""

    __tablename__ = "person_vessels"

    person_id: int = Field(foreign_key="people.id", ondelete="CASCADE", primary_key=True)
    vessel_id: str = Field(foreign_key="vessels.id", ondelete="CASCADE", primary_key=True)


class WebSessionRow(SQLModel, table=True):
    """A signed-in browser: the SHA-256 of its session cookie (the cookie itself is never stored),
    its person, its CSRF token, when it started and was last used, and when it ended (logout or
    expiry). Kept in the database so several servers share it. (Revision 0009.)"""

    __tablename__ = "web_sessions"

    id: str = Field(primary_key=True)
    person_id: int = Field(foreign_key="people.id", ondelete="CASCADE")
    csrf: str
    started_at: dt.datetime = Field(sa_type=DateTime)
    seen_at: dt.datetime = Field(sa_type=DateTime)
    ended_at: Optional[dt.datetime] = Field(default=None, sa_type=DateTime)


class LoginFailureRow(SQLModel, table=True):
    """A failed sign-in: the login tried (lower case), the client's address, when. Counted over a
    window to throttle guessing per account and per address. (Revision 0009.)"""

    __tablename__ = "login_failures"

    id: Optional[int] = Field(default=None, primary_key=True)
    login: str = Field(index=True)
    address: str = Field(index=True)
    at: dt.datetime = Field(sa_type=DateTime)


class AuditEventRow(SQLModel, table=True):
    """Who did what and when: the person (their login, or the command line's user), how (web or
    command line), the action, what it was done to, and the before and after as JSON text. kit only
    ever inserts these rows; the database refuses to update or delete them (triggers, revision 0009)."""

    __tablename__ = "audit_events"

    id: Optional[int] = Field(default=None, primary_key=True)
    at: dt.datetime = Field(sa_type=DateTime, index=True)
    person: str
    via: str
    action: str
    subject: str
    before: Optional[str] = Field(default=None, sa_type=Text)
    after: Optional[str] = Field(default=None, sa_type=Text)
