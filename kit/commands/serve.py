# SPDX-License-Identifier: MIT
"""``kit serve``: the fleet database as pages in a browser, on this PC or for an office."""

from __future__ import annotations

import click

from kit.commands.common import db_option, reports_errors
from kit.safety import SAFETY

DEFAULT_PORT = 8750
LOOPBACK = ("127.0.0.1", "::1", "localhost")


def bound_socket(host: str, port: int):
    """A listening socket on ``host``:``port`` (0: any free port), or one line saying why not."""
    import socket

    from kit.errors import ArgumentError

    family = socket.AF_INET6 if ":" in host else socket.AF_INET
    sock = socket.socket(family, socket.SOCK_STREAM)
    try:
        sock.setsockopt(socket.SOL_SOCKET, socket.SO_REUSEADDR, 1)
        sock.bind((host, port))
    except OSError as exc:
        sock.close()
        raise ArgumentError("", "port", "a free port on this PC (or 0 for any free one)",
                            got=f"{host} port {port}: {exc.strerror}") from None
    sock.listen(512)
    return sock


def _refuse_unsafe_start(engine, host: str, tls: bool, proxy: bool, trusted: tuple[str, ...]) -> bool:
    """Whether people sign in; refuse (one line) to serve beyond this PC without people who sign in
    and without TLS, given directly or by a proxy in front."""
    from kit.errors import ArgumentError
    from kit.services.people import anyone_signs_in

    people = anyone_signs_in(engine)
    if proxy and not trusted:
        raise ArgumentError("", "--trusted-proxy", "the address of the proxy in front (only its forwarded headers are believed)",
                            got="none")
    if host not in LOOPBACK:
        if not people:
            raise ArgumentError("", "--host", "127.0.0.1, unless people sign in (kit people add adds someone)", got=host)
        if not (tls or proxy):
            raise ArgumentError("", "--host", "127.0.0.1, unless the server has TLS (--tls-cert and --tls-key) "
                                "or a TLS-terminating proxy stands in front (--behind-proxy)", got=host)
    return people


def serve_engine(engine, port: int, echo=click.echo, *, host: str = "127.0.0.1", names: tuple[str, ...] = (),
                 tls: tuple[str, str] | None = None, proxy: bool = False, trusted: tuple[str, ...] = ()) -> None:
    """Serve ``engine``'s fleet database on ``host``:``port`` until interrupted, printing one line
    with the address (and, with no people, the start token)."""
    import gc
    import secrets

    import uvicorn

    from kit.web.app import create_app

    gc.enable()  # a server runs for days: the commands' paused cycle collector must run again
    people = _refuse_unsafe_start(engine, host, tls is not None, proxy, trusted)
    if tls is not None:
        from kit.files.input_files import check_input, TLS_FILE

        for path in tls:
            check_input(path, TLS_FILE)
    sock = bound_socket(host, port)
    port = sock.getsockname()[1]
    token = secrets.token_urlsafe(32)
    app = create_app(engine, token=token, host=host, port=port, people=people, secure_cookies=tls is not None or proxy,
                     names=names)
    # no access log: the first request's address holds the start token. Forwarded headers are
    # believed only from the trusted proxy (uvicorn believes 127.0.0.1 by default otherwise).
    config = uvicorn.Config(app, log_level="warning", access_log=False, server_header=False, date_header=False,
                            proxy_headers=proxy, forwarded_allow_ips=",".join(trusted) if proxy else "",
                            ssl_certfile=tls[0] if tls else None, ssl_keyfile=tls[1] if tls else None)
    scheme = "https" if tls else "http"
    shown_host = names[0] if names else (f"[{host}]" if ":" in host else host)
    if people:
        echo(f"kit: serving {scheme}://{shown_host}:{port}/ (people sign in)")
    else:
        echo(f"kit: serving {scheme}://{shown_host}:{port}/?token={token}")
    try:
        uvicorn.Server(config).run(sockets=[sock])
    except KeyboardInterrupt:  # uvicorn stops gracefully on Ctrl+C, then raises it again
        pass
    finally:
        sock.close()
    echo("kit: stopped serving")


@click.command(epilog=SAFETY)
@click.option("--port", type=click.IntRange(0, 65535), default=DEFAULT_PORT, show_default=True,
              help="Port to serve on (0: any free port).")
@click.option("--host", default="127.0.0.1", show_default=True,
              help="Address to serve on. Anything but this PC (127.0.0.1) needs people who sign in (kit people add) "
                   "and TLS (--tls-cert/--tls-key) or --behind-proxy.")
@click.option("--hostname", "names", multiple=True, metavar="NAME",
              help="A name browsers reach the server by (e.g. kit.office.example); requests naming another host are refused.")
@click.option("--tls-cert", type=click.Path(dir_okay=False), help="TLS certificate file (PEM), with --tls-key.")
@click.option("--tls-key", type=click.Path(dir_okay=False), help="TLS private key file (PEM), with --tls-cert.")
@click.option("--behind-proxy", is_flag=True, help="A TLS-terminating proxy stands in front: believe its forwarded "
              "headers (client address, https), from --trusted-proxy only.")
@click.option("--trusted-proxy", "trusted", multiple=True, metavar="ADDR", help="The proxy's address (repeat for more).")
@db_option()
@reports_errors
def serve(engine, port, host, names, tls_cert, tls_key, behind_proxy, trusted) -> None:
    """Serve the fleet database as pages in a browser: the fleet, each vessel's gear checks and
    stock, the order and enquiries, suppliers' catalogues and particulars.

    With no people in the database it serves this PC only (127.0.0.1) and prints one line with
    the address to open, holding a random start token. Once people are added (kit people add),
    each signs in with a password and sees and does what their role allows; then it may serve an
    office (--host) over TLS or behind a TLS-terminating proxy. Stop with Ctrl+C.

    Example: kit serve --db fleet.sqlite --port 8750
    """
    from kit.errors import ArgumentError

    if bool(tls_cert) != bool(tls_key):
        raise ArgumentError("", "--tls-cert/--tls-key", "both files, or neither", got="one of them")
    serve_engine(engine, port, host=host, names=names, tls=(tls_cert, tls_key) if tls_cert else None,
                 proxy=behind_proxy, trusted=trusted)
