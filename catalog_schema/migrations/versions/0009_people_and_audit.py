# SPDX-License-Identifier: MIT
"""People, sessions and the audit trail, for the office server.

People with one role each (and the vessels a vessel keeper keeps), signed-in browser sessions kept
in the database so several servers share them, failed sign-ins for throttling, and the audit
trail. The database itself refuses to update or delete an audit row (a trigger on each engine), so
no program, kit or another, rewrites history through an ordinary statement.

New tables only; no row of an older revision changes.

Revision ID: 0009
Revises: 0008
"""

import sqlalchemy as sa
from alembic import op

revision = "0009"
down_revision = "0008"
branch_labels = None
depends_on = None

# Frozen here, not imported from the tables.
ROLE = "role IN ('administrator', 'buyer', 'vessel_keeper', 'reader')"
LOGIN = "login = lower(login) AND length(login) >= 2"
KEPT = "the audit trail is kept as written: its rows are never updated or deleted"


def upgrade() -> None:
    op.create_table(
        "people",
        sa.Column("id", sa.Integer(), nullable=False),
        sa.Column("login", sa.String(), nullable=False),
        sa.Column("name", sa.String(), nullable=False),
        sa.Column("role", sa.String(), nullable=False),
        sa.Column("password_hash", sa.String(), nullable=False),
        sa.Column("created_at", sa.DateTime(), nullable=False),
        sa.Column("disabled_at", sa.DateTime(), nullable=True),
        sa.PrimaryKeyConstraint("id", name="pk_people"),
        sa.UniqueConstraint("login", name="uq_people_login"),
        sa.CheckConstraint(ROLE, name=op.f("ck_people_role")),
        sa.CheckConstraint(LOGIN, name=op.f("ck_people_login")),
    )
    op.create_table(
        "person_vessels",
        sa.Column("person_id", sa.Integer(), nullable=False),
        sa.Column("vessel_id", sa.String(), nullable=False),
        sa.PrimaryKeyConstraint("person_id", "vessel_id", name="pk_person_vessels"),
        sa.ForeignKeyConstraint(["person_id"], ["people.id"], name="fk_person_vessels_person_id_people", ondelete="CASCADE"),
        sa.ForeignKeyConstraint(["vessel_id"], ["vessels.id"], name="fk_person_vessels_vessel_id_vessels", ondelete="CASCADE"),
    )
    op.create_table(
        "web_sessions",
        sa.Column("id", sa.String(), nullable=False),
        sa.Column("person_id", sa.Integer(), nullable=False),
        sa.Column("csrf", sa.String(), nullable=False),
        sa.Column("started_at", sa.DateTime(), nullable=False),
        sa.Column("seen_at", sa.DateTime(), nullable=False),
        sa.Column("ended_at", sa.DateTime(), nullable=True),
        sa.PrimaryKeyConstraint("id", name="pk_web_sessions"),
        sa.ForeignKeyConstraint(["person_id"], ["people.id"], name="fk_web_sessions_person_id_people", ondelete="CASCADE"),
    )
    op.create_table(
        "login_failures",
        sa.Column("id", sa.Integer(), nullable=False),
        sa.Column("login", sa.String(), nullable=False),
        sa.Column("address", sa.String(), nullable=False),
        sa.Column("at", sa.DateTime(), nullable=False),
        sa.PrimaryKeyConstraint("id", name="pk_login_failures"),
    )
    op.create_index("ix_login_failures_login", "login_failures", ["login"])
    op.create_index("ix_login_failures_address", "login_failures", ["address"])
    op.create_table(
        "audit_events",
        sa.Column("id", sa.Integer(), nullable=False),
        sa.Column("at", sa.DateTime(), nullable=False),
        sa.Column("person", sa.String(), nullable=False),
        sa.Column("via", sa.String(), nullable=False),
        sa.Column("action", sa.String(), nullable=False),
        sa.Column("subject", sa.String(), nullable=False),
        sa.Column("before", sa.Text(), nullable=True),
        sa.Column("after", sa.Text(), nullable=True),
        sa.PrimaryKeyConstraint("id", name="pk_audit_events"),
    )
    op.create_index("ix_audit_events_at", "audit_events", ["at"])
    if op.get_bind().dialect.name == "postgresql":
        op.execute(f"""CREATE FUNCTION audit_events_kept() RETURNS trigger LANGUAGE plpgsql AS $$
                       BEGIN RAISE EXCEPTION '{KEPT}'; END $$""")
        op.execute("CREATE TRIGGER audit_events_kept BEFORE UPDATE OR DELETE ON audit_events "
                   "FOR EACH ROW EXECUTE FUNCTION audit_events_kept()")
    else:
        for what in ("UPDATE", "DELETE"):
            op.execute(f"CREATE TRIGGER audit_events_no_{what.lower()} BEFORE {what} ON audit_events "
                       f"BEGIN SELECT RAISE(ABORT, '{KEPT}'); END")


def downgrade() -> None:
    if op.get_bind().dialect.name == "postgresql":
        op.execute("DROP TRIGGER audit_events_kept ON audit_events")
        op.execute("DROP FUNCTION audit_events_kept()")
    else:
        for what in ("update", "delete"):
            op.execute(f"DROP TRIGGER audit_events_no_{what}")
    op.drop_index("ix_audit_events_at", table_name="audit_events")
    op.drop_table("audit_events")
    op.drop_index("ix_login_failures_address", table_name="login_failures")
    op.drop_index("ix_login_failures_login", table_name="login_failures")
    op.drop_table("login_failures")
    op.drop_table("web_sessions")
    op.drop_table("person_vessels")
    op.drop_table("people")
