# SPDX-License-Identifier: MIT
"""The service layer: one plain function per thing a user does.

Each service takes an :class:`sqlalchemy.engine.Engine` (where it needs the fleet database),
opens the unit of work itself (a read in :func:`catalog_schema.engine.read_transaction`, which
takes no write lock on SQLite, a write in :func:`catalog_schema.engine.write_transaction`), reads through the store and the files, runs
the engine and returns plain results. The faces (the command line, the demo, a web page) call one
service and show or write what it returns; they never open a transaction or run a query.

``fleet``      load particulars, register parts, list parts, list the vessels, work out one vessel's particulars
``imports``    a supplier's catalogue, a vessel's stock
``orders``     the bill of materials, the pre-voyage check
``enquiries``  enquiries to suppliers written from the order, and their replies read back
``policies``   set and show the spares policy in force; the days of cover an order defaults to
``purchasing`` base currency, handling margin, exchange rates, preferred suppliers, deliveries
``templates``  the sheets kit reads, written empty or filled
``vessels``    one vessel whole (the vessel page): worked out, its stock and check, a count typed in place
``database``   what the fleet database holds
``demo``       the whole job on the invented demo fleet
``bulk_work``  the cycle collector paused while a large import or order is built (not a user's step)

Errors are the library's own (:mod:`kit.errors`) and name no command-line option; a face adds how
the value was given (e.g. :class:`kit.errors.UnknownVesselError` carries only the vessel's id).
Long loops take a ``progress`` wrapper (an iterable's items and a label in, the same items out),
so a face may draw a progress bar without the services knowing about terminals.
"""

from __future__ import annotations

from typing import Callable, Iterable

Progress = Callable[[list, str], Iterable]


def no_progress(items: list, label: str) -> Iterable:
    """The default ``progress``: the items as they are."""
    return items
