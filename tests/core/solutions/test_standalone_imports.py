"""Every module of service.core.solutions imports on its own, in a fresh interpreter.

The food and lookup modules use two of the balances' modules, whose package imports the
solutions in turn; the package's __init__ fixes the order (a cycle otherwise fails when a
solutions module is the first thing imported).
"""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest

import service.core.solutions

MODULES = sorted(
    f"service.core.solutions.{path.stem}"
    for path in Path(service.core.solutions.__file__).parent.glob("*.py")
    if path.stem != "__init__"
)


@pytest.mark.parametrize("module", MODULES)
def test_module_imports_first(module: str) -> None:
    root = Path(service.core.solutions.__file__).parents[3]
    completed = subprocess.run(
        [sys.executable, "-c", f"import {module}"],
        cwd=root,
        capture_output=True,
        text=True,
        check=False,
    )
    assert completed.returncode == 0, completed.stderr
