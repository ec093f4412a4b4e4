# SPDX-License-Identifier: MIT
"""Enquiries: the order put to suppliers (one workbook each, and one open enquiry), and a
supplier's filled-in reply read back as that supplier's offers.

Writing records each enquiry (its reference, the supplier, each line reference with the part it
asks for) in the same run that writes the workbooks, so a reply can be matched line by line; the
workbooks appear all together or not at all, and only once the record is committed. Reading
checks the whole reply first and then writes its offers in one transaction, or nothing.
"""

from __future__ import annotations

import datetime as dt
import secrets
from dataclasses import dataclass
from pathlib import Path
from typing import Iterable

from sqlalchemy.engine import Engine

from kit.services import Progress, no_progress


@dataclass(frozen=True)
class WrittenEnquiries:
    """What :func:`write_enquiries` wrote: each enquiry with its file, and the order's scope."""

    written: list  # (kit.engine.enquiry.Enquiry, Path)
    scope: str
    lines: int  # order lines in all
    nothing_to_order: int  # of them, left out


def _new_id(today: dt.date, taken: Iterable[str] = ()):
    """Enquiry references: ``E`` and the date, then six random hex digits (never one used twice in a
    run, nor one in ``taken``: the references already stored)."""
    used: set[str] = set(taken)

    def new() -> str:
        while True:
            ref = f"E{today:%y%m%d}-{secrets.token_hex(3).upper()}"
            if ref not in used:
                used.add(ref)
                return ref

    return new


def write_enquiries(engine: Engine, vessel_ids: Iterable[str], days: float, folder: str | Path,
                    reply_by: dt.date | None = None, policy_file: str | None = None,
                    progress: Progress = no_progress, paper: str = "a4", actor=None) -> WrittenEnquiries:
    """Build the order of the vessels (all, or ``vessel_ids``) over ``days`` and write one enquiry
    workbook per supplier it buys from, and one open enquiry for the lines no supplier offers, into
    ``folder``, to print on ``paper`` ("a4" or "letter"); each line names the next delivery on board
    its vessels where one is set."""
    from catalog_schema.engine import write_transaction
    from kit.engine.enquiry import enquiries
    from kit.files.atomic import staged
    from kit.files.enquiry_workbook import enquiry_writer, file_names
    from kit.files.output_targets import check_folder, refuse_bad_target
    from kit.services.orders import build_order
    from kit.store.enquiries import enquiry_ids_starting, record_enquiries
    from kit.store.purchasing_store import next_deliveries

    today = dt.date.today()
    if reply_by is not None and reply_by < today:
        from kit.errors import ArgumentError

        raise ArgumentError("", "reply-by date", f"today ({today.isoformat()}) or later", got=reply_by.isoformat())
    folder = Path(folder)
    check_folder(folder)
    order, scope = build_order(engine, vessel_ids, days, None, policy_file, progress)
    with engine.connect() as conn:
        deliveries = next_deliveries(conn, order.vessel_ids, today)
        taken = enquiry_ids_starting(conn, f"E{today:%y%m%d}-")
    found = enquiries(order, deliveries, today, reply_by, _new_id(today, taken))
    paths = [folder / name for name in file_names([e.supplier for e in found])]
    for path in paths:
        refuse_bad_target(path)
    with staged([(path, enquiry_writer(e, paper)) for e, path in zip(found, paths)]) as publish:
        def record(conn):
            from kit.services.audit import audit

            record_enquiries(conn, found)
            for e in found:
                audit(conn, actor, "write enquiry", e.id, None, {"supplier": e.supplier or "any supplier", "lines": len(e.lines)})

        write_transaction(engine, record)
        publish()
    skipped = sum(1 for line in order.lines if line.to_order <= 0)
    return WrittenEnquiries(list(zip(found, paths)), scope, len(order.lines), skipped)


@dataclass(frozen=True)
class ReplyReport:
    enquiry_id: str
    supplier: str
    quoted: int
    skipped: list[str]  # line references not quoted
    unmatched: list  # (where, part number, part key) of quoted lines whose part is not registered


def read_enquiry_reply(engine: Engine, path: str | Path, actor=None) -> ReplyReport:
    """Read ``path``, a filled-in enquiry, and store its quoted lines as the supplier's offers (its
    catalogue entries for those parts; the rest of its catalogue stays)."""
    from catalog_schema.engine import write_transaction
    from kit.files.enquiry_reply import check_reply, not_ours, read_reply
    from kit.store.catalogue_import import write_catalogue
    from kit.store.enquiries import asked

    reply = read_reply(path)
    with engine.connect() as conn:
        record = asked(conn, reply.enquiry_id)
    if record is None:
        raise not_ours(reply)
    checked = check_reply(reply, record)
    report = None
    if checked.quoted:
        def work(conn):
            from kit.services.audit import audit

            done = write_catalogue(conn, checked.catalogue, whole=False)
            audit(conn, actor, "read enquiry reply", reply.enquiry_id, None,
                  {"supplier": done.supplier, "quoted": checked.quoted, "file": Path(path).name})
            return done

        report = write_transaction(engine, work)
    return ReplyReport(reply.enquiry_id, report.supplier if report else checked.catalogue.supplier, checked.quoted, checked.skipped,
                       report.unmatched if report else [])
