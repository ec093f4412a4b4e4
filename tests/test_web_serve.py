# SPDX-License-Identifier: MIT
"""``kit serve`` and ``kit demo --serve`` as a user starts them: a separate process on 127.0.0.1
that prints one line with its address and start token, and refuses what it must."""

from __future__ import annotations

import http.client
import re
import signal
import socket
import subprocess
import sys
import time

import pytest

SERVING = re.compile(r"^kit: serving http://127\.0\.0\.1:(\d+)/\?token=([A-Za-z0-9_\-]{40,})$")


def kit(*args: str) -> list[str]:
    return [sys.executable, "-m", "kit", *args]


def serving_line(proc: subprocess.Popen, pattern: re.Pattern = SERVING, timeout: float = 60) -> tuple[re.Match, list[str]]:
    """The line ``kit serve`` prints with its address, matched by ``pattern``, and the lines before it."""
    before = []
    deadline = time.monotonic() + timeout
    while time.monotonic() < deadline:
        line = proc.stdout.readline()
        if not line:
            pytest.fail(f"kit ended before serving: {before} {proc.stderr.read() if proc.stderr else ''}")
        found = pattern.match(line.strip())
        if found:
            return found, before
        before.append(line.strip())
    pytest.fail("kit did not print its address in time")


def started(proc: subprocess.Popen, timeout: float = 60) -> tuple[int, str, list[str]]:
    """The port and token of the line ``kit serve`` prints, and the lines before it."""
    found, before = serving_line(proc, SERVING, timeout)
    return int(found.group(1)), found.group(2), before


def get(port: int, path: str, headers: dict | None = None):
    conn = http.client.HTTPConnection("127.0.0.1", port, timeout=30)
    conn.request("GET", path, headers=headers or {})
    r = conn.getresponse()
    body = r.read()
    conn.close()
    return r, body


@pytest.fixture
def stop():
    procs = []
    yield procs.append
    for p in procs:  # only the processes this test started, by their own handle
        if p.poll() is None:
            p.send_signal(signal.SIGINT)
            try:
                p.wait(timeout=20)
            except subprocess.TimeoutExpired:
                p.kill()
                p.wait()


def test_serve_prints_one_line_and_the_token_opens_a_session(tmp_path, stop):
    proc = subprocess.Popen(kit("serve", "--db", str(tmp_path / "fleet.sqlite"), "--port", "0"),
                            stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    stop(proc)
    port, token, before = started(proc)
    assert before == []
    r, _ = get(port, "/alive")
    assert r.status == 401
    r, _ = get(port, f"/?token={token}")
    assert r.status == 303
    cookie = r.getheader("set-cookie").split(";")[0]
    r, body = get(port, "/alive", {"Cookie": cookie})
    assert r.status == 200 and body == b"kit: serving\n"
    r, _ = get(port, "/alive", {"Cookie": cookie, "Host": f"rebound.example:{port}"})
    assert r.status == 400
    proc.send_signal(signal.SIGINT)
    assert proc.wait(timeout=20) == 0
    assert token not in proc.stderr.read()  # no access log holds the token


def test_a_port_in_use_is_one_line_exit_2(tmp_path):
    taken = socket.socket()
    taken.bind(("127.0.0.1", 0))
    taken.listen(1)
    try:
        done = subprocess.run(kit("serve", "--db", str(tmp_path / "fleet.sqlite"), "--port", str(taken.getsockname()[1])),
                              capture_output=True, text=True, timeout=60)
    finally:
        taken.close()
    assert done.returncode == 2
    assert len(done.stderr.strip().splitlines()) == 1 and "--port" in done.stderr and "free port" in done.stderr
    assert "Traceback" not in done.stderr


def test_demo_serve_builds_the_demo_then_serves_it(tmp_path, stop):
    proc = subprocess.Popen(kit("demo", "--out", str(tmp_path / "demo"), "--serve", "--port", "0"),
                            stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    stop(proc)
    port, token, before = started(proc)
    assert before[0].startswith("demo fleet: 6 vessels")
    r, _ = get(port, f"/?token={token}")
    cookie = r.getheader("set-cookie").split(";")[0]
    r, body = get(port, "/", {"Cookie": cookie})
    assert r.status == 200 and b"CORVINA-BAY" in body


def _with_person(tmp_path) -> str:
    """A fleet database with one person in it (so the server asks people to sign in)."""
    db = str(tmp_path / "fleet.sqlite")
    pw = tmp_path / "pw"
    pw.write_text("gangway watch 0400\n")
    done = subprocess.run(kit("people", "add", "ada", "--name", "Ada Lind", "--role", "administrator",
                              "--password-file", str(pw), "--db", db), capture_output=True, text=True, timeout=120)
    assert done.returncode == 0, done.stderr
    return db


@pytest.mark.parametrize("extra,expected", [
    ([], "unless people sign in"),  # no people: never beyond this PC
])
def test_beyond_this_pc_without_people_is_refused(tmp_path, extra, expected):
    done = subprocess.run(kit("serve", "--db", str(tmp_path / "fleet.sqlite"), "--host", "127.0.0.2", "--port", "0", *extra),
                          capture_output=True, text=True, timeout=60)
    assert done.returncode == 2 and expected in done.stderr and len(done.stderr.strip().splitlines()) == 1


def test_beyond_this_pc_without_tls_or_a_proxy_is_refused(tmp_path):
    db = _with_person(tmp_path)
    done = subprocess.run(kit("serve", "--db", db, "--host", "127.0.0.2", "--port", "0"), capture_output=True, text=True, timeout=60)
    assert done.returncode == 2 and "TLS" in done.stderr and len(done.stderr.strip().splitlines()) == 1
    done = subprocess.run(kit("serve", "--db", db, "--host", "127.0.0.2", "--port", "0", "--behind-proxy"),
                          capture_output=True, text=True, timeout=60)
    assert done.returncode == 2 and "--trusted-proxy" in done.stderr


def test_with_people_and_tls_it_serves_https_with_secure_cookies(tmp_path, stop):
    import ssl

    db = _with_person(tmp_path)
    cert, key = tmp_path / "cert.pem", tmp_path / "key.pem"
    made = subprocess.run(["openssl", "req", "-x509", "-newkey", "rsa:2048", "-nodes", "-keyout", str(key), "-out", str(cert),
                           "-days", "2", "-subj", "/CN=kit.office.test"], capture_output=True, timeout=120)
    assert made.returncode == 0, made.stderr
    proc = subprocess.Popen(kit("serve", "--db", db, "--host", "127.0.0.2", "--port", "0", "--hostname", "kit.office.test",
                                "--tls-cert", str(cert), "--tls-key", str(key)),
                            stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    stop(proc)
    line = proc.stdout.readline().strip()
    found = re.match(r"^kit: serving https://kit\.office\.test:(\d+)/ \(people sign in\)$", line)
    assert found, line
    port = int(found.group(1))
    context = ssl._create_unverified_context()  # our own throwaway certificate
    conn = http.client.HTTPSConnection("127.0.0.2", port, timeout=30, context=context)
    conn.request("GET", "/sign-in", headers={"Host": f"kit.office.test:{port}"})
    r = conn.getresponse()
    r.read()
    assert r.status == 200
    cookie = r.getheader("set-cookie")
    assert "Secure" in cookie and "HttpOnly" in cookie
    assert "frame-ancestors 'none'" in r.getheader("content-security-policy")
    conn.request("GET", "/sign-in", headers={"Host": f"rebound.example:{port}"})  # a name not given: refused
    r = conn.getresponse()
    r.read()
    assert r.status == 400
    conn.close()


def _failed_addresses(db: str) -> list[str]:
    import sqlite3

    with sqlite3.connect(db) as conn:
        return [r[0] for r in conn.execute("SELECT address FROM login_failures ORDER BY id")]


def test_behind_a_proxy_only_the_trusted_proxy_is_believed(tmp_path, stop):
    """--behind-proxy --trusted-proxy 127.0.0.1: a request from 127.0.0.1 is taken to come from the
    client its X-Forwarded-For names (the address sign-in throttling counts) and over https (secure
    cookies); the same header from any other address is ignored. (203.0.113.0/24 is the
    documentation range of RFC 5737: a header value here, never a destination.)"""
    db = _with_person(tmp_path)
    proc = subprocess.Popen(kit("serve", "--db", db, "--host", "127.0.0.2", "--port", "0", "--hostname", "kit.office.test",
                                "--behind-proxy", "--trusted-proxy", "127.0.0.1"),
                            stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    stop(proc)
    found, _ = serving_line(proc, re.compile(r"^kit: serving http://kit\.office\.test:(\d+)/ \(people sign in\)$"))
    port = int(found.group(1))

    def failed_sign_in(source: str):
        conn = http.client.HTTPConnection("127.0.0.2", port, timeout=30, source_address=(source, 0))
        headers = {"Host": f"kit.office.test:{port}", "X-Forwarded-For": "203.0.113.9", "X-Forwarded-Proto": "https"}
        conn.request("GET", "/sign-in", headers=headers)
        r = conn.getresponse()
        body = r.read().decode()
        form_cookie = r.getheader("set-cookie")
        check = re.search(r'name="check" value="([^"]+)"', body).group(1)
        conn.request("POST", "/sign-in", body=f"login=ada&password=not+the+one+at+all&check={check}&next=/",
                     headers={**headers, "Content-Type": "application/x-www-form-urlencoded",
                              "Cookie": form_cookie.split(";")[0]})
        r = conn.getresponse()
        r.read()
        conn.close()
        return form_cookie, r.status

    cookie, status = failed_sign_in("127.0.0.1")
    assert status == 401 and "Secure" in cookie
    failed_sign_in("127.0.0.3")  # not the proxy: its forwarded header is not believed
    assert _failed_addresses(db) == ["203.0.113.9", "127.0.0.3"]
