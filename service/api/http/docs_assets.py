"""``/docs`` (Swagger UI) and ``/redoc`` served with their scripts and styles from here.

The assets come from the ``fastapi-offline`` package (MIT), which bundles Swagger UI
(Apache License 2.0) and ReDoc (MIT). No page asks another host for anything: no CDN, no
web fonts, no validator badge; a Content-Security-Policy on both pages makes the browser
refuse any other host (ReDoc's bundle would otherwise fetch a logo from its vendor).
"""

from __future__ import annotations

from importlib.resources import files
from pathlib import Path

from fastapi import FastAPI, Request
from fastapi.openapi.docs import (
    get_redoc_html,
    get_swagger_ui_html,
    get_swagger_ui_oauth2_redirect_html,
)
from starlette.responses import HTMLResponse
from starlette.staticfiles import StaticFiles

__all__ = ["ASSETS_PATH", "assets_directory", "install_offline_docs"]

ASSETS_PATH = "/docs-assets"
_SAME_HOST_ONLY = {
    "Content-Security-Policy": (
        "default-src 'self'; script-src 'self' 'unsafe-inline'; "
        "style-src 'self' 'unsafe-inline'; img-src 'self' data:; font-src 'self' data:; "
        "connect-src 'self'; worker-src 'self' blob:; frame-ancestors 'self'"
    )
}


def assets_directory() -> Path:
    """Folder holding ``swagger-ui-bundle.js``, ``swagger-ui.css``, ``redoc.standalone.js``."""
    return Path(str(files("fastapi_offline") / "static"))


def install_offline_docs(app: FastAPI, *, openapi_url: str = "/openapi.json") -> None:
    """Mount the assets and add the ``/docs``, ``/docs/oauth2-redirect`` and ``/redoc`` pages.

    Create the app with ``docs_url=None, redoc_url=None`` first.
    """
    app.mount(ASSETS_PATH, StaticFiles(directory=assets_directory()), name="docs-assets")
    redirect_url = "/docs/oauth2-redirect"

    @app.get("/docs", include_in_schema=False)
    async def swagger_ui(request: Request) -> HTMLResponse:
        root = request.scope.get("root_path", "")
        page = get_swagger_ui_html(
            openapi_url=f"{root}{openapi_url}",
            title=f"{app.title} - Swagger UI",
            swagger_js_url=f"{root}{ASSETS_PATH}/swagger-ui-bundle.js",
            swagger_css_url=f"{root}{ASSETS_PATH}/swagger-ui.css",
            swagger_favicon_url=f"{root}{ASSETS_PATH}/favicon.png",
            oauth2_redirect_url=f"{root}{redirect_url}",
            swagger_ui_parameters={"validatorUrl": None, "tryItOutEnabled": False},
        )
        page.headers.update(_SAME_HOST_ONLY)
        return page

    @app.get(redirect_url, include_in_schema=False)
    async def swagger_ui_redirect() -> HTMLResponse:
        return get_swagger_ui_oauth2_redirect_html()

    @app.get("/redoc", include_in_schema=False)
    async def redoc(request: Request) -> HTMLResponse:
        root = request.scope.get("root_path", "")
        page = get_redoc_html(
            openapi_url=f"{root}{openapi_url}",
            title=f"{app.title} - ReDoc",
            redoc_js_url=f"{root}{ASSETS_PATH}/redoc.standalone.js",
            redoc_favicon_url=f"{root}{ASSETS_PATH}/favicon.png",
            with_google_fonts=False,
        )
        page.headers.update(_SAME_HOST_ONLY)
        return page
