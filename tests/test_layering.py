"""The layout's rules, read from the source: the core knows nothing of HTTP, the shared HTTP
machinery knows no resource, and every per-resource module of the HTTP layer lives in its
resource's package."""

from __future__ import annotations

import ast
from pathlib import Path

import pytest

_SERVICE = Path(__file__).resolve().parents[1] / "service"

# What the core must never import: the web framework and its models, unit parsing (the HTTP
# layer reads units to SI), the record store, the settings, and the iapws package, which is a
# test and benchmark reference only (not installed with the service).
_FORBIDDEN_IN_CORE = (
    "fastapi",
    "starlette",
    "pydantic",
    "pydantic_settings",
    "uvicorn",
    "pint",
    "sqlalchemy",
    "iapws",
    "service.api",
    "service.records",
    "service.settings",
)
_RESOURCES = ("properties", "balances", "simulations", "calculations", "operations")


def _imported_modules(path: Path) -> set[str]:
    tree = ast.parse(path.read_text(), filename=str(path))
    found: set[str] = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            found.update(alias.name for alias in node.names)
        elif isinstance(node, ast.ImportFrom) and node.module and node.level == 0:
            found.add(node.module)
    return found


def _violations(folder: Path, forbidden: tuple[str, ...]) -> list[str]:
    return sorted(
        f"{path.relative_to(_SERVICE.parent)} imports {module}"
        for path in folder.rglob("*.py")
        for module in _imported_modules(path)
        if any(module == name or module.startswith(name + ".") for name in forbidden)
    )


def test_the_core_never_imports_the_http_layer_or_its_libraries() -> None:
    assert len(list((_SERVICE / "core").rglob("*.py"))) > 40  # the walk sees the core
    assert _violations(_SERVICE / "core", _FORBIDDEN_IN_CORE) == []


def test_the_shared_http_machinery_imports_no_resource_package() -> None:
    forbidden = tuple(f"service.api.{name}" for name in _RESOURCES)
    assert _violations(_SERVICE / "api" / "http", forbidden) == []


def test_the_http_layer_has_no_module_outside_a_package_but_the_app() -> None:
    loose = sorted(path.name for path in (_SERVICE / "api").glob("*.py"))
    assert loose == ["__init__.py", "app.py"]


@pytest.mark.parametrize("resource", _RESOURCES)
def test_every_resource_package_has_its_router_and_schemas(resource: str) -> None:
    package = _SERVICE / "api" / resource
    assert (package / "router.py").is_file()
    assert (package / "schemas.py").is_file()


def test_the_detector_sees_a_forbidden_import(tmp_path: Path) -> None:
    # The check itself can fail: a module importing fastapi is reported.
    (tmp_path / "bad.py").write_text("from fastapi import APIRouter\nimport numpy\n")
    assert _imported_modules(tmp_path / "bad.py") == {"fastapi", "numpy"}
