# SPDX-License-Identifier: MIT
"""Write ``core_tables.py``: the tables of :mod:`catalog_schema.tables` as plain SQLAlchemy Core.

The SQLModel classes are where the schema is declared, but importing SQLModel also imports
pydantic and SQLAlchemy's ORM, about 0.2 s that every command would pay while it only ever runs
Core statements. So the commands use ``core_tables.py``, which this module renders from the
SQLModel metadata: same tables, columns, types, defaults, keys, constraints and indexes, with the
constraint names already worked out by the naming convention.

    python -m catalog_schema.render_core      # after changing tables.py

``tests/test_db_schema.py`` fails when the file differs from what this renders, and checks it
against a database built by the migrations.
"""

from __future__ import annotations

import sys
from pathlib import Path

from sqlalchemy import Boolean, CheckConstraint, Date, DateTime, Float, ForeignKeyConstraint, Integer, MetaData, String, Text
from sqlalchemy import PrimaryKeyConstraint, TypeDecorator, UniqueConstraint

TARGET = Path(__file__).with_name("core_tables.py")
# Type classes as Core knows them; SQLModel's AutoString is a String to SQLite and PostgreSQL.
_TYPES = ((Boolean, "Boolean"), (DateTime, "DateTime"), (Date, "Date"), (Integer, "Integer"), (Float, "Float"), (Text, "Text"), (String, "String"))

HEADER = '''# SPDX-License-Identifier: MIT
"""The fleet tables as SQLAlchemy Core tables, for commands that run Core statements only.

Generated from catalog_schema/tables.py by ``python -m catalog_schema.render_core``; do not edit.
"""

from sqlalchemy import (
    Boolean,
    CheckConstraint,
    Column,
    Date,
    DateTime,
    Float,
    ForeignKeyConstraint,
    Index,
    Integer,
    MetaData,
    PrimaryKeyConstraint,
    String,
    Table,
    Text,
    UniqueConstraint,
)
from sqlalchemy.sql.elements import conv

metadata = MetaData()
'''


def q(value: object) -> str:
    """A Python literal of ``value``: text (names, SQL) in double quotes, as the project writes it."""
    if isinstance(value, (bool, int, float)):
        return repr(value)
    return '"' + str(value).replace("\\", "\\\\").replace('"', '\\"') + '"'


def type_name(column) -> str:
    kind = column.type
    if isinstance(kind, TypeDecorator):  # SQLModel's AutoString
        kind = kind.impl_instance
    for cls, name in _TYPES:
        if isinstance(kind, cls):
            if isinstance(kind, String) and getattr(kind, "length", None):
                raise ValueError(f"{column}: a String length is not rendered")
            return name
    raise ValueError(f"{column}: type {column.type!r} has no Core name here")


def _column(column) -> str:
    args = [q(column.name), type_name(column), f"nullable={column.nullable}"]
    if column.default is not None:
        if not column.default.is_scalar:
            raise ValueError(f"{column}: only scalar defaults are rendered")
        args.append(f"default={q(column.default.arg)}")
    if column.server_default is not None:
        args.append(f"server_default={q(column.server_default.arg)}")
    return f"    Column({', '.join(args)}),"


def _names(columns) -> str:
    return ", ".join(q(c.name) for c in columns)


def _constraint(constraint) -> str:
    name = f"name=conv({q(constraint.name)})"
    if isinstance(constraint, PrimaryKeyConstraint):
        return f"    PrimaryKeyConstraint({_names(constraint.columns)}, {name}),"
    if isinstance(constraint, UniqueConstraint):
        return f"    UniqueConstraint({_names(constraint.columns)}, {name}),"
    if isinstance(constraint, CheckConstraint):
        return f"    CheckConstraint({q(constraint.sqltext)}, {name}),"
    if isinstance(constraint, ForeignKeyConstraint):
        targets = ", ".join(q(e.target_fullname) for e in constraint.elements)
        ondelete = f", ondelete={q(constraint.ondelete)}" if constraint.ondelete else ""
        return f"    ForeignKeyConstraint([{_names(constraint.columns)}], [{targets}]{ondelete}, {name}),"
    raise ValueError(f"{constraint!r}: constraint type not rendered")


_ORDER = {PrimaryKeyConstraint: 0, ForeignKeyConstraint: 1, UniqueConstraint: 2, CheckConstraint: 3}


def render(metadata: MetaData) -> str:
    """The text of ``core_tables.py`` for ``metadata`` (tables in dependency order)."""
    out = [HEADER]
    for table in metadata.sorted_tables:
        lines = [f"\n{table.name.upper()} = Table(", f"    {q(table.name)},", "    metadata,"]
        lines += [_column(c) for c in table.columns]
        constraints = sorted(table.constraints, key=lambda c: (_ORDER[type(c)], str(c.name)))
        lines += [_constraint(c) for c in constraints]
        for index in sorted(table.indexes, key=lambda i: str(i.name)):
            lines.append(f"    Index(conv({q(index.name)}), {_names(index.columns)}, unique={index.unique}),")
        lines.append(")")
        out.append("\n".join(lines) + "\n")
    return "".join(out)


def main() -> None:
    from catalog_schema.tables import SQLModel

    text = render(SQLModel.metadata)
    changed = not TARGET.exists() or TARGET.read_text(encoding="utf-8") != text
    TARGET.write_text(text, encoding="utf-8")
    print(f"{'wrote' if changed else 'unchanged:'} {TARGET}", file=sys.stderr)


if __name__ == "__main__":
    main()
