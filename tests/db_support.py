# SPDX-License-Identifier: MIT
"""Fixtures for the database tests: every test on SQLite, and on PostgreSQL when
KIT_TEST_PG_URL names a server (e.g. postgresql+psycopg://postgres@127.0.0.1:5432/test).

Each PostgreSQL test gets a schema of its own (search_path set in the URL, so child processes
see it too) and drops it after. If KIT_TEST_PG_URL is set and the server cannot be reached the
test fails: the PostgreSQL tests are never skipped silently.
"""

from __future__ import annotations

import contextlib
import os
import uuid

import pytest
from sqlalchemy import create_engine, text
from sqlalchemy.engine import make_url
from sqlalchemy.exc import OperationalError

from catalog_schema.engine import make_engine
from catalog_schema.migrate import upgrade

PG_ENV = "KIT_TEST_PG_URL"
ENGINES = ["sqlite", "postgresql"]


def _pg_admin():
    url = os.environ.get(PG_ENV)
    if not url:
        pytest.skip(f"{PG_ENV} is not set, so no PostgreSQL run was asked for")
    admin = create_engine(url, isolation_level="AUTOCOMMIT")
    try:
        with admin.connect():
            pass
    except OperationalError as exc:
        pytest.fail(f"{PG_ENV}={url} is set but PostgreSQL cannot be reached: {exc.orig}")
    return url, admin


@contextlib.contextmanager
def fresh_url(kind: str, folder):
    """A URL to an empty database of engine ``kind`` ("sqlite": a file in ``folder``;
    "postgresql": a schema of its own), removed on leaving."""
    if kind == "sqlite":
        yield f"sqlite:///{folder / 'fleet.sqlite'}"
        return
    base, admin = _pg_admin()
    schema = f"kit_test_{uuid.uuid4().hex[:12]}"
    with admin.connect() as conn:
        conn.execute(text(f'CREATE SCHEMA "{schema}"'))
    url = make_url(base).update_query_dict({"options": f"-csearch_path={schema}"})
    try:
        yield url.render_as_string(hide_password=False)
    finally:
        with admin.connect() as conn:
            conn.execute(text(f'DROP SCHEMA "{schema}" CASCADE'))
        admin.dispose()


@pytest.fixture(params=ENGINES)
def db_url(request, tmp_path):
    """A URL to an empty database of the parametrised engine, removed after the test."""
    with fresh_url(request.param, tmp_path) as url:
        yield url


@pytest.fixture
def engine(db_url):
    """An engine on a database built to the head revision."""
    eng = make_engine(db_url)
    upgrade(eng)
    yield eng
    eng.dispose()


# Who did a change and when differ between two ways of making the same change (a page and the
# command line): a comparison of the two leaves the audit trail out (``audit=False``).
AUDIT = "audit_events"


def dump(engine, tables=None, *, audit: bool = True) -> dict[str, list[tuple]]:
    """Every row of every kit table (or of ``tables``; the audit trail too unless ``audit`` is
    False), sorted, for before/after comparisons."""
    from catalog_schema.tables import SQLModel

    out = {}
    with engine.connect() as conn:
        for table in SQLModel.metadata.sorted_tables:
            if (tables is None and (audit or table.name != AUDIT)) or (tables is not None and table.name in tables):
                out[table.name] = sorted(tuple(r) for r in conn.execute(table.select()))
    return out


TOML_CYLINDER = '''
[company]
name = "Brackwater Test Shipping"

[vessel]
id = "TEST-ONE"
name = "Test One"
ship_type = "cargo"
gross_tonnage = 4200

[[unit]]
id = "SG1"
service = "steering"
actuator = "cylinder"
count = 2
bore = "160 mm"
rod = "90 mm"
stroke = "400 mm"
tiller_radius = "500 mm"
max_rudder_angle = "35 deg"
working_pressure = "160 bar"
fluid = "HM 46"
pumps = 2
pump_flow = "40 L/min"
reservoir = "120 L"

[[unit.filter]]
position = "return"
elements = 1
change_interval = "2000 h"
'''
