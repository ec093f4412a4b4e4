# SPDX-License-Identifier: MIT
"""One module per page of ``kit serve``, each with a FastAPI ``router``; each calls one service per
thing it shows or does (:mod:`kit.services`)."""
