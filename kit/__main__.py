# SPDX-License-Identifier: MIT
from kit.cli import main

main()
