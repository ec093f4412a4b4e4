# SPDX-License-Identifier: MIT
"""The particulars the exact trunnion geometry, the ram gland and the rudder torque read: a
cylinder gear's trunnion distance, a ram gland's spigot bore, where the rudder carrier is, and the
rudder itself (one row per steering unit that gives one).

Rows recorded before this revision keep nulls (the particulars did not say), except that a ram or
cylinder steering gear's rudder carrier is set to 'separate': the particulars reader has always
taken it so, and a gear of that kind has no other place for it.

On SQLite a new CHECK rebuilds ``units`` and ``actuators`` (alembic's batch mode);
:func:`catalog_schema.migrate.upgrade` switches foreign keys off around it, so the rebuild of
``units`` does not cascade deletes to its child tables.

Revision ID: 0005
Revises: 0004
"""

import sqlalchemy as sa
from alembic import op

revision = "0005"
down_revision = "0004"
branch_labels = None
depends_on = None

# Frozen here, not imported from the tables.
CARRIER = ("rudder_carrier IS NULL OR rudder_carrier = 'separate' "
           "OR (rudder_carrier = 'in_actuator' AND actuator = 'rotary_vane')")
TRUNNION = "trunnion_distance IS NULL OR trunnion_distance > 0"
SPIGOT = "gland_spigot_bore IS NULL OR gland_spigot_bore > 0"
RUDDER_CHECKS = {
    "sizes": "area > 0 AND mean_height > 0",
    "area_forward": "area_forward >= 0 AND area_forward < area / 2",
    "speeds": "ahead_speed > 0 AND (astern_speed IS NULL OR astern_speed > 0)",
    "profile": "profile IN ('naca', 'flat_side', 'mixed', 'hollow', 'high_lift', 'fish_tail', 'single_plate')",
    "position": "position IN ('outside_jet', 'propeller_jet', 'behind_nozzle')",
}


def upgrade() -> None:
    with op.batch_alter_table("units") as batch:
        batch.add_column(sa.Column("rudder_carrier", sa.String(), nullable=True))
        batch.create_check_constraint(op.f("ck_units_rudder_carrier"), CARRIER)
    op.execute("UPDATE units SET rudder_carrier = 'separate' WHERE service = 'steering' AND actuator IN ('ram', 'cylinder')")
    with op.batch_alter_table("actuators") as batch:
        batch.add_column(sa.Column("trunnion_distance", sa.Float(), nullable=True))
        batch.add_column(sa.Column("gland_spigot_bore", sa.Float(), nullable=True))
        batch.create_check_constraint(op.f("ck_actuators_trunnion_distance"), TRUNNION)
        batch.create_check_constraint(op.f("ck_actuators_gland_spigot_bore"), SPIGOT)
    op.create_table(
        "rudders",
        sa.Column("unit_id", sa.Integer(), nullable=False),
        *[sa.Column(name, sa.Float(), nullable=False) for name in ("area", "mean_height", "area_forward", "ahead_speed")],
        sa.Column("profile", sa.String(), nullable=False),
        sa.Column("position", sa.String(), nullable=False),
        sa.Column("astern_speed", sa.Float(), nullable=True),
        sa.PrimaryKeyConstraint("unit_id", name="pk_rudders"),
        sa.ForeignKeyConstraint(["unit_id"], ["units.id"], name="fk_rudders_unit_id_units", ondelete="CASCADE"),
        *[sa.CheckConstraint(sql, name=op.f(f"ck_rudders_{label}")) for label, sql in RUDDER_CHECKS.items()],
    )


def downgrade() -> None:
    op.drop_table("rudders")
    with op.batch_alter_table("actuators") as batch:
        batch.drop_constraint(op.f("ck_actuators_gland_spigot_bore"), type_="check")
        batch.drop_constraint(op.f("ck_actuators_trunnion_distance"), type_="check")
        batch.drop_column("gland_spigot_bore")
        batch.drop_column("trunnion_distance")
    with op.batch_alter_table("units") as batch:
        batch.drop_constraint(op.f("ck_units_rudder_carrier"), type_="check")
        batch.drop_column("rudder_carrier")
