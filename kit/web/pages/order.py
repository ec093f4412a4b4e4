# SPDX-License-Identifier: MIT
"""The order page (being built)."""

from __future__ import annotations

from fastapi import APIRouter

router = APIRouter()
