# SPDX-License-Identifier: MIT
"""Names and values the tables and the code that writes them share, without importing either."""

# Named constraints, so migrations can find and change them on every engine.
NAMING = {
    "ix": "ix_%(column_0_label)s",
    "uq": "uq_%(table_name)s_%(column_0_N_name)s",
    "ck": "ck_%(table_name)s_%(constraint_name)s",
    "fk": "fk_%(table_name)s_%(column_0_name)s_%(referred_table_name)s",
    "pk": "pk_%(table_name)s",
}

# The stock location of rows counted before locations were recorded (revision 0002).
DEFAULT_LOCATION = "unassigned"
