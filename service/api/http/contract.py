"""The OpenAPI document's own facts: servers, contact, license, declared tags.

Generated clients and linters read these: ``servers`` (a relative URL, so a client uses the
host it fetched the document from), ``info.contact`` and ``info.license``, and every tag an
operation uses declared once with a description, in the order the reference pages show.
"""

from __future__ import annotations

from typing import Any, Final

__all__ = ["TAGS", "document_contract"]

TAGS: Final[tuple[tuple[str, str], ...]] = (
    (
        "properties",
        "Water, vapor and ice at saturation, on the sublimation and melting lines, at a "
        "state, the constants; ice fraction of solutions, seawater and foods.",
    ),
    ("balances", "Flash-to-freeze and evaporative-cooling energy and mass balances."),
    (
        "simulations",
        "Vacuum-chamber processes over time: pump-down, flashing, freezing, with pump, "
        "condenser and heat gain.",
    ),
    ("sizing", "One case field solved for a cooling target on the chamber simulation."),
    ("calibrations", "Chamber-model fields fitted to a measured run, with intervals."),
    ("drying", "Primary drying of vials or trays: runs over a recipe and design spaces."),
    ("calculations", "Stored answers: fetch one by its id, list them with filters."),
    (
        "sources",
        "The statements answers cite by id: reference state, property sources, uncertainty "
        "statements, with their full texts (one versioned document).",
    ),
    ("operations", "Health, readiness and metrics for operators."),
)
"""Every tag the routes use, with its description (a test checks none is missing)."""


def document_contract(schema: dict[str, Any]) -> None:
    """Add servers, contact, license and the declared tags to an OpenAPI document."""
    schema["servers"] = [{"url": "/", "description": "The server this document came from."}]
    info = schema.setdefault("info", {})
    info["contact"] = {"name": "tripoint maintainers (see README.md of the deployment)"}
    info["license"] = {"name": "Proprietary"}
    schema["tags"] = [{"name": name, "description": text} for name, text in TAGS]
