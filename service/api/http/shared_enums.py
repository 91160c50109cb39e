"""Every enumeration in the OpenAPI document defined once, in components, and referenced.

pydantic writes a ``Literal`` field's choices inline, and the GET lookups' query parameters
inline their enum definitions (``http.query``), so one concept (the unit set, the
formulation) appears as many separate ``enum`` schemas, and a generated client makes one
enum class per appearance. :func:`share_enums` moves each distinct set of choices to
``components.schemas`` under one name and puts a ``$ref`` where it stood, keeping the
field's own description and default beside the reference (OpenAPI 3.1 allows them).

A set of choices is named from :data:`ENUM_NAMES` where it is listed there, else from the
title pydantic gave it (an ``Enum`` class name) or the property that holds it.
"""

from __future__ import annotations

import re
from typing import Any, Final

__all__ = ["ENUM_NAMES", "share_enums"]

ENUM_NAMES: Final[dict[frozenset[str], tuple[str, str | None]]] = {
    frozenset({"SI", "engineering", "US"}): (
        "UnitSet",
        "Unit set of the results: `SI`, `engineering` (degC, kPa, kJ/kg) or `US` "
        "(degF, psi, Btu/lb).",
    ),
    frozenset({"IAPWS-95", "IAPWS-IF97"}): (
        "Formulation",
        "Property formulation: `IAPWS-95` (the scientific one) or `IAPWS-IF97` (the "
        "industrial one).",
    ),
    frozenset({"liquid", "vapor", "ice"}): ("Phase", "Phase of water: liquid, vapor or ice Ih."),
    frozenset({"non-ideal", "ideal"}): (
        "SolutionModel",
        "Solution model of a named solute: `non-ideal` (the solute's own activity model) "
        "or `ideal` (ideal dilute solution).",
    ),
    frozenset({"integrated", "mean-vapor-enthalpy"}): (
        "FlashFreezeMethod",
        "How the flash-to-freeze balance is solved: `integrated` along the cooling path, "
        "or with one `mean-vapor-enthalpy`.",
    ),
    frozenset({"equilibrium", "kinetic"}): ("EvaporationModel", None),
    frozenset({"vial", "tray"}): ("DryingContainer", None),
    frozenset({"linear", "soft_l1", "huber", "cauchy"}): ("CalibrationLoss", None),
    frozenset({"log", "linear"}): ("EstimateScale", None),
    frozenset({"smallest", "largest"}): ("SizingDirection", None),
}
"""Names (and shared descriptions) of the enumerations in the document today; one not
listed gets a name from its title or property, and the field's description."""

_WORD = re.compile(r"[A-Za-z0-9]+")


def _pascal(text: str) -> str:
    return "".join(word[:1].upper() + word[1:] for word in _WORD.findall(text))


class _Registry:
    def __init__(self, components: dict[str, Any]) -> None:
        self.components = components
        self.by_values: dict[tuple[str, ...], str] = {}
        for name, schema in components.items():
            if isinstance(schema, dict) and "enum" in schema:
                self.by_values.setdefault(_key(schema), name)

    def name_for(self, schema: dict[str, Any], owner: str, holder: str | None) -> str:
        key = _key(schema)
        known = self.by_values.get(key)
        if known is not None:
            return known
        listed = ENUM_NAMES.get(frozenset(key))
        title = schema.get("title")
        if listed is not None:
            name, description = listed
        else:
            base = title if isinstance(title, str) and " " not in title else None
            name = _pascal(base or holder or owner or "Choice")
            description = None
        if name in self.components:
            name = _pascal(owner) + name
        while name in self.components:
            name += "Choice"
        definition: dict[str, Any] = {
            key_: value for key_, value in schema.items() if key_ in ("type", "enum")
        }
        definition["title"] = name
        definition["description"] = (
            description
            or schema.get("description")
            or (f"One of: {', '.join(f'`{value}`' for value in schema['enum'])}.")
        )
        self.components[name] = definition
        self.by_values[key] = name
        return name


def _key(schema: dict[str, Any]) -> tuple[str, ...]:
    return tuple(str(value) for value in schema["enum"])


_KEPT_BESIDE_REFERENCE = ("description", "default", "examples", "deprecated")


def _replace(node: Any, registry: _Registry, owner: str, holder: str | None) -> Any:
    if isinstance(node, list):
        return [_replace(item, registry, owner, holder) for item in node]
    if not isinstance(node, dict):
        return node
    if "enum" in node and "$ref" not in node:
        name = registry.name_for(node, owner, holder)
        shared: dict[str, Any] = {"$ref": f"#/components/schemas/{name}"}
        for key in _KEPT_BESIDE_REFERENCE:
            if key in node:
                shared[key] = node[key]
        return shared
    result: dict[str, Any] = {}
    for key, value in node.items():
        if key == "properties" and isinstance(value, dict):
            result[key] = {
                name: _replace(item, registry, owner, name) for name, item in value.items()
            }
        else:
            result[key] = _replace(value, registry, owner, holder)
    return result


def share_enums(schema: dict[str, Any]) -> None:
    """Define each enumeration of ``schema`` once in components and reference it everywhere."""
    components: dict[str, Any] = schema.setdefault("components", {}).setdefault("schemas", {})
    registry = _Registry(components)
    for name in list(components):
        definition = components[name]
        if isinstance(definition, dict) and "enum" in definition:
            listed = ENUM_NAMES.get(frozenset(_key(definition)))
            if listed is not None and listed[0] == name:
                definition["description"] = listed[1]
            continue
        components[name] = _replace(definition, registry, name, None)
    for path, item in schema.get("paths", {}).items():
        for method, operation in item.items():
            if not isinstance(operation, dict):
                continue
            owner = str(operation.get("operationId") or f"{method} {path}")
            for parameter in operation.get("parameters", []):
                if "schema" in parameter:
                    parameter["schema"] = _replace(
                        parameter["schema"], registry, owner, parameter.get("name")
                    )
            contents = [operation.get("requestBody", {}).get("content", {})]
            contents += [
                response.get("content", {})
                for response in operation.get("responses", {}).values()
                if isinstance(response, dict)
            ]
            for content in contents:
                for media in content.values():
                    if "schema" in media:
                        media["schema"] = _replace(media["schema"], registry, owner, None)
