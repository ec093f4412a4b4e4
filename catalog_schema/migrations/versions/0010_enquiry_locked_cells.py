# SPDX-License-Identifier: MIT
"""Enquiry lines keep the standard, compound and service conditions written, so a reply that
changed one of those locked cells (a quote for another compound, say) is refused like one that
changed the designation.

Lines of enquiries written before this revision keep nulls: their reply is not held to those cells.

Revision ID: 0010
Revises: 0009
"""

import sqlalchemy as sa
from alembic import op

revision = "0010"
down_revision = "0009"
branch_labels = None
depends_on = None


def upgrade() -> None:
    with op.batch_alter_table("enquiry_lines") as batch:
        batch.add_column(sa.Column("standard", sa.String(), nullable=True))
        batch.add_column(sa.Column("compound", sa.String(), nullable=True))
        batch.add_column(sa.Column("service", sa.String(), nullable=True))


def downgrade() -> None:
    with op.batch_alter_table("enquiry_lines") as batch:
        batch.drop_column("service")
        batch.drop_column("compound")
        batch.drop_column("standard")
