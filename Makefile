# tripoint: two commands on a fresh machine, `make run` and `make test`.
PYTHON ?= python3
VENV ?= .venv
BIN := $(VENV)/bin
HOST ?= 127.0.0.1
PORT ?= 8000

.PHONY: install install-test run test lint typecheck unit bench clean

$(BIN)/python:
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip

$(VENV)/.installed: $(BIN)/python pyproject.toml
	$(BIN)/python -m pip install --quiet -e .
	touch $@

$(VENV)/.installed-test: $(VENV)/.installed
	$(BIN)/python -m pip install --quiet -e ".[test,bench]"
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

clean:
	rm -rf $(VENV) .pytest_cache .mypy_cache .ruff_cache
