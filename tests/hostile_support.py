# SPDX-License-Identifier: MIT
"""Shared pieces of the hostile tests on imports: a fleet database with registered parts, kit run
against it, and the check that a refusal is one line, exit status 2 and nothing written."""

from __future__ import annotations

from pathlib import Path

from click.testing import CliRunner, Result
from sqlalchemy import select

from catalog_schema.engine import make_engine
from db_support import TOML_CYLINDER, dump
from kit.cli import main
from kit.store.parts_store import PARTS


class Fleet:
    """A SQLite fleet database in ``folder`` holding the test vessel and its generic parts."""

    def __init__(self, folder: Path, url: str | None = None):
        self.folder = folder
        self.url = url or f"sqlite:///{folder / 'fleet.sqlite'}"
        toml = folder / "v.toml"
        toml.write_text(TOML_CYLINDER)
        for args in (["load", str(toml)], ["parts", "register"]):
            done = self.kit(*args)
            assert done.exit_code == 0, done.output
        self.engine = make_engine(self.url)
        with self.engine.connect() as conn:
            self.keys = list(conn.execute(select(PARTS.c.key).order_by(PARTS.c.key)).scalars())
        self.key = self.keys[0]

    def kit(self, *args: str) -> Result:
        return CliRunner().invoke(main, [*map(str, args), "--db", self.url])

    def file(self, name: str, text: str) -> Path:
        path = self.folder / name
        path.write_text(text, encoding="utf-8")
        return path

    def refused(self, args: list, line: str) -> None:
        """``kit ARGS`` prints ``kit: error: LINE`` alone on stderr, exits 2 and changes nothing."""
        before = dump(self.engine)
        done = self.kit(*args)
        assert (done.exit_code, done.stderr, done.stdout) == (2, f"kit: error: {line}\n", "")
        assert dump(self.engine) == before


def workbook(path: Path, sheet: str, rows: list[list]) -> Path:
    """A one-sheet .xlsx holding ``rows`` (the header first), as a spreadsheet program saves it."""
    import openpyxl

    wb = openpyxl.Workbook()
    wb.active.title = sheet
    for row in rows:
        wb.active.append(row)
    wb.save(path)
    return path


def refused_without_db(args: list, line: str) -> None:
    """The same for a command that needs no database (or is refused before opening one)."""
    done = CliRunner().invoke(main, [*map(str, args)])
    assert (done.exit_code, done.stderr, done.stdout) == (2, f"kit: error: {line}\n", "")
