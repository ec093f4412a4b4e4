# SPDX-License-Identifier: MIT
"""Enquiries: what kit asked each supplier, so a reply can be matched back line by line.

Two new tables; no row of an older revision changes.

Revision ID: 0007
Revises: 0006
"""

import sqlalchemy as sa
from alembic import op

revision = "0007"
down_revision = "0006"
branch_labels = None
depends_on = None


def upgrade() -> None:
    op.create_table(
        "enquiries",
        sa.Column("id", sa.String(), nullable=False),
        sa.Column("supplier", sa.String(), nullable=True),
        sa.Column("written_on", sa.Date(), nullable=False),
        sa.Column("reply_by", sa.Date(), nullable=False),
        sa.PrimaryKeyConstraint("id", name="pk_enquiries"),
    )
    op.create_table(
        "enquiry_lines",
        sa.Column("enquiry_id", sa.String(), nullable=False),
        sa.Column("line", sa.Integer(), nullable=False),
        sa.Column("ref", sa.String(), nullable=False),
        sa.Column("part_key", sa.String(), nullable=False),
        sa.Column("designation", sa.String(), nullable=False),
        sa.Column("quantity", sa.Float(), nullable=False),
        sa.Column("uom", sa.String(), nullable=False),
        sa.PrimaryKeyConstraint("enquiry_id", "line", name="pk_enquiry_lines"),
        sa.ForeignKeyConstraint(["enquiry_id"], ["enquiries.id"], name="fk_enquiry_lines_enquiry_id_enquiries", ondelete="CASCADE"),
        sa.UniqueConstraint("ref", name="uq_enquiry_lines_ref"),
        sa.CheckConstraint("quantity > 0", name=op.f("ck_enquiry_lines_quantity")),
    )


def downgrade() -> None:
    op.drop_table("enquiry_lines")
    op.drop_table("enquiries")
