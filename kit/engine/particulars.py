# SPDX-License-Identifier: MIT
"""A vessel's particulars (a parsed TOML file) checked into plain dataclasses in SI units.

The file format is the scripting contract documented in the README. Every length, pressure,
flow, volume and time is a string with a unit that pint parses; bare numbers are refused so
that "280" can never be read as inches by one person and millimetres by another.

All values in the dataclasses are SI floats: m, Pa, m^3/s, m^3, s, rad.
"""

from __future__ import annotations

import datetime as dt
import math
from dataclasses import dataclass, replace
from typing import Any

from kit.errors import InputError
from kit.engine.rudder import POSITION_K3, PROFILE_K2, Rudder
from kit.engine.text_checks import CONTROL
from kit.engine.units import a_kind, to_si

# "chemical_tanker" and "gas_carrier" are cargo ships that SOLAS II-1/29.16 names beside tankers.
SHIP_TYPES = ("cargo", "passenger", "tanker", "chemical_tanker", "gas_carrier")
# Where the rudder carrier bearing is: a ram or cylinder gear needs a separate one; a rotary vane
# actuator may carry the rudder in its own housing.
RUDDER_CARRIERS = ("separate", "in_actuator")
ACTUATORS = ("ram", "rotary_vane", "cylinder")
FLUID_CATEGORIES = ("HL", "HM", "HV", "HG", "HH", "HR", "HETG", "HEES", "HEPG", "HEPR", "HFAE", "HFAS", "HFB", "HFC",
                    "HFDR", "HFDU")

# Plausibility limits: a value past these is a typing error, not a steering gear.
MAX_DIAMETER_M = 2.0
MAX_HOUSING_BORE_M = 6.0
MAX_STROKE_M = 5.0
MAX_PRESSURE_PA = 700e5
MAX_FILTER_RUN_S = 100_000 * 3600.0  # running hours since a filter change: over 11 years at 24 h a day
MAX_RUDDER_ANGLE_RAD = math.radians(70)
MIN_PUMP_FLOW_M3_S = 0.1e-3 / 60  # 0.1 L/min: below it a figure is a typing error, and a swing time unbounded
MAX_GROSS_TONNAGE = 1_000_000
MAX_COUNT = 1000  # rams, cylinders, pumps, elements, coils, hoses: past this, a typing error
MAX_TEXT = 200

_CONTROL = CONTROL  # C0, DEL and C1: the one check of every stored text (kit.engine.text_checks)


@dataclass(frozen=True)
class Fluid:
    """A hydraulic fluid by ISO 6743-4 category and ISO 3448 viscosity grade."""

    category: str
    grade: int

    def __str__(self) -> str:
        return f"{self.category} {self.grade}"


@dataclass(frozen=True)
class RamGeometry:
    """Ram (plunger) gear with a Rapson slide: ram diameter, stroke, tiller radius at midships;
    optionally the bore the gland spigot's O-ring seals against (from the maker's drawing)."""

    ram_diameter: float
    stroke: float
    tiller_radius: float | None
    gland_spigot_bore: float | None = None


@dataclass(frozen=True)
class CylinderGeometry:
    """Double-acting cylinders: bore, rod, stroke and (for steering) the tiller radius; optionally
    the trunnion distance (trunnion axis to tiller pin at midships) for the exact geometry."""

    bore: float
    rod: float
    stroke: float
    tiller_radius: float | None
    trunnion_distance: float | None = None


@dataclass(frozen=True)
class VaneGeometry:
    """Rotary vane actuator: moving vanes (fixed vanes are as many) and the chamber geometry."""

    vanes: int
    vane_height: float
    housing_bore: float
    hub_diameter: float
    stock_diameter: float
    vane_angle: float | None = None  # rad each vane (moving or fixed) takes up around the stock axis


@dataclass(frozen=True)
class FilterPosition:
    position: str
    elements: int
    change_interval: float  # s
    duty_hours_per_day: float = 24.0
    element_ref: str | None = None
    run_since_change: float | None = None  # s the element in place has run since it was changed; None: not known
    run_read_on: dt.date | None = None  # the day that figure was read; None: not stated


@dataclass(frozen=True)
class Pipe:
    outside_diameter: float
    wall: float
    length: float

    @property
    def inside_diameter(self) -> float:
        return self.outside_diameter - 2 * self.wall


@dataclass(frozen=True)
class StatedHousing:
    """A seal housing as the maker's drawing gives it; it wins over the series."""

    role: str
    d: float
    D: float
    L: float


@dataclass(frozen=True)
class SolenoidCoils:
    voltage: str
    count: int


@dataclass(frozen=True)
class Hose:
    bore: float
    count: int


@dataclass(frozen=True)
class Unit:
    id: str
    service: str
    actuator: str
    count: int
    working_pressure: float
    fluid: Fluid
    pumps: int
    pump_flow: float
    reservoir: float
    geometry: RamGeometry | CylinderGeometry | VaneGeometry
    max_rudder_angle: float | None = None
    system_oil: float | None = None
    oil_leakage: float | None = None
    isolation_valves: bool = False
    pump_model: str | None = None
    valve_blocks: int = 1
    filters: tuple[FilterPosition, ...] = ()
    pipes: tuple[Pipe, ...] = ()
    housings: tuple[StatedHousing, ...] = ()
    solenoids: tuple[SolenoidCoils, ...] = ()
    hoses: tuple[Hose, ...] = ()
    rudder: Rudder | None = None
    rudder_carrier: str | None = None  # RUDDER_CARRIERS; None for a rotary vane gear that does not say
    stock_diameter: float | None = None  # rudder stock at the tiller (SOLAS II-1/29.3.3, 29.4.3)
    max_working_pressure: float | None = None  # Pa, the most the gear sees in service (SOLAS II-1/29.2.2)
    design_pressure: float | None = None  # Pa (SOLAS II-1/29.2.2, 29.2.3)
    # As the name plates give them, for the lines a supplier quotes (policy items name them).
    maker: str | None = None  # the gear's (or unit's) maker and model
    model: str | None = None
    pump_maker: str | None = None  # the pump's maker; its model is pump_model
    valve_maker: str | None = None  # the valve block's maker and model
    valve_model: str | None = None

    @property
    def is_steering(self) -> bool:
        return self.service == "steering"


@dataclass(frozen=True)
class Vessel:
    id: str
    name: str
    ship_type: str
    gross_tonnage: float
    units: tuple[Unit, ...]
    company: str | None = None
    source: str = ""


# --- reading -------------------------------------------------------------------------------


class _Reader:
    """Reads one table of the file, remembering where it is for the error messages."""

    def __init__(self, table: Any, source: str, path: str):
        if not isinstance(table, dict):
            raise InputError(source, path or "file", "a table", got=type(table).__name__)
        self.table = table
        self.source = source
        self.path = path
        self.used: set[str] = set()

    def _name(self, key: str) -> str:
        return f"{self.path}.{key}" if self.path else key

    def has(self, key: str) -> bool:
        return key in self.table

    def raw(self, key: str, default: Any = ...) -> Any:
        self.used.add(key)
        if key not in self.table:
            if default is ...:
                raise InputError(self.source, self._name(key), "a value (field is required)", got="nothing")
            return default
        return self.table[key]

    def text(self, key: str, default: Any = ..., choices: tuple[str, ...] | None = None) -> str:
        value = self.raw(key, default)
        if value is default and default is not ...:
            return value
        if not isinstance(value, str) or not value.strip():
            raise InputError(self.source, self._name(key), "a non-empty string", got=repr(value))
        if len(value) > MAX_TEXT or _CONTROL.search(value):
            # A NUL cannot be stored in PostgreSQL text; a newline or tab would break the one-line reports.
            raise InputError(self.source, self._name(key), f"one line of at most {MAX_TEXT} characters, no control characters",
                             got=repr(value[:40] + ("..." if len(value) > 40 else "")))
        value = value.strip()
        if choices and value not in choices:
            raise InputError(self.source, self._name(key), "one of " + ", ".join(choices), got=repr(value))
        return value

    def integer(self, key: str, default: Any = ..., minimum: int = 0, maximum: int = MAX_COUNT) -> int:
        value = self.raw(key, default)
        if value is default and default is not ...:
            return value
        if isinstance(value, bool) or not isinstance(value, int) or not minimum <= value <= maximum:
            bound = f"at most {maximum}" if isinstance(value, int) and value > maximum else f"at least {minimum}"
            raise InputError(self.source, self._name(key), f"a whole number of {bound}", got=repr(value))
        return value

    def number(self, key: str, default: Any = ..., minimum: float = 0.0, maximum: float = math.inf) -> float:
        value = self.raw(key, default)
        if value is default and default is not ...:
            return value
        if (isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value)
                or not minimum <= value <= maximum):
            over = isinstance(value, (int, float)) and not isinstance(value, bool) and value > maximum
            bound = f"at most {maximum:g}" if over else f"at least {minimum:g}"
            raise InputError(self.source, self._name(key), f"a number of {bound}", got=repr(value))
        return float(value)

    def quantity(self, key: str, kind: str, default: Any = ..., *, positive: bool = True,
                 maximum: float | None = None, max_text: str = "", minimum: float | None = None,
                 min_text: str = "") -> float:
        value = self.raw(key, default)
        if value is default and default is not ...:
            return value
        si = to_si(value, kind, source=self.source, field=self._name(key))
        if positive and si <= 0:
            raise InputError(self.source, self._name(key), f"a positive {kind}", got=repr(value))
        if not positive and si < 0:
            raise InputError(self.source, self._name(key), f"{a_kind(kind)} of zero or more", got=repr(value))
        if maximum is not None and si > maximum:
            raise InputError(self.source, self._name(key), f"{a_kind(kind)} of at most {max_text}", got=repr(value))
        if minimum is not None and si < minimum:
            raise InputError(self.source, self._name(key), f"{a_kind(kind)} of at least {min_text}", got=repr(value))
        return si

    def boolean(self, key: str, default: bool) -> bool:
        value = self.raw(key, default)
        if not isinstance(value, bool):
            raise InputError(self.source, self._name(key), "true or false", got=repr(value))
        return value

    def tables(self, key: str) -> list[_Reader]:
        value = self.raw(key, [])
        if not isinstance(value, list):
            raise InputError(self.source, self._name(key), "an array of tables ([[...]])", got=type(value).__name__)
        return [_Reader(item, self.source, f"{self._name(key)}[{i}]") for i, item in enumerate(value)]

    def finish(self) -> None:
        """Refuse keys nobody read: a typo must not silently drop a value."""
        unknown = sorted(set(self.table) - self.used)
        if unknown:
            raise InputError(self.source, self._name(unknown[0]), "a known field (see the README's particulars format)", got="an unknown field")


def parse_fluid(text: str, source: str, field_name: str) -> Fluid:
    """Parse ``"HM 46"``: ISO 6743-4 category then ISO 3448 grade."""
    from kit.engine.oil_grades import ISO_3448_GRADES

    parts = text.replace("-", " ").split()
    want = 'an ISO 6743-4 category and ISO 3448 grade, e.g. "HM 46"'
    if len(parts) != 2 or parts[0].upper() not in FLUID_CATEGORIES:
        raise InputError(source, field_name, want, got=repr(text))
    grade_text = parts[1].upper().removeprefix("VG")
    if not (grade_text.isascii() and grade_text.isdigit()) or int(grade_text) not in ISO_3448_GRADES:  # "²" is a digit too
        raise InputError(source, field_name, "an ISO 3448 viscosity grade (e.g. 32, 46, 68)", got=repr(parts[1]))
    return Fluid(parts[0].upper(), int(grade_text))


def _geometry(r: _Reader, actuator: str, steering: bool) -> RamGeometry | CylinderGeometry | VaneGeometry:
    dmax, dtext = MAX_DIAMETER_M, "2 m"
    if actuator == "ram":
        tiller = r.quantity("tiller_radius", "length", maximum=5.0, max_text="5 m") if steering else r.quantity("tiller_radius", "length", None)
        ram = RamGeometry(
            ram_diameter=r.quantity("ram_diameter", "length", maximum=dmax, max_text=dtext),
            stroke=r.quantity("stroke", "length", maximum=MAX_STROKE_M, max_text="5 m"),
            tiller_radius=tiller,
            gland_spigot_bore=r.quantity("gland_spigot_bore", "length", None, maximum=dmax, max_text=dtext),
        )
        if ram.gland_spigot_bore is not None and ram.gland_spigot_bore <= ram.ram_diameter:
            raise InputError(r.source, r._name("gland_spigot_bore"), "a spigot bore larger than the ram diameter",
                             got=r.table.get("gland_spigot_bore"))
        return ram
    if actuator == "cylinder":
        bore = r.quantity("bore", "length", maximum=dmax, max_text=dtext)
        rod = r.quantity("rod", "length", maximum=dmax, max_text=dtext)
        if rod >= bore:
            raise InputError(r.source, r._name("rod"), "a rod diameter smaller than the bore", got=r.table.get("rod"))
        tiller = r.quantity("tiller_radius", "length", maximum=5.0, max_text="5 m") if steering else r.quantity("tiller_radius", "length", None)
        stroke = r.quantity("stroke", "length", maximum=MAX_STROKE_M, max_text="5 m")
        trunnion = r.quantity("trunnion_distance", "length", None, maximum=2 * MAX_STROKE_M, max_text="10 m")
        if trunnion is not None and trunnion <= stroke / 2:
            # At midships the piston is near mid-stroke: the rod alone stands out about half the stroke.
            raise InputError(r.source, r._name("trunnion_distance"), "a trunnion distance longer than half the stroke",
                             got=r.table.get("trunnion_distance"))
        return CylinderGeometry(bore, rod, stroke, tiller, trunnion)
    housing = r.quantity("housing_bore", "length", maximum=MAX_HOUSING_BORE_M, max_text="6 m")
    hub = r.quantity("hub_diameter", "length", maximum=MAX_HOUSING_BORE_M, max_text="6 m")
    stock = r.quantity("stock_diameter", "length", maximum=MAX_HOUSING_BORE_M, max_text="6 m")
    if hub >= housing:
        raise InputError(r.source, r._name("hub_diameter"), "a hub diameter smaller than the housing bore", got=r.table.get("hub_diameter"))
    if stock >= hub:
        raise InputError(r.source, r._name("stock_diameter"), "a stock diameter smaller than the hub diameter", got=r.table.get("stock_diameter"))
    vanes = r.integer("vanes", minimum=1)
    if vanes > 6:
        raise InputError(r.source, r._name("vanes"), "1 to 6 moving vanes", got=repr(vanes))
    return VaneGeometry(vanes, r.quantity("vane_height", "length", maximum=MAX_STROKE_M, max_text="5 m"), housing, hub, stock,
                        r.quantity("vane_angle", "angle", None, maximum=math.pi / vanes, max_text="180 deg / vanes"))


def _unit(r: _Reader) -> Unit:
    service = r.text("service")
    steering = service == "steering"
    actuator = r.text("actuator", choices=ACTUATORS)
    count = r.integer("count", minimum=1)
    if actuator == "rotary_vane" and count != 1:
        raise InputError(r.source, r._name("count"), "1 for a rotary vane actuator", got=repr(count))
    if steering and actuator in ("ram", "cylinder") and count % 2:
        raise InputError(r.source, r._name("count"), "an even number of rams or cylinders on a steering gear (they work in pairs)", got=repr(count))
    fluid = parse_fluid(r.text("fluid"), r.source, r._name("fluid"))
    unit = Unit(
        id=r.text("id"),
        service=service,
        actuator=actuator,
        count=count,
        max_rudder_angle=(r.quantity("max_rudder_angle", "angle", maximum=MAX_RUDDER_ANGLE_RAD, max_text="70 deg")
                          if steering else r.quantity("max_rudder_angle", "angle", None)),
        working_pressure=r.quantity("working_pressure", "pressure", maximum=MAX_PRESSURE_PA, max_text="700 bar"),
        fluid=fluid,
        pumps=r.integer("pumps", minimum=1),
        pump_flow=r.quantity("pump_flow", "flow", minimum=MIN_PUMP_FLOW_M3_S, min_text="0.1 L/min"),
        reservoir=r.quantity("reservoir", "volume"),
        system_oil=r.quantity("system_oil", "volume", None),
        oil_leakage=r.quantity("oil_leakage", "flow", None, positive=False),
        isolation_valves=r.boolean("isolation_valves", False),
        pump_model=r.text("pump_model", None),
        maker=r.text("maker", None),
        model=r.text("model", None),
        pump_maker=r.text("pump_maker", None),
        valve_maker=r.text("valve_maker", None),
        valve_model=r.text("valve_model", None),
        valve_blocks=r.integer("valve_blocks", 1, minimum=0),
        geometry=_geometry(r, actuator, steering),
        filters=tuple(_filter(f) for f in r.tables("filter")),
        pipes=tuple(_pipe(p) for p in r.tables("pipe")),
        housings=tuple(_housing(h) for h in r.tables("housing")),
        solenoids=tuple(_solenoid(s) for s in r.tables("solenoid")),
        hoses=tuple(_hose(h) for h in r.tables("hose")),
        rudder=_rudder(r) if steering else None,
        rudder_carrier=_rudder_carrier(r, actuator, steering),
        stock_diameter=(None if actuator == "rotary_vane"
                        else r.quantity("stock_diameter", "length", None, maximum=MAX_DIAMETER_M, max_text="2 m")),
        max_working_pressure=r.quantity("max_working_pressure", "pressure", None, maximum=MAX_PRESSURE_PA, max_text="700 bar"),
        design_pressure=r.quantity("design_pressure", "pressure", None, maximum=MAX_PRESSURE_PA, max_text="700 bar"),
    )
    r.finish()
    if isinstance(unit.geometry, VaneGeometry):
        unit = replace(unit, stock_diameter=unit.geometry.stock_diameter)
        if unit.max_rudder_angle is not None:
            _check_vane_swing(r, unit.geometry, unit.max_rudder_angle)
    return unit


def _rudder_carrier(r: _Reader, actuator: str, steering: bool) -> str | None:
    """Where the rudder carrier is: always separate on a ram or cylinder gear; stated or unknown on a rotary vane."""
    if not steering:
        return None
    if actuator != "rotary_vane":
        r.text("rudder_carrier", "separate", choices=("separate",))
        return "separate"
    return r.text("rudder_carrier", None, choices=RUDDER_CARRIERS)


def _rudder(unit_reader: _Reader) -> Rudder | None:
    """The optional ``[unit.rudder]`` table (see ``kit.engine.rudder`` for what each figure feeds)."""
    if not unit_reader.has("rudder"):
        return None
    r = _Reader(unit_reader.raw("rudder"), unit_reader.source, unit_reader._name("rudder"))
    area = r.quantity("area", "area", maximum=200.0, max_text="200 m^2")
    height = r.quantity("mean_height", "length", maximum=30.0, max_text="30 m")
    forward = r.quantity("area_forward", "area", positive=False)
    if forward >= area / 2:
        # A balanced rudder carries well under half its area ahead of the stock.
        raise InputError(r.source, r._name("area_forward"), "an area forward of the stock axis less than half the rudder area",
                         got=r.table.get("area_forward"))
    speed_max, speed_text = 40 * 1852 / 3600, "40 kn"
    rudder = Rudder(area, height, forward,
                    r.quantity("ahead_speed", "speed", maximum=speed_max, max_text=speed_text),
                    r.text("profile", choices=tuple(PROFILE_K2)), r.text("position", choices=tuple(POSITION_K3)),
                    r.quantity("astern_speed", "speed", None, maximum=speed_max, max_text=speed_text))
    r.finish()
    return rudder


def _check_vane_swing(r: _Reader, g: VaneGeometry, max_angle: float) -> None:
    """Refuse a rotary vane gear whose chambers cannot swing from hard over to hard over.

    Between two fixed vanes there is room for 360/n deg; the moving vane in it and the fixed vane
    take up their own angles, so the moving vane swings at most 360/n - 2 x vane_angle
    (``kit.engine.physics.vane_free_swing``). It must swing 2 x the maximum rudder angle.
    """
    from kit.engine.physics import vane_free_swing

    free = vane_free_swing(g)
    if free < 2 * max_angle - 1e-9:
        widths = f" less 2 x vane_angle {math.degrees(g.vane_angle):g} deg" if g.vane_angle else ""
        raise InputError(r.source, r._name("vanes"),
                         f"vanes whose chambers can swing 2 x max_rudder_angle = {2 * math.degrees(max_angle):g} deg "
                         f"({g.vanes} moving vanes leave each at most 360/{g.vanes} deg{widths} = {math.degrees(free):.1f} deg)",
                         got=repr(g.vanes))


def _filter(r: _Reader) -> FilterPosition:
    duty = _duty(r)
    f = FilterPosition(
        position=r.text("position"),
        elements=r.integer("elements", minimum=1),
        change_interval=r.quantity("change_interval", "time"),
        duty_hours_per_day=duty,
        element_ref=r.text("element", None),
        run_since_change=r.quantity("hours_since_change", "time", None, positive=False,
                                    maximum=MAX_FILTER_RUN_S, max_text=f"{MAX_FILTER_RUN_S / 3600:,.0f} h"),
        run_read_on=_read_on(r, "hours_read_on"),
    )
    if f.run_read_on is not None and f.run_since_change is None:
        raise InputError(r.source, r._name("hours_since_change"), "the running hours the date hours_read_on is for",
                         got="a date without hours")
    r.finish()
    return f


def _read_on(r: _Reader, key: str) -> dt.date | None:
    """A date (TOML date, a workbook's date cell or YYYY-MM-DD), not after today."""
    value = r.raw(key, None)
    if value is None:
        return None
    day = value.date() if isinstance(value, dt.datetime) else value
    if isinstance(day, str):
        try:
            day = dt.date.fromisoformat(day.strip()) if len(day.strip()) == 10 else None
        except ValueError:
            day = None
    if not isinstance(day, dt.date) or day > dt.date.today():
        raise InputError(r.source, r._name(key), f"a date, YYYY-MM-DD, not after today ({dt.date.today().isoformat()})",
                         got=repr(value))
    return day


def _duty(r: _Reader) -> float:
    """Running hours a day: a bare number (hours a day) or a time per time such as "12 h/day"."""
    value = r.raw("duty", 24.0)
    want = 'running hours a day between 0 and 24, e.g. "12 h/day" or 12'
    if isinstance(value, str):
        running, slash, per = value.partition("/")
        if not slash or not per.strip():
            raise InputError(r.source, r._name("duty"), want, got=repr(value))
        hours = to_si(running.strip(), "time", source=r.source, field=r._name("duty")) / 3600
        hours /= to_si("1 " + per.strip(), "time", source=r.source, field=r._name("duty")) / 86400
    else:
        hours = r.number("duty", 24.0)
    if not 0 <= hours <= 24 + 1e-9:
        raise InputError(r.source, r._name("duty"), want, got=repr(value))
    return min(hours, 24.0)


def _pipe(r: _Reader) -> Pipe:
    p = Pipe(r.quantity("outside_diameter", "length", maximum=1.0, max_text="1 m"),
             r.quantity("wall", "length"), r.quantity("length", "length", maximum=1000.0, max_text="1000 m"))
    if p.inside_diameter <= 0:
        raise InputError(r.source, r._name("wall"), "a wall thinner than half the outside diameter", got=r.table.get("wall"))
    r.finish()
    return p


def _housing(r: _Reader) -> StatedHousing:
    from kit.engine.housings import STATED_ROLES

    h = StatedHousing(r.text("role", choices=STATED_ROLES), r.quantity("d", "length", maximum=MAX_HOUSING_BORE_M, max_text="6 m"),
                      r.quantity("D", "length", maximum=MAX_HOUSING_BORE_M, max_text="6 m"), r.quantity("L", "length", maximum=1.0, max_text="1 m"))
    if h.d >= h.D:
        raise InputError(r.source, r._name("d"), "d smaller than D", got=r.table.get("d"))
    r.finish()
    return h


def _solenoid(r: _Reader) -> SolenoidCoils:
    s = SolenoidCoils(r.text("voltage"), r.integer("count", minimum=1))
    r.finish()
    return s


def _hose(r: _Reader) -> Hose:
    h = Hose(r.quantity("bore", "length", maximum=0.5, max_text="500 mm"), r.integer("count", minimum=1))
    r.finish()
    return h


def vessel_from_dict(data: Any, source: str = "") -> Vessel:
    """Build a :class:`Vessel` from the parsed TOML document ``data``."""
    top = _Reader(data, source, "")
    company = None
    if top.has("company"):
        c = _Reader(top.raw("company"), source, "company")
        company = c.text("name")
        c.finish()
    v = _Reader(top.raw("vessel"), source, "vessel")
    vid = v.text("id")
    name = v.text("name")
    ship_type = v.text("ship_type", choices=SHIP_TYPES)
    gt = v.number("gross_tonnage", minimum=1, maximum=MAX_GROSS_TONNAGE)
    v.finish()
    units = tuple(_unit(u) for u in top.tables("unit"))
    if not units:
        raise InputError(source, "unit", "at least one [[unit]] table", got="none")
    seen: set[str] = set()
    for i, u in enumerate(units):
        if u.id in seen:
            raise InputError(source, f"unit[{i}].id", "a unit id not used before in this file", got=repr(u.id))
        seen.add(u.id)
    top.finish()
    return Vessel(vid, name, ship_type, gt, units, company, source)
