# SPDX-License-Identifier: MIT
"""The store: every query on the fleet database, over catalog_schema's Core tables.

``fleet_store``  vessels, units and rudders saved and read back
``parts_store``  generic parts and their catalogue entries
``policy_store``  the spares policy in force per company and vessel
``stock_import``, ``catalogue_import``  a vessel's stock and a supplier's catalogue written (read and
    checked by :mod:`kit.files.stock_sheet` and :mod:`kit.files.catalogue_sheet`)
``order_sources``  stock and catalogue offers read for an order
``purchasing_store``  the purchasing records an order reads: base currency, rates in force, preferences, deliveries
``purchasing_records``  base currency and handling margin, exchange rates, preferred suppliers and
    deliveries written and listed
``enquiries``  enquiries recorded and read back for their replies; the next delivery of each vessel
``database_status``  rows per table
``vessel_ids``  a vessel id as typed resolved to the stored one (any letter case); case twins refused
``fleet_overview``  the fleet at a glance: units, last count, next delivery, in one query

Only the store runs queries. A store function takes a Connection and leaves the transaction
to its caller (a function in :mod:`kit.services`). The store may use the engine and the files;
it imports no :mod:`kit.services`, reads no sheet (openpyxl, :mod:`kit.files.sheets`) and no terminal library (``tests/test_lint.py`` checks it).
"""
