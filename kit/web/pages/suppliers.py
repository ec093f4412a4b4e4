# SPDX-License-Identifier: MIT
"""The suppliers page (being built)."""

from __future__ import annotations

from fastapi import APIRouter

router = APIRouter()
