# SPDX-License-Identifier: MIT
"""The pre-voyage check: one vessel's on-board stock against what the voyage needs.

The shortfall is the vessel's own bill of materials with only the lines where the stock falls
short; the command exits with status 1 when it is not empty, so scripts can act on it.
"""

from __future__ import annotations

from typing import Mapping, Sequence

from kit.engine.bom import Order, consolidate, only_to_order
from kit.engine.purchasing import Offer, Purchasing
from kit.engine.requirements import VesselResult


def preflight_order(result: VesselResult, on_board: Mapping[tuple[str, str], float],
                    offers: Mapping[str, Sequence[Offer]] | None = None, purchasing: Purchasing | None = None) -> Order:
    """The shortfall of ``result`` against ``on_board`` as an order (lines renumbered)."""
    return only_to_order(consolidate([result], on_board, offers, purchasing))
