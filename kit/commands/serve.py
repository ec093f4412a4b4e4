# SPDX-License-Identifier: MIT
"""``kit serve``: the fleet database as pages in a browser on this PC."""

from __future__ import annotations

import click

from kit.commands.common import db_option, reports_errors
from kit.safety import SAFETY

DEFAULT_PORT = 8750


def bound_socket(host: str, port: int):
    """A listening socket on ``host``:``port`` (0: any free port), or one line saying why not."""
    import socket

    from kit.errors import ArgumentError

    sock = socket.socket(socket.AF_INET, socket.SOCK_STREAM)
    try:
        sock.bind((host, port))
    except OSError as exc:
        sock.close()
        raise ArgumentError("", "port", "a free port on this PC (or 0 for any free one)",
                            got=f"{port}: {exc.strerror}") from None
    sock.listen(128)
    return sock


def serve_engine(engine, port: int, echo=click.echo) -> None:
    """Serve ``engine``'s fleet database on 127.0.0.1:``port`` until interrupted, printing the one
    line with the address and start token."""
    import gc
    import secrets

    import uvicorn

    from kit.web.app import create_app

    gc.enable()  # a server runs for days: the commands' paused cycle collector must run again
    host = "127.0.0.1"
    sock = bound_socket(host, port)
    port = sock.getsockname()[1]
    token = secrets.token_urlsafe(32)
    app = create_app(engine, token=token, host=host, port=port)
    # no access log: the first request's address holds the start token
    config = uvicorn.Config(app, log_level="warning", access_log=False, server_header=False, date_header=False)
    echo(f"kit: serving http://{host}:{port}/?token={token}")
    try:
        uvicorn.Server(config).run(sockets=[sock])
    except KeyboardInterrupt:  # uvicorn stops gracefully on Ctrl+C, then raises it again
        pass
    finally:
        sock.close()
    echo("kit: stopped serving")


@click.command(epilog=SAFETY)
@click.option("--port", type=click.IntRange(0, 65535), default=DEFAULT_PORT, show_default=True,
              help="Port on 127.0.0.1 to serve on (0: any free port).")
@db_option()
@reports_errors
def serve(engine, port) -> None:
    """Serve the fleet database as pages in a browser on this PC: the fleet, each vessel's gear
    checks and stock, the order and enquiries, suppliers' catalogues and particulars.

    Binds 127.0.0.1 only and prints one line with the address to open; the address carries a
    random start token, and a browser without it is refused. Stop with Ctrl+C.

    Example: kit serve --db fleet.sqlite --port 8750
    """
    serve_engine(engine, port)
