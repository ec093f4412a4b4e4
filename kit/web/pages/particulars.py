# SPDX-License-Identifier: MIT
"""The particulars page (being built)."""

from __future__ import annotations

from fastapi import APIRouter

router = APIRouter()
