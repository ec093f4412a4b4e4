# SPDX-License-Identifier: MIT
"""What an order's supplier choice reads besides the requirements: offers, rates, preferences, deliveries.

Plain values, filled by the store (:mod:`kit.store`) and read by the engine's choice of supplier
and pack (:mod:`kit.engine.bom`). Quantities are in the part's unit of measure (pieces, litres),
prices per pack in the offer's currency, dates as :class:`datetime.date`.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass, field
from typing import Mapping

# Days between the supplier's dispatch and the delivery on board: forwarding, customs, the agent and
# the launch to the ship (common practice; the office sets its own with kit's purchasing settings).
DEFAULT_HANDLING_DAYS = 7


@dataclass(frozen=True)
class Offer:
    """One supplier's catalogue entry (or enquiry reply) for a generic part.

    ``pack_content`` is one pack's content in the part's unit of measure (10 pieces, 208 L);
    ``pack_label`` the pack as the supplier wrote it ("208 L", "5 US_gal", "10 pcs").
    """

    supplier: str
    part_number: str
    pack_content: float = 1.0
    pack_label: str = "1"
    price: float | None = None
    currency: str | None = None
    lead_time_days: int | None = None


@dataclass(frozen=True)
class Rate:
    """One unit of ``currency`` is worth ``rate`` units of ``base``, set on ``set_on`` from ``source``."""

    currency: str
    base: str
    rate: float
    set_on: dt.date
    source: str


@dataclass(frozen=True)
class Delivery:
    """Where and when an order must be on board ``vessel_id``."""

    vessel_id: str
    port: str
    due_on: dt.date


@dataclass(frozen=True)
class Purchasing:
    """The office's settings and records that the supplier choice reads, as of ``today``.

    ``rates`` holds the rate in force today for each currency into ``base_currency`` (none when no
    base currency is set); ``part_suppliers`` maps a part key to the supplier preferred for it;
    ``deliveries`` maps a vessel id to its next delivery (none when not set).
    """

    today: dt.date
    base_currency: str | None = None
    rates: Mapping[str, Rate] = field(default_factory=dict)
    preferred_suppliers: frozenset[str] = frozenset()
    part_suppliers: Mapping[str, str] = field(default_factory=dict)
    handling_days: int = DEFAULT_HANDLING_DAYS
    deliveries: Mapping[str, Delivery] = field(default_factory=dict)
