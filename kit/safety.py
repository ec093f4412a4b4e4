# SPDX-License-Identifier: MIT
"""The caution every face of kit shows: the command line's help and the workbooks it writes.

Its own module so that writing a workbook does not load the command line (or click).
"""

SAFETY = (
    "CAUTION: steering gear works at high hydraulic pressure. Secure the rudder and release "
    "pressure before opening any part of the gear. The maker's manual, class rules and SOLAS come "
    "first; kit's figures are a planning aid and defer to local codes and licensed practice."
)
