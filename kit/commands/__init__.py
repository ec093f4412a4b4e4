# SPDX-License-Identifier: MIT
"""One module per ``kit`` command; each imports the engine only inside the command body."""
