"""Run every benchmark in this folder, one after the other (``make bench``).

Each benchmark prints its own ratios, measured side by side against its references
in one run. Nothing here asserts a time; the numbers are for reading and for
docs/benchmarks.md.
"""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path


def main() -> int:
    """Run ``bench_*.py`` in sorted order; return the worst exit code."""
    worst = 0
    for script in sorted(Path(__file__).parent.glob("bench_*.py")):
        print(f"\n=== {script.name} ===", flush=True)
        completed = subprocess.run([sys.executable, str(script)], check=False)
        worst = max(worst, completed.returncode)
    return worst


if __name__ == "__main__":
    raise SystemExit(main())
