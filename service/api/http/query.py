"""Query strings read into one pydantic model per GET operation, and documented from it.

FastAPI resolves every declared query parameter as a dependency of its own. For the four
parameters of a property lookup that cost about 30 microseconds a request (profiled with
cProfile and timed in-process), several times the one-point lookup itself. The GET
lookups therefore declare a model (``SaturationQuery``...) and read the query with
:func:`read_query`: one ``model_validate`` call, about 2 microseconds. Errors are the same
``RequestValidationError`` (``loc = ("query", field)``) that FastAPI raises, so they
become the same 422 problem documents; :func:`query_parameters` puts the model's fields
into the OpenAPI operation as query parameters.
"""

from __future__ import annotations

from typing import Any, TypeVar

from fastapi import Request
from fastapi.exceptions import RequestValidationError
from pydantic import BaseModel, ValidationError

from service.api.http.detail import DETAIL_PARAMETER

__all__ = ["query_parameters", "read_query"]

QueryModel = TypeVar("QueryModel", bound=BaseModel)


def read_query(request: Request, model: type[QueryModel]) -> QueryModel:
    """Validate the request's query string with ``model``.

    A parameter given twice takes its last value, as FastAPI's own query parameters do.
    ``detail``, which every answering route takes, is the route class's
    (:mod:`service.api.http.detail`), not the model's.

    Raises
    ------
    RequestValidationError
        Each error located at ``("query", field)``.
    """
    try:
        query = dict(request.query_params)
        query.pop(DETAIL_PARAMETER, None)
        return model.model_validate(query)
    except ValidationError as error:
        raise RequestValidationError(
            [{**item, "loc": ("query", *item["loc"])} for item in error.errors()]
        ) from None


def _inline(schema: Any, definitions: dict[str, Any]) -> Any:
    """Replace ``{"$ref": "#/$defs/X", ...}`` by the definition of X merged with the rest."""
    if isinstance(schema, list):
        return [_inline(item, definitions) for item in schema]
    if not isinstance(schema, dict):
        return schema
    result = {key: _inline(value, definitions) for key, value in schema.items()}
    reference = result.pop("$ref", None)
    if isinstance(reference, str) and reference.startswith("#/$defs/"):
        target = _inline(definitions[reference.removeprefix("#/$defs/")], definitions)
        result = {**target, **result}
    return result


def query_parameters(model: type[BaseModel]) -> dict[str, Any]:
    """``openapi_extra`` declaring the fields of ``model`` as the operation's query parameters.

    Each parameter carries its field's description, whether it is required, and the
    field's JSON schema (definitions inlined).
    """
    schema = model.model_json_schema()
    definitions = schema.get("$defs", {})
    required = set(schema.get("required", []))
    parameters = []
    for name, field in schema.get("properties", {}).items():
        field_schema = _inline(field, definitions)
        parameter: dict[str, Any] = {
            "name": name,
            "in": "query",
            "required": name in required,
            "schema": field_schema,
        }
        if "description" in field_schema:
            parameter["description"] = field_schema["description"]
        parameters.append(parameter)
    return {"parameters": parameters}
