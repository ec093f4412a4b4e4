# SPDX-License-Identifier: MIT
"""The seal kit of one actuator: every seal with its housing, quantity and compound.

What an actuator carries (per actuator; common practice for the counts):

* ram (a plunger): at the ram diameter one rod seal, one wiper, two guide rings (rod side), and
  one static O-ring on the gland spigot. The spigot's bore is ``gland_spigot_bore`` when the
  particulars give it (the maker's drawing); otherwise kit assumes the next ISO 3320 cylinder bore
  above the gland's seal housings (the spigot must clear the housings cut in the gland, and the
  cylinder mouth it enters is a cylinder bore), and says so in a warning;
* double-acting cylinder: at the bore one piston seal and two piston guide rings; at the rod one
  rod seal, one wiper and one guide ring; two static O-rings at the bore (head-end cover and gland);
* rotary vane (the whole actuator): a seal strip on every moving and every fixed vane
  (2 x vanes strips of length h + 2 (R - r)), a static O-ring or cord on each of the two covers at
  the housing bore, and a rotary seal at the stock and at the hub in each cover, labelled for
  oscillating service (sized by the ISO 5597 rod proportions; ISO 5597 is for reciprocating seals).

A series size past its standard's scope is kit's extrapolation: the line says so and a warning
names the part (ram, rod, bore, stock, hub).

A housing stated in the particulars (the maker's drawing) wins over the series; every line says
where its dimensions came from.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from kit.engine import compounds, housings, orings, series
from kit.errors import OutOfSeriesError
from kit.engine.housings import Housing
from kit.engine.particulars import CylinderGeometry, RamGeometry, StatedHousing, Unit, VaneGeometry

DRAWING = "maker's drawing (stated in the particulars)"


@dataclass(frozen=True)
class SealLine:
    """One seal of the kit. ``housing`` is None for a vane strip or where no series size exists."""

    role: str  # piston, rod, wiper, guide, o-ring, vane, stock
    part: str  # what it is, e.g. "ram gland rod seal"
    qty_per_actuator: int
    housing: Housing | None
    compound: str
    oring: orings.ORingFit | None = None
    strip_length_mm: float | None = None
    strip_height_mm: float | None = None


@dataclass
class SealKit:
    unit_id: str
    actuators: int  # how many actuators carry this kit
    lines: list[SealLine] = field(default_factory=list)
    warnings: list[str] = field(default_factory=list)


def _stated(unit: Unit, role: str) -> StatedHousing | None:
    return next((h for h in unit.housings if h.role == role), None)


def _housing(unit: Unit, role: str, build, nominal_mm: float, kit: SealKit, what: str = "") -> Housing | None:
    stated = _stated(unit, role)
    if stated:
        d, D, L = (mm(x) for x in (stated.d, stated.D, stated.L))
        extra = {}
        if role == "guide":
            t = (D - d) / 2
            extra = {"t": t, "cut": round(housings.guide_cut_length(d + t), 1)}
        return Housing(role, d, D, L, "maker's drawing", DRAWING, extra, "rod" if role == "guide" else "")
    return _from_series(build, nominal_mm, kit, what or f"{role} housing")


def _from_series(build, nominal_mm: float, kit: SealKit, what: str):
    """``build(nominal_mm)``, or None with a warning when the size lies outside the series; a
    warning too when the size is past the standard's scope (kit's extrapolation)."""
    try:
        built = build(nominal_mm)
    except OutOfSeriesError as exc:
        kit.warnings.append(f"{what}: {exc}; take its dimensions from the maker's drawing")
        return None
    if getattr(built, "past_scope", ""):
        kit.warnings.append(f"{what}: {nominal_mm:g} mm is past the standard's scope ({built.past_scope}); sized by the "
                            "series' proportions as kit's extrapolation, not an ISO size: take its dimensions from the "
                            "maker's drawing")
    return built


def mm(metres: float) -> float:
    """Metres to mm, rounded to a micrometre so that 0.7 m is 700 mm and not 700.0000000000001."""
    return round(metres * 1000.0, 3)


def _next_bore_above(mm: float) -> float:
    above = [b for b in sorted(series.BORES_MM) if b > mm]
    return above[0] if above else mm * 1.1


def build_seal_kit(unit: Unit, housing_length: str = "medium", stated_compound: str | None = None) -> SealKit:
    """The seal kit of one actuator of ``unit``, with the warnings met on the way."""
    g = unit.geometry
    dyn = compounds.choose(unit.fluid.category, "dynamic", stated_compound)
    sta = compounds.choose(unit.fluid.category, "static", None)
    guide_compound = "fabric-reinforced resin"  # common practice: insensitive to the H-family fluids
    kit = SealKit(unit.id, 1 if isinstance(g, VaneGeometry) else unit.count)
    kit.warnings += [c.warning for c in (dyn, sta) if c.warning]
    rod = lambda d: housings.rod_seal_housing(d, housing_length)  # noqa: E731
    piston = lambda d: housings.piston_seal_housing(d, housing_length)  # noqa: E731

    def add(role, part, qty, housing, compound, **kw):
        if housing is not None or kw.get("oring") is not None or kw.get("strip_length_mm") is not None:
            kit.lines.append(SealLine(role, part, qty, housing, compound, **kw))

    if isinstance(g, RamGeometry):
        d = mm(g.ram_diameter)
        w = series.check("rod", g.ram_diameter).warning()
        if w:
            kit.warnings.append(w.replace("rod ", "ram ", 1))
        rod_h = _housing(unit, "rod", rod, d, kit, "ram rod seal housing")
        add("rod", "ram gland rod seal", 1, rod_h, dyn.compound)
        wiper_h = _housing(unit, "wiper", housings.wiper_housing, d, kit, "ram wiper housing")
        add("wiper", "ram gland wiper", 1, wiper_h, dyn.compound)
        guide_h = _guide(unit, d, "rod", kit, "ram guide ring housing")
        add("guide", "ram gland guide ring", 2, guide_h, guide_compound)
        if g.gland_spigot_bore is not None:
            spigot = mm(g.gland_spigot_bore)
            part = f"gland spigot O-ring (spigot bore {spigot:g} mm from the particulars)"
        else:
            spigot = _next_bore_above(max((h.D for h in (rod_h, wiper_h, guide_h) if h), default=d))
            part = f"gland spigot O-ring (assumed spigot bore {spigot:g} mm: next ISO 3320 bore above the gland housings)"
            kit.warnings.append(f"gland spigot O-ring sized on an assumed spigot bore of {spigot:g} mm (the next ISO 3320 "
                                "bore above the gland's seal housings); state gland_spigot_bore from the maker's drawing")
        fit = _from_series(orings.static_oring, spigot, kit, "gland O-ring")
        add("o-ring", part, 1, None, sta.compound, oring=fit)
    elif isinstance(g, CylinderGeometry):
        bore, rd = mm(g.bore), mm(g.rod)
        for kind, size in (("bore", g.bore), ("rod", g.rod)):
            w = series.check(kind, size).warning()
            if w:
                kit.warnings.append(w)
        add("piston", "piston seal", 1, _housing(unit, "piston", piston, bore, kit, "cylinder bore piston seal housing"), dyn.compound)
        add("guide", "piston guide ring", 2, _guide(unit, bore, "piston", kit, "cylinder bore guide ring housing"), guide_compound)
        add("rod", "rod seal", 1, _housing(unit, "rod", rod, rd, kit, "cylinder rod seal housing"), dyn.compound)
        add("wiper", "wiper", 1, _housing(unit, "wiper", housings.wiper_housing, rd, kit, "cylinder rod wiper housing"), dyn.compound)
        add("guide", "rod guide ring", 1, _guide(unit, rd, "rod", kit, "cylinder rod guide ring housing"), guide_compound)
        add("o-ring", "end cover and gland O-ring", 2, None, sta.compound, oring=_from_series(orings.static_oring, bore, kit, "cover O-ring"))
    else:
        big_r, small_r = mm(g.housing_bore) / 2, mm(g.hub_diameter) / 2
        h = mm(g.vane_height)
        add("vane", "vane seal strip (moving and fixed vanes)", 2 * g.vanes, None, dyn.compound,
            strip_length_mm=round(h + 2 * (big_r - small_r), 1), strip_height_mm=h)
        add("o-ring", "cover O-ring (upper and lower cover)", 2, None, sta.compound,
            oring=_from_series(orings.static_oring, mm(g.housing_bore), kit, "cover O-ring"))
        oscillating = lambda d: housings.oscillating_seal_housing(d, housing_length)  # noqa: E731
        add("stock", "stock seal, oscillating service (upper and lower)", 2,
            _housing(unit, "stock", oscillating, mm(g.stock_diameter), kit, "stock seal housing"), dyn.compound)
        add("stock", "hub seal, oscillating service (upper and lower cover)", 2,
            _from_series(oscillating, mm(g.hub_diameter), kit, "hub seal housing"), dyn.compound)
    return kit


def _guide(unit: Unit, nominal: float, side: str, kit: SealKit, what: str) -> Housing | None:
    if side == "rod":
        return _housing(unit, "guide", lambda x: housings.guide_housing(x, "rod"), nominal, kit, what)
    return _from_series(lambda x: housings.guide_housing(x, "piston"), nominal, kit, what)
