# SPDX-License-Identifier: MIT
"""kit: seals, oil, filter elements and spares for ship steering gear.

The package is laid out by idea, data flowing one way:

``particulars``  reads a unit's particulars (TOML) into SI floats (``units`` parses quantities)
``series``, ``housings``, ``orings``, ``compounds``, ``seal_kit``  size seals to the ISO series
``physics``, ``solas``  torque, swing time and the SOLAS II-1/29 rules
``oil``, ``filters``, ``spares``  quantities to keep on board
``requirements``  turns a vessel and a period into line items
``report``  a result as JSON; ``display_units`` the units results are shown in
``*_store``, ``order_sources``, ``database_status``  queries on the fleet database, each taking a Connection
``services``  one function per thing a user does, owning its transaction (see its docstring)
``cli``, ``commands``  the command line: parse, call one service, show the answer

Nothing below ``cli`` and ``commands`` imports click or rich; the engine modules read no database.
"""

__version__ = "0.1.0"
