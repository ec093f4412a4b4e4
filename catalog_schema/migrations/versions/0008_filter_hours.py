# SPDX-License-Identifier: MIT
"""Filter hours: the running time since the last change of a filter position, as the particulars
state it (with the day it was read) and as a count on board reads it.

Filter positions saved before this revision keep nulls: their running time is not known, and the
changes due are worked out as before (the element in place taken as due).

Revision ID: 0008
Revises: 0007
"""

import sqlalchemy as sa
from alembic import op

revision = "0008"
down_revision = "0007"
branch_labels = None
depends_on = None

# Frozen here, not imported from the tables.
RUN_STATED = "run_since_change IS NULL OR run_since_change >= 0"
RUN_COUNTED = "run_since_change >= 0"


def upgrade() -> None:
    with op.batch_alter_table("filter_positions") as batch:
        batch.add_column(sa.Column("run_since_change", sa.Float(), nullable=True))
        batch.add_column(sa.Column("run_read_on", sa.Date(), nullable=True))
        batch.create_check_constraint(op.f("ck_filter_positions_run_since_change"), RUN_STATED)
    op.create_table(
        "filter_counts",
        sa.Column("vessel_id", sa.String(), nullable=False),
        sa.Column("unit_ref", sa.String(), nullable=False),
        sa.Column("position", sa.String(), nullable=False),
        sa.Column("run_since_change", sa.Float(), nullable=False),
        sa.Column("counted_on", sa.Date(), nullable=False),
        sa.PrimaryKeyConstraint("vessel_id", "unit_ref", "position", name="pk_filter_counts"),
        sa.ForeignKeyConstraint(["vessel_id"], ["vessels.id"], name="fk_filter_counts_vessel_id_vessels", ondelete="CASCADE"),
        sa.CheckConstraint(RUN_COUNTED, name=op.f("ck_filter_counts_run_since_change")),
    )


def downgrade() -> None:
    op.drop_table("filter_counts")
    with op.batch_alter_table("filter_positions") as batch:
        batch.drop_constraint(op.f("ck_filter_positions_run_since_change"), type_="check")
        batch.drop_column("run_read_on")
        batch.drop_column("run_since_change")
