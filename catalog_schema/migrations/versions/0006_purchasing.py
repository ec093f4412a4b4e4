# SPDX-License-Identifier: MIT
"""Purchasing: packs in the part's unit, preferred suppliers, the base currency and exchange
rates, the handling margin, deliveries on board, and the makers and models a supplier quotes by.

Rows recorded before this revision keep nulls: a catalogue entry's pack is then its ``pack_qty``
pieces, no supplier is preferred, and no rate, delivery or maker is known.

Revision ID: 0006
Revises: 0005
"""

import sqlalchemy as sa
from alembic import op

revision = "0006"
down_revision = "0005"
branch_labels = None
depends_on = None

# Frozen here, not imported from the tables.
PACK_CONTENT = "pack_content IS NULL OR pack_content > 0"
PURCHASING_CHECKS = {
    "one_row": "id = 1",
    "base_currency": "base_currency IS NULL OR length(base_currency) = 3",
    "handling_days": "handling_days IS NULL OR (handling_days >= 0 AND handling_days <= 365)",
}
RATE_CHECKS = {
    "currencies": "length(currency) = 3 AND length(base) = 3 AND currency <> base",
    "rate": "rate > 0",
}


def upgrade() -> None:
    with op.batch_alter_table("units") as batch:
        batch.add_column(sa.Column("maker", sa.String(), nullable=True))
        batch.add_column(sa.Column("model", sa.String(), nullable=True))
    with op.batch_alter_table("power_units") as batch:
        for name in ("pump_maker", "valve_maker", "valve_model"):
            batch.add_column(sa.Column(name, sa.String(), nullable=True))
    with op.batch_alter_table("suppliers") as batch:
        batch.add_column(sa.Column("preferred", sa.Boolean(), server_default="0", nullable=False))
    with op.batch_alter_table("catalogue_entries") as batch:
        batch.add_column(sa.Column("pack_content", sa.Float(), nullable=True))
        batch.add_column(sa.Column("pack_label", sa.String(), nullable=True))
        batch.create_check_constraint(op.f("ck_catalogue_entries_pack_content"), PACK_CONTENT)
    op.create_table(
        "part_suppliers",
        sa.Column("part_id", sa.Integer(), nullable=False),
        sa.Column("supplier_id", sa.Integer(), nullable=False),
        sa.Column("note", sa.String(), nullable=True),
        sa.PrimaryKeyConstraint("part_id", name="pk_part_suppliers"),
        sa.ForeignKeyConstraint(["part_id"], ["parts.id"], name="fk_part_suppliers_part_id_parts", ondelete="CASCADE"),
        sa.ForeignKeyConstraint(["supplier_id"], ["suppliers.id"], name="fk_part_suppliers_supplier_id_suppliers",
                                ondelete="CASCADE"),
    )
    op.create_table(
        "purchasing",
        sa.Column("id", sa.Integer(), nullable=False),
        sa.Column("base_currency", sa.String(), nullable=True),
        sa.Column("handling_days", sa.Integer(), nullable=True),
        sa.PrimaryKeyConstraint("id", name="pk_purchasing"),
        *[sa.CheckConstraint(sql, name=op.f(f"ck_purchasing_{label}")) for label, sql in PURCHASING_CHECKS.items()],
    )
    op.create_table(
        "exchange_rates",
        sa.Column("id", sa.Integer(), nullable=False),
        sa.Column("currency", sa.String(), nullable=False),
        sa.Column("base", sa.String(), nullable=False),
        sa.Column("rate", sa.Float(), nullable=False),
        sa.Column("set_on", sa.Date(), nullable=False),
        sa.Column("source", sa.String(), nullable=False),
        sa.PrimaryKeyConstraint("id", name="pk_exchange_rates"),
        sa.UniqueConstraint("currency", "base", "set_on", name="uq_exchange_rates_currency_base_set_on"),
        *[sa.CheckConstraint(sql, name=op.f(f"ck_exchange_rates_{label}")) for label, sql in RATE_CHECKS.items()],
    )
    op.create_table(
        "deliveries",
        sa.Column("id", sa.Integer(), nullable=False),
        sa.Column("vessel_id", sa.String(), nullable=False),
        sa.Column("port", sa.String(), nullable=False),
        sa.Column("due_on", sa.Date(), nullable=False),
        sa.Column("note", sa.String(), nullable=True),
        sa.PrimaryKeyConstraint("id", name="pk_deliveries"),
        sa.ForeignKeyConstraint(["vessel_id"], ["vessels.id"], name="fk_deliveries_vessel_id_vessels", ondelete="CASCADE"),
        sa.UniqueConstraint("vessel_id", "due_on", name="uq_deliveries_vessel_id_due_on"),
    )


def downgrade() -> None:
    for table in ("deliveries", "exchange_rates", "purchasing", "part_suppliers"):
        op.drop_table(table)
    with op.batch_alter_table("catalogue_entries") as batch:
        batch.drop_constraint(op.f("ck_catalogue_entries_pack_content"), type_="check")
        batch.drop_column("pack_label")
        batch.drop_column("pack_content")
    with op.batch_alter_table("suppliers") as batch:
        batch.drop_column("preferred")
    with op.batch_alter_table("power_units") as batch:
        for name in ("valve_model", "valve_maker", "pump_maker"):
            batch.drop_column(name)
    with op.batch_alter_table("units") as batch:
        batch.drop_column("model")
        batch.drop_column("maker")
