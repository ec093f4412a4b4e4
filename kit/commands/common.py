# SPDX-License-Identifier: MIT
"""Pieces that many commands share: error handling and shared options."""

from __future__ import annotations

import functools
import sys
from typing import TYPE_CHECKING, Any, Callable

import click

if TYPE_CHECKING:
    from kit.errors import KitError
    from kit.errors import UnknownVesselError as UnknownVesselErrorType


# How the command line names a vessel id it was given that the database does not hold: the
# command, then the argument or option the id came by (see _given_as); the commands that pick
# vessels of the fleet say "fleet database", the others "database" (words the tests assert).
FLEET_SELECTIONS = frozenset({"bom", "check", "parts register"})


# The option each command takes a value by, for the neutral name the library gives it in an
# ArgumentError (or a row the database refused for it), an OutputError or an error's ``setting``
# (the decimal mark a number is read with); the message is otherwise the library's.
OPTIONS = {
    "policy set": {"company or vessel": "--company/--vessel", "days of cover": "--days", "policy name": "--name",
                   "company": "--company", "vessel": "--vessel", "note": "--note"},
    "stock import": {"counting mode": "--mode", "vessel id": "--vessel", "decimal mark": "--decimal-mark"},
    "catalogue import": {"supplier name": "--supplier", "decimal mark": "--decimal-mark"},
    "rates import": {"decimal mark": "--decimal-mark"},
    "demo": {"demo folder": "--out", "port": "--port"},
    "serve": {"port": "--port"},
    "people add": {"login": "LOGIN", "name": "--name", "role": "--role"},
    "people change": {"login": "LOGIN", "name": "--name", "role": "--role"},
    "bom": {"days": "--days", "vessel id": "--vessel"},
    "check": {"days": "--days"},
    "enquiry write": {"days": "--days", "reply-by date": "--reply-by"},
    "template stock": {"days": "--days"},
    "purchasing set": {"base currency or handling days": "--base-currency/--handling-days",
                       "base currency": "--base-currency", "handling days": "--handling-days"},
    "rates set": {"currency": "CURRENCY", "rate": "RATE", "date set": "--on", "source": "--source"},
    "supplier prefer": {"supplier name": "NAME", "part key": "--part", "note": "--note"},
    "supplier unprefer": {"supplier name": "NAME", "part key": "--part"},
    "delivery set": {"delivery date": "--on", "port": "--port", "note": "--note", "vessel id": "VESSEL"},
    "delivery remove": {"delivery date": "--on"},
}
# Commands that take a vessel's id as an argument rather than by --vessel, and its name there.
def _command() -> str:
    """The command's words after the program's name ("policy set"), however kit was started
    (``kit``, or ``python -m kit``, whose program name is three words)."""
    ctx = click.get_current_context(silent=True)
    words = []
    while ctx is not None and ctx.parent is not None:
        words.append(ctx.info_name or "")
        ctx = ctx.parent
    return " ".join(reversed(words))


def _with_option(exc: KitError) -> KitError:
    """``exc`` in the command line's words: a value the library names neutrally gets the
    option it came by, and a value given with no file the command's name."""
    import dataclasses

    from catalog_schema.refusals import RefusedRowError
    from kit.errors import ArgumentError, OutputError

    command = _command()
    options = OPTIONS.get(command, {})
    setting = options.get(getattr(exc, "setting", None))
    if setting is not None and dataclasses.is_dataclass(exc):
        return dataclasses.replace(exc, setting=setting)
    option = options.get(getattr(exc, "field", None))
    if isinstance(exc, OutputError) and option is not None:
        return dataclasses.replace(exc, field=option)
    if not isinstance(exc, (ArgumentError, RefusedRowError)) or option is None:
        return exc
    return dataclasses.replace(exc, field=option, source=exc.source or f"kit {command}")


def _given_as(vessel_id: str) -> str:
    """How the user gave ``vessel_id`` to the running command: the argument (``VESSEL_ID``) or the
    option (``--vessel``) whose value it is; ``--vessel`` when none is found."""
    ctx = click.get_current_context(silent=True)
    for param in [] if ctx is None else ctx.command.params:
        value = ctx.params.get(param.name or "")
        if value == vessel_id or (isinstance(value, (tuple, list)) and vessel_id in value):
            return param.human_readable_name if isinstance(param, click.Argument) else param.opts[0]
    return "--vessel"


def _unknown_vessel(exc: UnknownVesselErrorType) -> str:
    from kit.errors import InputError

    command = _command()
    where = "fleet database" if command in FLEET_SELECTIONS else "database"
    hint = InputError(f"kit {command}", _given_as(exc.vessel_id),
                      f"the id of a vessel in the {where} (kit vessels lists them; letter case does not matter)",
                      got=repr(exc.vessel_id))
    return str(hint)


def reports_errors(func: Callable[..., Any]) -> Callable[..., Any]:
    """Turn the project's own errors into one line on stderr and exit status 2 (an unknown
    vessel with the option that named it), with outputs of the command's own checked (see
    :mod:`kit.files.output_targets`)."""

    @functools.wraps(func)
    def wrapper(*args: Any, **kwargs: Any) -> Any:
        from kit.errors import KitError, UnknownVesselError
        from kit.files.output_targets import protecting
        from kit.files.safe_text import visible

        try:
            with protecting(None):
                return func(*args, **kwargs)
        except UnknownVesselError as exc:
            click.echo(f"kit: error: {visible(_unknown_vessel(exc))}", err=True)
            sys.exit(2)
        except KitError as exc:  # stored text in a message must not break the one line
            click.echo(f"kit: error: {visible(str(_with_option(exc)))}", err=True)
            sys.exit(2)

    return wrapper


class OptionError(click.ClickException):
    """A refused option value, shown as kit shows bad input: one line on stderr, exit status 2
    (click's own usage errors print the usage lines too)."""

    exit_code = 2

    def __init__(self, param: click.Parameter | None, ctx: click.Context | None, expected: str, value: Any):
        from kit.errors import InputError

        command = "kit" if ctx is None else " ".join(["kit", *ctx.command_path.split()[1:]])
        name = param.opts[0] if param is not None and param.opts else "option"
        super().__init__(str(InputError(command, name, expected, got=repr(value))))

    def show(self, file: Any = None) -> None:
        click.echo(f"kit: error: {self.format_message()}", err=True)


class Days(click.ParamType):
    """A number of days for an option: a plain decimal (or whole number) from 0 to
    :data:`kit.files.numbers.MAX_DAYS`. ``click.FloatRange(min=0)`` takes ``inf``, ``nan`` and ``1e400``
    (as infinity); this type refuses them, with click's usual one line and exit status 2."""

    def __init__(self, whole: bool = False, maximum: int | None = None):
        self.whole = whole
        self.maximum = maximum
        self.name = "whole days" if whole else "days"

    def convert(self, value: Any, param: click.Parameter | None, ctx: click.Context | None) -> float | int:
        from kit.files.numbers import MAX_DAYS, parse_decimal

        most = MAX_DAYS if self.maximum is None else self.maximum
        number = value if isinstance(value, (int, float)) and not isinstance(value, bool) else parse_decimal(str(value).strip(), "point")
        if number is None or not 0 <= number <= most or (self.whole and not float(number).is_integer()):
            kind = "a whole number" if self.whole else "a plain number"
            raise OptionError(param, ctx, f"{kind} of days from 0 to {most}, e.g. {min(90, most)}", value)
        return int(number) if self.whole else float(number)


class IsoDate(click.ParamType):
    """A date for an option: an ISO 8601 calendar date, YYYY-MM-DD (see :mod:`kit.files.dates`)."""

    name = "YYYY-MM-DD"

    def convert(self, value: Any, param: click.Parameter | None, ctx: click.Context | None):
        import datetime as dt

        from kit.files.dates import EXPECTED, iso_date

        if isinstance(value, dt.date):
            return value
        day = iso_date(str(value))
        if day is None:
            raise OptionError(param, ctx, EXPECTED, value)
        return day


def decimal_mark_option(func: Callable[..., Any]) -> Callable[..., Any]:
    """``--decimal-mark point|comma`` for the imports (see :mod:`kit.files.numbers`)."""
    return click.option("--decimal-mark", "decimal", type=click.Choice(["point", "comma"]), default=None,
                        help="The decimal mark of the file's numbers: point (12.50) or comma (12,50). Default: comma "
                             "for a semicolon-separated CSV, point for a comma- or tab-separated CSV and for text "
                             "in a workbook's cells. A number with a grouping separator (1,250.00) or the other "
                             "mark is refused, never guessed.")(func)


def paper_option(func: Callable[..., Any]) -> Callable[..., Any]:
    """``--paper a4|letter``: the paper a workbook the command writes prints on (see :mod:`kit.files.print_setup`)."""
    return click.option("--paper", type=click.Choice(["a4", "letter"], case_sensitive=False), default="a4",
                        show_default=True, callback=lambda ctx, param, value: value.lower(),
                        help="The paper the workbook prints on: A4 (ISO 216) or US Letter.")(func)


def db_option(migrate: bool = True, unless: str | None = None) -> Callable[[Callable[..., Any]], Callable[..., Any]]:
    """Add ``--db`` (or env var ``KIT_DB``) and hand the command an open ``engine``.

    The value is a SQLite file path or a database URL; without one, kit's default SQLite file.
    With ``migrate`` a fresh database is built first and one at an old schema is refused.
    When the command's parameter ``unless`` is given (``bom --particulars``) the command needs no
    database: none is opened or made (not even its folder) and ``engine`` is None.
    Errors, including the database's own, become one line and exit status 2. No file the
    command writes may be the database (:func:`kit.files.output_targets.protecting`).
    """

    def decorate(func: Callable[..., Any]) -> Callable[..., Any]:
        @functools.wraps(func)
        def wrapper(*args: Any, db: str | None, **kwargs: Any) -> Any:
            from sqlalchemy.exc import DBAPIError

            from catalog_schema.engine import make_engine, parse_url, resolve_url, shown
            from catalog_schema.errors import DatabaseError
            from catalog_schema.migrate import require_current

            from kit.files.output_targets import protecting

            if unless is not None and kwargs.get(unless):
                url = resolve_url(db)
                with protecting(parse_url(url)):  # still no output may be the database's file
                    return func(*args, engine=None, **kwargs)
            engine = make_engine(resolve_url(db))
            try:
                if migrate:
                    require_current(engine)
                with protecting(engine.url):
                    return func(*args, engine=engine, **kwargs)
            except DBAPIError as exc:
                first = str(exc.orig).strip().splitlines()[0] if exc.orig else type(exc).__name__
                raise DatabaseError(shown(str(engine.url)), "refused the change, nothing was written", first) from None
            except UnicodeEncodeError as exc:  # files are read as strict UTF-8: only an argument gets here
                from kit.errors import InputError

                raise InputError("command line", "argument", "text in UTF-8",
                                 got=repr(exc.object[exc.start:exc.end] if isinstance(exc.object, str) else exc.reason)) from None
            finally:
                engine.dispose()

        option = click.option("--db", envvar="KIT_DB", metavar="PATH|URL", default=None,
                              help="Fleet database: a SQLite file or a postgresql+psycopg:// URL "
                                   "[env var KIT_DB; default ~/.local/share/kit/fleet.sqlite].")
        return option(reports_errors(wrapper))

    return decorate


def default_days(engine: Any, days: float | None, vessel_ids: Any = (), particulars: str | None = None,
                 policy_file: str | None = None) -> float:
    """``days`` as given, else the days of cover of the vessels' spares policies in force (see
    :func:`kit.services.policies.days_of_cover`), saying on stderr which were taken when they differ."""
    if days is not None:
        return days
    from kit.files.safe_text import visible
    from kit.services.policies import days_of_cover

    cover = days_of_cover(engine, vessel_ids, particulars=particulars, policy_file=policy_file)
    if cover.differ:
        click.echo(visible(f"kit: --days not given: {cover.explained()}"), err=True)
    return cover.days
