# SPDX-License-Identifier: MIT
"""The files kit reads and writes: every path a user gives is opened or written here.

``input_files``, ``file_types``, ``toml_text``  input opened as regular files only, bounded in size
``particulars_file``, ``policy_file``  particulars and spares policy files (TOML) read and handed to the engine
``sheets``, ``xlsx_limits``  spreadsheets read safely (defusedxml, every part measured first)
``particulars_sheet``  the particulars sheet and its templates
``catalogue_sheet``, ``packs``, ``stock_sheet``, ``part_keys``  a supplier's catalogue and a vessel's stock read
    and checked (the store writes them); the columns that name a generic part
``plain_csv``, ``plain_catalogue``  the common case of a CSV catalogue read whole and checked in one
    pass; anything else left to ``catalogue_sheet``, which words every refusal
``rates_sheet``  a small CSV of exchange rates read and checked
``numbers``, ``currencies``, ``dates``  imported numbers, ISO 4217 codes, ISO 8601 dates
``safe_text``  formula text and control characters: checked on the way in (with
    :mod:`kit.engine.text_checks`), visible on the way out
``workbook``, ``bom_export``  the .xlsx with live formulas; CSV and JSON
``check_workbook``  the pre-voyage check, one sheet laid out for one A4 page
``enquiry_workbook``, ``enquiry_reply``, ``packs``  enquiries written, replies read and checked; a
    supplier's pack ("20 L") read in the part's unit
``print_setup``  how every workbook prints: A4 or Letter, page header, "page N of M", fitted where readable
``output_targets``, ``atomic``  which paths kit may write, and writing them whole or not at all

The files layer may use the engine and ``catalog_schema.conventions`` (shared constants that
import nothing); it imports no :mod:`kit.store`, no :mod:`kit.services` and no terminal library (``tests/test_lint.py`` checks it).
"""
