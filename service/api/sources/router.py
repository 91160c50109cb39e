"""GET /v1/sources and /v1/sources/{id}: the statements answers cite by id.

The document is the same for every request to one service version: it carries the
version and the registry's content hash, and answers with an ``ETag`` made from that hash
(weak, because gzip coding changes the bytes but not the content; ``If-None-Match`` gives
304) and ``Cache-Control`` as the lookups have it.
"""

from __future__ import annotations

import dataclasses
import functools
from typing import Any

from fastapi import APIRouter, Path, Request
from starlette.responses import Response

from service import __version__
from service.api.http.caching import MAX_AGE_SECONDS, if_none_match_hits
from service.api.http.limits import TimeLimitedRoute
from service.api.http.problems import FieldError, ProblemError, problem_responses
from service.api.http.query import query_parameters, read_query
from service.api.http.responses import FastJSONResponse
from service.api.sources.schemas import SourcesPublic, SourcesQuery, StatementPublic
from service.core import statements
from service.settings import Settings

router = APIRouter(prefix="/v1/sources", tags=["sources"], route_class=TimeLimitedRoute)

_NOT_MODIFIED: dict[int | str, dict[str, Any]] = {
    304: {"description": "Not modified: `If-None-Match` named the current `ETag`."}
}


def _statement(entry: statements.CitableStatement) -> dict[str, Any]:
    fields = dataclasses.asdict(entry)
    return {"id": fields.pop("statement_id"), **fields}


@functools.cache
def _document() -> dict[str, Any]:
    return {
        "service_version": __version__,
        "content_hash": statements.content_hash(),
        "missing_documents": list(statements.missing_documents()),
        "statements": [_statement(entry) for entry in statements.citable_statements()],
    }


def _tag() -> str:
    return f'W/"{statements.content_hash()[:32]}"'


def _cache_headers(request: Request) -> dict[str, str]:
    settings: Settings = request.app.state.settings
    scope = "private" if settings.api_keys else "public"
    return {"ETag": _tag(), "Cache-Control": f"{scope}, max-age={MAX_AGE_SECONDS}"}


def _answer(request: Request, content: dict[str, Any]) -> Response:
    headers = _cache_headers(request)
    wanted = request.headers.get("if-none-match")
    if wanted is not None and (wanted.strip() == "*" or if_none_match_hits(wanted, _tag())):
        return Response(status_code=304, headers=headers)
    return FastJSONResponse(content, headers=headers)


@router.get(
    "",
    operation_id="get_sources",
    response_model=SourcesPublic,
    responses={**problem_responses(404, 422), **_NOT_MODIFIED},
    openapi_extra=query_parameters(SourcesQuery),
    summary="Every statement answers cite, by id, with its full text",
)
async def get_sources(request: Request) -> Response:
    """The reference state, property sources and uncertainty statements that answers of
    this service version cite by id (`meta.statements` of an answer links here), with
    their full texts, releases, sections and bases."""
    query = read_query(request, SourcesQuery)
    if query.version is not None and query.version != __version__:
        raise ProblemError(
            404,
            "sources-version-not-served",
            "Sources of another version",
            f"This service is version {__version__}; it serves the statements of that "
            f"version only, not of {query.version!r}.",
            [
                FieldError(
                    field="version", message="not this service's version", value=query.version
                )
            ],
        )
    return _answer(request, _document())


@router.get(
    "/{statement_id}",
    operation_id="get_source",
    response_model=StatementPublic,
    responses={**problem_responses(404), **_NOT_MODIFIED},
    summary="One statement answers cite, by its id",
)
async def get_source(
    request: Request,
    statement_id: str = Path(
        max_length=128, description="The id an answer cites (e.g. `iapws-95`)."
    ),
) -> Response:
    """One entry of `GET /v1/sources`."""
    entry = statements.statement_by_id(statement_id)
    if entry is None:
        raise ProblemError(
            404,
            "statement-not-found",
            "No such statement",
            f"No statement has the id {statement_id!r}; GET /v1/sources lists them all.",
            [FieldError(field="statement_id", message="unknown id", value=statement_id)],
        )
    return _answer(request, _statement(entry))
