# SPDX-License-Identifier: MIT
"""kit: seals, oil, filter elements and spares for ship steering gear.

The package is laid out by idea, data flowing one way:

``particulars``  reads a unit's particulars (TOML) into SI floats (``units`` parses quantities)
``series``, ``housings``, ``orings``, ``vane_seals``, ``compounds``  size seals to the ISO series
``physics``, ``solas``  torque, swing time and the SOLAS II-1/29 rules
``oil``, ``filters``, ``spares``  quantities to keep on board
``requirements``  turns a vessel and a period into line items
``report``, ``cli``  the terminal and JSON faces

Everything below ``cli`` is plain Python with no terminal or database knowledge.
"""

__version__ = "0.1.0"
