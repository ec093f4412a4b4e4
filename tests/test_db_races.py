# SPDX-License-Identifier: MIT
"""Races between writers that match catalogue entries to generic parts, on SQLite and PostgreSQL.

A catalogue import matches its rows to the parts already registered; ``kit parts register``
matches the entries already imported to the parts it adds. Whichever of the two commits first,
every entry whose part key names a registered part must end up with that part's id.
"""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

from sqlalchemy import and_, func, or_, select

from db_support import db_url, engine  # noqa: F401  (fixtures)
from kit.store.catalogue_import import ENTRIES
from kit.store.parts_store import PARTS
from race_worker import ROWS, key

WORKER = Path(__file__).with_name("race_worker.py")
ROUNDS = 4


def test_register_racing_a_catalogue_import_leaves_every_entry_matched(engine, tmp_path):
    url = engine.url.render_as_string(hide_password=False)
    for r in range(ROUNDS):
        (tmp_path / f"cat-{r}.csv").write_text("supplier_ref,part_key,currency\n" +
                                                "".join(f"R{r}-{i},{key(r, i)},EUR\n" for i in range(ROWS)))
    procs = [subprocess.Popen([sys.executable, str(WORKER), role, url, str(tmp_path), str(ROUNDS)],
                              stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True) for role in ("import", "register")]
    for p in procs:
        out, err = p.communicate(timeout=240)
        assert (p.returncode, err) == (0, ""), f"worker failed: {err}"
    # Both sides met in every round: the import had read the part ids when register ran.
    assert sorted(f.name for f in tmp_path.glob("read-*")) == sorted(f"read-{r}" for r in range(ROUNDS))
    with engine.connect() as conn:
        entries = conn.execute(select(func.count()).select_from(ENTRIES)).scalar_one()
        parts = conn.execute(select(func.count()).select_from(PARTS)).scalar_one()
        wrong = conn.execute(select(func.count()).select_from(ENTRIES.join(PARTS, PARTS.c.key == ENTRIES.c.part_key))
                             .where(or_(ENTRIES.c.part_id.is_(None), ENTRIES.c.part_id != PARTS.c.id))).scalar_one()
        matched = conn.execute(select(func.count()).select_from(ENTRIES.join(PARTS, and_(PARTS.c.key == ENTRIES.c.part_key,
                                                                                         PARTS.c.id == ENTRIES.c.part_id)))).scalar_one()
    assert (entries, parts) == (ROUNDS * ROWS, ROUNDS * ROWS)
    assert (wrong, matched) == (0, ROUNDS * ROWS)
