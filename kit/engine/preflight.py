# SPDX-License-Identifier: MIT
"""The pre-voyage check: one vessel's on-board stock against what the voyage needs.

The shortfall is the vessel's own bill of materials with only the lines where the stock falls
short; the command exits with status 1 when it is not empty, so scripts can act on it.
"""

from __future__ import annotations

from typing import Mapping

from kit.engine.bom import CatalogueMatch, Order, consolidate
from kit.engine.requirements import VesselResult

EPS = 1e-9


def preflight_order(result: VesselResult, on_board: Mapping[tuple[str, str], float],
                    catalogue: Mapping[str, CatalogueMatch] | None = None) -> Order:
    """The shortfall of ``result`` against ``on_board`` as an order (lines renumbered)."""
    full = consolidate([result], on_board, catalogue)
    short = [line for line in full.lines if line.to_order > EPS]
    for n, line in enumerate(short, 1):
        line.number = n
    oil = [o for o in full.oil if o.to_order_l > EPS]
    return Order(full.results, short, oil, full.packages)
