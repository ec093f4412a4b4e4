# SPDX-License-Identifier: MIT
"""Several processes importing stock and catalogues and exporting the bill of materials on one
database (SQLite file and PostgreSQL), in loops bounded in count and time: no adjustment is lost,
every catalogue is whole, and no process fails."""

from __future__ import annotations

import subprocess
import sys
import time
from pathlib import Path

from click.testing import CliRunner
from sqlalchemy import func, select

from catalog_schema.engine import make_engine
from db_support import db_url  # noqa: F401  (fixture)
from kit.store.catalogue_import import ENTRIES, SUPPLIERS
from kit.cli import main
from kit.store.parts_store import PARTS
from kit.store.stock_import import STOCK

LOOP = Path(__file__).with_name("hostile_loop.py")
WORKERS = ("alpha", "bravo", "charlie")
TIMES = 4
CORVINA = Path(__file__).resolve().parents[1] / "demo_fleet" / "corvina_bay.toml"


def test_processes_importing_and_exporting_together(db_url, tmp_path):
    for args in (["load", str(CORVINA)], ["parts", "register"]):
        assert CliRunner().invoke(main, [*args, "--db", db_url]).exit_code == 0
    engine = make_engine(db_url)
    with engine.connect() as conn:
        keys = conn.execute(select(PARTS.c.key).order_by(PARTS.c.key).limit(4)).scalars().all()
    for name in WORKERS:
        (tmp_path / f"{name}.csv").write_text("part_key,location,quantity\n" + "".join(f"{k},{name},1\n" for k in keys))
        (tmp_path / f"{name}-cat.csv").write_text("supplier_ref,part_key,currency\n" +
                                                   "".join(f"{name}-{i},{k},EUR\n" for i, k in enumerate(keys)))
    start_at = f"{time.time() + 2.5:.3f}"
    procs = [subprocess.Popen([sys.executable, str(LOOP), db_url, str(tmp_path), name, str(TIMES), start_at],
                              stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True) for name in WORKERS]
    done = {}
    for name, p in zip(WORKERS, procs):
        out, err = p.communicate(timeout=150)
        assert (p.returncode, err) == (0, ""), f"{name}: {err}"
        done[name] = int(out)
    with engine.connect() as conn:
        stock = conn.execute(select(STOCK.c.location, func.sum(STOCK.c.quantity)).group_by(STOCK.c.location)).all()
        entries = conn.execute(select(SUPPLIERS.c.name, func.count()).join(ENTRIES, ENTRIES.c.supplier_id == SUPPLIERS.c.id)
                               .group_by(SUPPLIERS.c.name)).all()
    engine.dispose()
    assert all(n >= 1 for n in done.values()), done
    assert dict(stock) == {name: float(done[name] * len(keys)) for name in WORKERS}
    assert dict(entries) == {name: len(keys) for name in WORKERS}
