# SPDX-License-Identifier: MIT
"""Alembic environment: migrations run on the connection that catalog_schema.migrate hands over.

Upgrading needs only the revisions, so this imports no table declarations (the SQLModel tables
would load pydantic for nothing). ``target_metadata`` serves alembic's autogenerate alone, which
kit does not use: revisions are written by hand (DEVELOPERS.md), and tests/test_db_schema.py
compares the migrated database with ``catalog_schema.tables`` and ``core_tables`` itself.
"""

from alembic import context

connection = context.config.attributes["connection"]
context.configure(connection=connection, render_as_batch=True)
with context.begin_transaction():
    context.run_migrations()
