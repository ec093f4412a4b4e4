# SPDX-License-Identifier: MIT
"""The units kit shows its SI results in, and the factors from SI to them, in one place.

The engine computes in SI (m, m^3, Pa, N m); people read litres, bar, kN m and millimetres.
Parsing input with units is :mod:`kit.engine.units` (pint); these are plain factors for output, exact
by definition unless a source is given.
"""

L_PER_M3 = 1000.0  # 1 L = 1 dm^3 (SI brochure, 9th ed., table 8)
US_GAL_PER_M3 = 1 / 0.003785411784  # NIST SP 811: 1 US gal = 3.785411784 L
PA_PER_BAR = 1e5  # 1 bar = 1e5 Pa (ISO 80000-4)
KN_PER_N = 1e-3  # also kN m per N m
MM_PER_M = 1000.0
L_MIN_PER_M3_S = 60000.0  # L/min per m^3/s: 1000 L x 60 s


def bar(pa: float) -> float:
    """Pascal [Pa] to bar."""
    return pa / PA_PER_BAR
