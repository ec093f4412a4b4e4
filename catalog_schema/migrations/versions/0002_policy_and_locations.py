# SPDX-License-Identifier: MIT
"""Spares policy per company or vessel; stock kept per location on board.

Stock rows counted before this revision get the location "unassigned"; the natural key of a
stock row becomes (vessel, part, location).

Revision ID: 0002
Revises: 0001
"""

import sqlalchemy as sa
from alembic import op

revision = "0002"
down_revision = "0001"
branch_labels = None
depends_on = None

DEFAULT_LOCATION = "unassigned"  # the same as catalog_schema.tables.DEFAULT_LOCATION, frozen here


def upgrade() -> None:
    op.create_table(
        "spares_policies",
        sa.Column("id", sa.Integer(), nullable=False),
        sa.Column("company_id", sa.Integer(), nullable=True),
        sa.Column("vessel_id", sa.String(), nullable=True),
        sa.Column("name", sa.String(), nullable=False),
        sa.Column("cover_days", sa.Integer(), nullable=False),
        sa.Column("in_force_from", sa.Date(), nullable=False),
        sa.Column("note", sa.String(), nullable=True),
        sa.PrimaryKeyConstraint("id", name="pk_spares_policies"),
        sa.ForeignKeyConstraint(["company_id"], ["companies.id"], name="fk_spares_policies_company_id_companies", ondelete="CASCADE"),
        sa.ForeignKeyConstraint(["vessel_id"], ["vessels.id"], name="fk_spares_policies_vessel_id_vessels", ondelete="CASCADE"),
        sa.CheckConstraint("(company_id IS NULL) <> (vessel_id IS NULL)", name=op.f("ck_spares_policies_one_scope")),
        sa.CheckConstraint("cover_days >= 0", name=op.f("ck_spares_policies_cover_days")),
        sa.UniqueConstraint("company_id", "in_force_from", name="uq_spares_policies_company_id_in_force_from"),
        sa.UniqueConstraint("vessel_id", "in_force_from", name="uq_spares_policies_vessel_id_in_force_from"),
    )
    with op.batch_alter_table("stock") as batch:
        batch.add_column(sa.Column("location", sa.String(), nullable=False, server_default=DEFAULT_LOCATION))
        batch.drop_constraint("uq_stock_vessel_id_part_id", type_="unique")
        batch.create_unique_constraint("uq_stock_vessel_id_part_id_location", ["vessel_id", "part_id", "location"])


def downgrade() -> None:
    with op.batch_alter_table("stock") as batch:
        batch.drop_constraint("uq_stock_vessel_id_part_id_location", type_="unique")
        batch.create_unique_constraint("uq_stock_vessel_id_part_id", ["vessel_id", "part_id"])
        batch.drop_column("location")
    op.drop_table("spares_policies")
