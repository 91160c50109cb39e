# tripoint: two commands on a fresh machine, `make run` and `make test`.
PYTHON ?= python3
VENV ?= .venv
BIN := $(VENV)/bin
HOST ?= 127.0.0.1
PORT ?= 8000

.PHONY: install install-test run test lint typecheck unit bench lock clean

$(BIN)/python:
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip

# Versions come from the lock files (requirements.lock: the service, which the Dockerfile
# installs; requirements-dev.lock: the service with its test and bench extras). `make lock`
# refreshes both from pyproject.toml.
$(VENV)/.installed: $(BIN)/python pyproject.toml requirements-dev.lock
	$(BIN)/python -m pip install --quiet -c requirements-dev.lock -e .
	touch $@

$(VENV)/.installed-test: $(VENV)/.installed
	$(BIN)/python -m pip install --quiet -c requirements-dev.lock -e ".[test,bench]"
	touch $@

install: $(VENV)/.installed

install-test: $(VENV)/.installed-test

run: install
	$(BIN)/python -m service --host $(HOST) --port $(PORT)

lint: install-test
	$(BIN)/ruff check service tests bench

typecheck: install-test
	$(BIN)/mypy

unit: install-test
	$(BIN)/pytest

test: lint typecheck unit

bench: install-test
	$(BIN)/python bench/run_all.py

LOCK := $(BIN)/uv pip compile pyproject.toml --universal --python-version 3.11 --no-header \
	--annotation-style line --quiet --upgrade

lock: $(BIN)/python
	$(BIN)/python -m pip install --quiet uv
	$(LOCK) -o requirements.lock
	$(LOCK) --extra test --extra bench -o requirements-dev.lock

clean:
	rm -rf $(VENV) .pytest_cache .mypy_cache .ruff_cache
