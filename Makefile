# Two commands a newcomer needs: `make run` and `make test`. Both build .venv on first use.
PYTHON ?= python3
VENV   := .venv
BIN    := $(VENV)/bin
STAMP  := $(VENV)/.installed

.PHONY: run test lint format snapshots bench clean

$(STAMP): pyproject.toml
	test -x $(BIN)/python || $(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip
	$(BIN)/python -m pip install --quiet -e '.[test]'
	touch $(STAMP)

run: $(STAMP)
	$(BIN)/workup --cases cases

test: $(STAMP)
	$(BIN)/ruff check .
	$(BIN)/ruff format --check .
	$(BIN)/python -m pytest

lint: $(STAMP)
	$(BIN)/ruff check --fix .
	$(BIN)/ruff format .

# Re-render the SVG snapshots after an intended change to a screen; review the diff before committing.
snapshots: $(STAMP)
	$(BIN)/python -m pytest tests/screens --snapshot-update

# Byte-compile first, as an installed program is: a listing timed from a fresh process would
# otherwise pay for compiling the sources (on machines that set PYTHONDONTWRITEBYTECODE, each time).
bench: $(STAMP)
	$(BIN)/python -m compileall -q workup screens bench
	$(BIN)/python -m bench

clean:
	rm -rf $(VENV) .pytest_cache .ruff_cache snapshot_report.html
