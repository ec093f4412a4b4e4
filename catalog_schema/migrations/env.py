# SPDX-License-Identifier: MIT
"""Alembic environment: migrations run on the connection that catalog_schema.migrate hands over."""

from alembic import context

from catalog_schema import tables

connection = context.config.attributes["connection"]
context.configure(connection=connection, target_metadata=tables.SQLModel.metadata, render_as_batch=True)
with context.begin_transaction():
    context.run_migrations()
