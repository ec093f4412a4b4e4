# SPDX-License-Identifier: MIT
"""The spares policy's content: the company policy file's TOML text, as kit validated it.

Rows recorded before this revision keep a null content, which means kit's default policy.

Revision ID: 0003
Revises: 0002
"""

import sqlalchemy as sa
from alembic import op

revision = "0003"
down_revision = "0002"
branch_labels = None
depends_on = None


def upgrade() -> None:
    op.add_column("spares_policies", sa.Column("content", sa.Text(), nullable=True))


def downgrade() -> None:
    with op.batch_alter_table("spares_policies") as batch:
        batch.drop_column("content")
