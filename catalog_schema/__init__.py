# SPDX-License-Identifier: MIT
"""The fleet database: the only package that knows tables, engines and migrations.

Laid out by facet:

- ``tables``: the SQLModel tables (vessels, their units with actuator geometry, power units and
  filter positions; generic parts; suppliers and their catalogue entries; on-board stock; the
  spares policy in force per company or vessel). Constraints live in the database: foreign keys,
  unique natural keys and CHECKs that keep quantities from going negative.
- ``core_tables``: the same tables as SQLAlchemy Core, rendered from ``tables`` by
  ``render_core``; the commands run on these, so they do not import SQLModel and pydantic.
- ``conventions``: constraint naming and the default stock location, shared by both.
- ``engine``: where the database is (a SQLite file by default, ``--db`` or ``KIT_DB`` to change
  it, ``postgresql+psycopg://`` URLs through the same code) and how write transactions retry.
- ``migrate``: alembic revisions shipped in ``migrations/``; a fresh database and an old one are
  brought to the same head.
- ``errors``: what goes wrong with a database, as one-line project errors.
"""
