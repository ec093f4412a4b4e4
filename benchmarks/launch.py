# SPDX-License-Identifier: MIT
"""Run one command and print, as JSON, its wall time and peak resident memory.

    python benchmarks/launch.py COMMAND [ARG ...]

The benchmark starts each timed command through this small process. On Linux a child's
``ru_maxrss`` starts from the high-water mark of the process it was forked from (exec keeps
it), so a command started straight from the benchmark, which holds the generated fleet in
memory, would be charged with the benchmark's own memory.
"""

import json
import resource
import subprocess
import sys
import time

if __name__ == "__main__":
    start = time.perf_counter()
    proc = subprocess.run(sys.argv[1:], stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)
    seconds = time.perf_counter() - start
    print(json.dumps({"seconds": seconds, "peak_mb": resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss / 1024,
                      "returncode": proc.returncode, "stderr": proc.stderr.decode(errors="replace")[-4000:]}))
