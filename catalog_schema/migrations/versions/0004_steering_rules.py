# SPDX-License-Identifier: MIT
"""What the SOLAS II-1/29 verdicts read: chemical tankers and gas carriers as ship types, the
vanes' angle of a rotary vane gear, and the gear's maximum working and design pressures.

A rotary vane gear's rudder stock diameter was already stored; a ram or cylinder gear's goes in
the same column. Rows recorded before this revision keep nulls (the particulars did not say).

Revision ID: 0004
Revises: 0003
"""

import sqlalchemy as sa
from alembic import op

revision = "0004"
down_revision = "0003"
branch_labels = None
depends_on = None

# Frozen here, not imported from the tables.
OLD_SHIP_TYPES = "ship_type IN ('cargo', 'passenger', 'tanker')"
NEW_SHIP_TYPES = "ship_type IN ('cargo', 'passenger', 'tanker', 'chemical_tanker', 'gas_carrier')"


def upgrade() -> None:
    with op.batch_alter_table("vessels") as batch:
        batch.drop_constraint(op.f("ck_vessels_ship_type"), type_="check")
        batch.create_check_constraint(op.f("ck_vessels_ship_type"), NEW_SHIP_TYPES)
    op.add_column("actuators", sa.Column("vane_angle", sa.Float(), nullable=True))
    op.add_column("power_units", sa.Column("max_working_pressure", sa.Float(), nullable=True))
    op.add_column("power_units", sa.Column("design_pressure", sa.Float(), nullable=True))


def downgrade() -> None:
    with op.batch_alter_table("power_units") as batch:
        batch.drop_column("design_pressure")
        batch.drop_column("max_working_pressure")
    with op.batch_alter_table("actuators") as batch:
        batch.drop_column("vane_angle")
    with op.batch_alter_table("vessels") as batch:
        batch.drop_constraint(op.f("ck_vessels_ship_type"), type_="check")
        batch.create_check_constraint(op.f("ck_vessels_ship_type"), OLD_SHIP_TYPES)
