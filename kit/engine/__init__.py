# SPDX-License-Identifier: MIT
"""The engine: the calculations, pure and in SI floats, each formula's source in its docstring.

One module per idea, data flowing one way:

``units``  the one pint registry; strings with units -> SI floats
``particulars``, ``rudder``  the particulars model and its checks, from a parsed TOML document
``standard_tables``  the standard data tables in ``kit/data``, each checked against its sha256
``series``, ``housings``, ``orings``, ``compounds``, ``seal_kit``  seals sized to the ISO series
``physics``, ``solas``, ``checks``  torque, swing time and the SOLAS II-1/29 rules
``oil``, ``oil_grades``, ``filters``, ``spares``  quantities to keep on board and the spares policy
``parts``, ``requirements``  a vessel and a period -> results and line items
``purchasing``  offers, exchange rates, preferred suppliers and deliveries, as plain values
``supplier_choice``  each line's supplier (money, preference, time), order-by dates, oil in offered packs
``series_of_hulls``  sister ships built alike, and each order line's quantity per hull
``bom``, ``preflight``  consolidation over vessels less stock; the pre-voyage shortfall and what it covered
``order_notes``  what an order comes to, in words: totals, late lines, missing rates, rules not met
``enquiry``  an order shaped into enquiries, one per supplier and one open; what a reply answers
``report``, ``display_units``  a result as a JSON dict; the units results are shown in
``report_rows``  that dict as the readable report's rows, the same on a terminal and a page
``text_checks``  the control-character check every stored text passes

The engine reads no file a user gives: it takes parsed data (``particulars.vessel_from_dict``,
``spares.policy_from_data``), and :mod:`kit.files` reads the files (``particulars_file``,
``policy_file``). It imports no database (sqlalchemy, catalog_schema), no :mod:`kit.files`, no
:mod:`kit.store`, no :mod:`kit.services` and no terminal library (``tests/test_lint.py`` checks it).
"""
