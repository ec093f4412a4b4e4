# SPDX-License-Identifier: MIT
"""kit: seals, oil, filter elements and spares for ship steering gear.

The package is laid out in layers, data flowing one way (a layer imports only those below it):

``cli``, ``commands``  the command line (a face): parse, call one service, show the answer
``services``  one function per thing a user does, owning its transaction (see its docstring)
``store``     every query on the fleet database, each function taking a Connection
``files``     the files kit reads and writes: particulars, sheets, workbooks, CSV/JSON, atomic writes
``engine``    the calculations, pure and in SI floats, with the standard data tables
``errors``, ``safety``  shared by every layer: the errors kit raises, the caution text
``data``      the standard tables as CSV with their provenance (read by ``engine.standard_tables``)

Nothing below ``cli`` and ``commands`` imports click or rich; the engine reads no database.
Each package's docstring lists its modules; ``tests/test_lint.py`` checks the imports.
"""

__version__ = "0.1.0"
