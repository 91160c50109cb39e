"""Start the server: ``python -m service --host 127.0.0.1 --port 8000 [--workers N]``.

Logs go to stderr as JSON lines. With more than one worker process, Prometheus metrics are
kept in a directory the workers share (``PROMETHEUS_MULTIPROC_DIR``; a fresh temporary one
unless set), so ``/metrics`` on any worker adds up all of them.
"""

from __future__ import annotations

import argparse
import os
import shutil
import tempfile
from pathlib import Path

import uvicorn

from service.api.http.bounded_head import BoundedHeadProtocol
from service.api.http.observability import MULTIPROCESS_ENVIRONMENT_VARIABLE, logging_config
from service.settings import Settings


def _prepare_multiprocess_metrics(*, several_workers: bool) -> Path | None:
    """Point the workers at an empty shared metrics directory; return it if we made it."""
    given = os.environ.get(MULTIPROCESS_ENVIRONMENT_VARIABLE)
    if given:
        folder = Path(given)
        folder.mkdir(parents=True, exist_ok=True)
        for stale in folder.glob("*.db"):  # numbers of an earlier run
            stale.unlink()
        return None
    if not several_workers:
        return None
    made = Path(tempfile.mkdtemp(prefix="tripoint-metrics-"))
    os.environ[MULTIPROCESS_ENVIRONMENT_VARIABLE] = str(made)
    return made


def main(argv: list[str] | None = None) -> None:
    """Parse the command line (defaults from ``TRIPOINT_*``) and run uvicorn."""
    settings = Settings()
    parser = argparse.ArgumentParser(prog="python -m service", description=__doc__)
    parser.add_argument("--host", default=settings.host, help="interface to bind")
    parser.add_argument("--port", type=int, default=settings.port, help="TCP port")
    parser.add_argument("--workers", type=int, default=settings.workers, help="worker processes")
    parser.add_argument(
        "--log-level",
        default=settings.log_level,
        choices=["debug", "info", "warning", "error"],
        help="log level",
    )
    arguments = parser.parse_args(argv)
    if arguments.workers < 1:
        parser.error("--workers must be at least 1")
    made = _prepare_multiprocess_metrics(several_workers=arguments.workers > 1)
    try:
        uvicorn.run(
            "service.api.app:create_app",
            factory=True,
            host=arguments.host,
            port=arguments.port,
            workers=arguments.workers,
            log_level=arguments.log_level,
            log_config=logging_config(arguments.log_level),
            access_log=False,
            timeout_graceful_shutdown=30,
            http=BoundedHeadProtocol,  # 431 past TRIPOINT_MAX_HEADER_BYTES
        )
    finally:
        if made is not None:
            shutil.rmtree(made, ignore_errors=True)


if __name__ == "__main__":
    main()
