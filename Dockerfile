# syntax=docker/dockerfile:1
# tripoint service image: slim base, dependencies in their own layer, non-root user.
#
#   docker build -t tripoint .
#   docker run -p 8000:8000 -v tripoint-records:/var/lib/tripoint tripoint
#   docker run -p 8000:8000 -e TRIPOINT_WORKERS=4 \
#       -e TRIPOINT_DATABASE_URL=postgresql://tripoint:...@db:5432/tripoint tripoint

FROM python:3.11-slim AS build
WORKDIR /src
COPY requirements.lock ./
# Dependencies first, in their own layer, at the versions of the lock file (`make lock`
# refreshes it): an image rebuilt next month has the same versions.
RUN pip wheel --no-cache-dir --wheel-dir /wheels -r requirements.lock

FROM python:3.11-slim AS runtime
ENV PYTHONDONTWRITEBYTECODE=1 \
    PYTHONUNBUFFERED=1 \
    PYTHONPATH=/app \
    TRIPOINT_HOST=0.0.0.0 \
    TRIPOINT_PORT=8000 \
    TRIPOINT_WORKERS=1 \
    TRIPOINT_DATABASE_URL=sqlite:////var/lib/tripoint/records.sqlite3
COPY --from=build /wheels /wheels
RUN pip install --no-cache-dir --no-index /wheels/* && rm -rf /wheels \
    && useradd --system --uid 10001 --home-dir /app --shell /usr/sbin/nologin tripoint \
    && mkdir -p /var/lib/tripoint && chown tripoint /var/lib/tripoint
WORKDIR /app
COPY service ./service
COPY openapi_examples ./openapi_examples
USER tripoint
# Calculation records (the default SQLite file); with PostgreSQL it stays empty.
VOLUME ["/var/lib/tripoint"]
EXPOSE 8000
HEALTHCHECK --interval=30s --timeout=5s --start-period=20s --retries=3 \
    CMD ["python", "-c", "import os, urllib.request; urllib.request.urlopen('http://127.0.0.1:%s/health' % os.environ.get('TRIPOINT_PORT', '8000'), timeout=4)"]
# Worker processes: TRIPOINT_WORKERS, or append --workers N to `docker run ... tripoint`.
ENTRYPOINT ["python", "-m", "service"]
CMD []
