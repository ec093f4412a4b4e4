# SPDX-License-Identifier: MIT
"""Sister ships as a series of hulls: which vessels of an order are built alike, and each order
line's quantity per hull.

Two vessels are hulls of one series when everything kit works their spares out from is the same
apart from who they are:

- the same ship type and gross tonnage;
- the same units in the same order, each equal in every particular: unit id, service, actuator
  and count, geometry (bores, rods, rams, vanes, strokes, tiller radius), pressures, fluid, pumps
  and flow, reservoir and oil figures, valve blocks, makers and models, rudder and rudder carrier,
  filters (position, elements, change interval, duty, element reference), pipes, stated housings,
  solenoid coils and hoses;
- the same spares policy (its content; its name and where it was read from do not matter).

Left out: the vessel's id, name and company, the file it came from, and each filter's running
hours since its last change and the date they were read (the state of the element in place,
not the design). Hulls whose filters have run different hours are still a series; their filter
lines simply need different quantities.

A series has two hulls or more; it is named after its first hull in the order's vessel order.
A part a unit keeps as its own (a filter element with no maker's reference, a valve block seal
kit with no block maker and model, the rudder carrier's seals and wear parts) has the vessel's id
in its part key; in a series the hulls' units are alike, so each hull's own part is the same part
as the first hull's and takes its key (:func:`shared_keys`).

A line gives ``hulls`` and ``per_hull`` (:func:`per_hull`) only when its vessels are exactly the
hulls of one series and every hull needs the same quantity. A vessel built to other particulars
(one different bore) is not of the series: the lines it shares with the series, and its own, carry
no per-hull figure (the Vessel split says what each vessel needs), while the lines only the series
needs keep theirs.

Pure: results in (:class:`kit.engine.requirements.VesselResult`), plain values out.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass
from typing import Mapping, Sequence

from kit.engine.particulars import Unit, Vessel
from kit.engine.requirements import VesselResult
from kit.engine.spares import Policy

EPS = 1e-9


@dataclass(frozen=True)
class HullSeries:
    """Vessels built alike: ``hulls`` their ids in the order's vessel order (two or more), the
    first naming the series."""

    hulls: tuple[str, ...]

    @property
    def lead(self) -> str:
        return self.hulls[0]


def _unit_design(unit: Unit) -> Unit:
    """``unit`` without its filters' running hours and the date they were read."""
    filters = tuple(dataclasses.replace(f, run_since_change=None, run_read_on=None) for f in unit.filters)
    return dataclasses.replace(unit, filters=filters)


def design_of(vessel: Vessel, policy: Policy) -> str:
    """What makes hulls alike (module docstring), as text: equal text, the same design.

    ``repr`` of the frozen dataclasses holds every field (floats written so they read back
    exactly), so two designs compare field by field without the values having to be hashable."""
    units = tuple(_unit_design(u) for u in vessel.units)
    return repr((vessel.ship_type, vessel.gross_tonnage, units, dataclasses.replace(policy, name="", source="")))


def find_series(results: Sequence[VesselResult]) -> list[HullSeries]:
    """The series among ``results`` (vessels worked out over the same period), in the order of
    their first hulls; a vessel like no other is in none."""
    groups: dict[str, list[str]] = {}
    for r in results:
        groups.setdefault(design_of(r.vessel, r.policy), []).append(r.vessel.id)
    return [HullSeries(tuple(ids)) for ids in groups.values() if len(ids) > 1]


def shared_keys(results: Sequence[VesselResult], series: Sequence[HullSeries]) -> dict[tuple[str, str], str]:
    """(vessel id, part key) -> the first hull's part key, for each hull's own parts (keys holding
    the vessel's id) that are the first hull's part on a hull alike. Lines are paired in order,
    unit by unit; a hull whose lines do not pair (kind, unit, role, unit of measure) keeps its keys."""
    by_id = {r.vessel.id: r for r in results}
    found: dict[tuple[str, str], str] = {}
    for s in series:
        lead = by_id[s.lead].lines
        for hull in s.hulls[1:]:
            lines = by_id[hull].lines
            if len(lines) != len(lead) or any((a.kind, a.unit_id, a.role, a.uom) != (b.kind, b.unit_id, b.role, b.uom)
                                              for a, b in zip(lead, lines)):
                continue
            found.update({(hull, b.key): a.key for a, b in zip(lead, lines) if a.key != b.key})
    return found


def series_designation(designation: str, lead: str) -> str:
    """The first hull's own part named as every hull's: "vessel X" -> "each hull of the X series"."""
    return designation.replace(f"vessel {lead}", f"each hull of the {lead} series")


def per_hull(split: Mapping[str, float], series: Sequence[HullSeries]) -> tuple[int, float] | None:
    """(hulls, quantity per hull) of a line needed by the vessels of ``split`` (vessel id ->
    quantity): when they are exactly the hulls of one series, each needing the same quantity;
    else None."""
    vessels = set(split)
    for s in series:
        if vessels == set(s.hulls):
            first = split[s.lead]
            if all(abs(q - first) <= EPS * max(1.0, abs(first)) for q in split.values()):
                return len(s.hulls), first
            return None
    return None
