# SPDX-License-Identifier: MIT
"""Particulars dicts for the engine tests: one invented steering unit of each actuator kind.

Every value is a string with a unit, as in a particulars file; ``vessel`` wraps units into a
vessel dict that :func:`kit.engine.particulars.vessel_from_dict` reads.
"""

from __future__ import annotations

from typing import Any

from kit.engine.particulars import Vessel, vessel_from_dict


def ram_unit(**over: Any) -> dict[str, Any]:
    unit = {
        "id": "SG1", "service": "steering", "actuator": "ram", "count": 2,
        "ram_diameter": "280 mm", "stroke": "900 mm", "tiller_radius": "600 mm",
        "max_rudder_angle": "35 deg", "working_pressure": "160 bar", "fluid": "HM 46",
        "pumps": 2, "pump_flow": "120 L/min", "reservoir": "300 L",
    }
    unit.update(over)
    return unit


def cylinder_unit(**over: Any) -> dict[str, Any]:
    unit = {
        "id": "SG1", "service": "steering", "actuator": "cylinder", "count": 2,
        "bore": "200 mm", "rod": "140 mm", "stroke": "450 mm", "tiller_radius": "280 mm",
        "max_rudder_angle": "35 deg", "working_pressure": "125 bar", "fluid": "HM 46",
        "pumps": 2, "pump_flow": "45 L/min", "reservoir": "120 L",
    }
    unit.update(over)
    return unit


def vane_unit(**over: Any) -> dict[str, Any]:
    unit = {
        "id": "SG1", "service": "steering", "actuator": "rotary_vane", "count": 1,
        "vanes": 2, "vane_height": "450 mm", "housing_bore": "900 mm", "hub_diameter": "500 mm",
        "stock_diameter": "380 mm", "max_rudder_angle": "35 deg", "working_pressure": "120 bar",
        "fluid": "HM 46", "pumps": 2, "pump_flow": "240 L/min", "reservoir": "600 L",
    }
    unit.update(over)
    return unit


def vessel(*units: dict[str, Any], ship_type: str = "cargo", gross_tonnage: float = 8000) -> Vessel:
    data = {"vessel": {"id": "TEST", "name": "Test", "ship_type": ship_type, "gross_tonnage": gross_tonnage},
            "unit": list(units)}
    return vessel_from_dict(data, "test particulars")


def unit(data: dict[str, Any], **vessel_kw: Any):
    """The single unit of a vessel built around ``data``."""
    return vessel(data, **vessel_kw).units[0]
