# SPDX-License-Identifier: MIT
"""Pieces that many commands share: error handling and shared options."""

from __future__ import annotations

import functools
import sys
from typing import Any, Callable

import click


def reports_errors(func: Callable[..., Any]) -> Callable[..., Any]:
    """Turn the project's own errors into one line on stderr and exit status 2."""

    @functools.wraps(func)
    def wrapper(*args: Any, **kwargs: Any) -> Any:
        from kit.errors import KitError

        try:
            return func(*args, **kwargs)
        except KitError as exc:
            click.echo(f"kit: error: {exc}", err=True)
            sys.exit(2)

    return wrapper
