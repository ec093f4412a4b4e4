# SPDX-License-Identifier: MIT
"""The engine: the calculations, pure and in SI floats, each formula's source in its docstring.

One module per idea, data flowing one way:

``units``  the one pint registry; strings with units -> SI floats
``particulars``, ``rudder``  the particulars model and its checks (see below)
``standard_tables``  the standard data tables in ``kit/data``, each checked against its sha256
``series``, ``housings``, ``orings``, ``compounds``, ``seal_kit``  seals sized to the ISO series
``physics``, ``solas``, ``checks``  torque, swing time and the SOLAS II-1/29 rules
``oil``, ``oil_grades``, ``filters``, ``spares``  quantities to keep on board and the spares policy
``parts``, ``requirements``  a vessel and a period -> results and line items
``purchasing``  offers, exchange rates, preferred suppliers and deliveries, as plain values
``bom``, ``preflight``  consolidation over vessels less stock; the pre-voyage shortfall
``enquiry``  an order shaped into enquiries, one per supplier and one open; what a reply answers
``report``, ``display_units``  a result as a JSON dict; the units results are shown in

The engine imports no database (sqlalchemy, catalog_schema), no :mod:`kit.store`, no
:mod:`kit.services` and no terminal library (``tests/test_lint.py`` checks it). Two modules still
read a file through :mod:`kit.files`: ``particulars`` (the TOML reader is interleaved with the
field-by-field checks that make the model; splitting it is left for later) and
``spares.load_policy`` (the company's policy file).
"""
