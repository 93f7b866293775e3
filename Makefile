# Rhoscope: `make run` (the app) and `make test` (set-up and every test).
PYTHON ?= $(shell for p in python3 python3.13 python3.12 python3.11; do \
	command -v $$p >/dev/null 2>&1 && $$p -c 'import sys; sys.exit(sys.version_info < (3, 11))' 2>/dev/null && { echo $$p; break; }; done)
VENV := .venv
PY := $(VENV)/bin/python

.PHONY: run test venv

$(VENV)/.installed: pyproject.toml
	@test -n "$(PYTHON)" || { echo "make: Rhoscope needs Python 3.11 or newer; none of python3, python3.13, python3.12, python3.11 is." >&2; exit 1; }
	$(PYTHON) -m venv $(VENV)
	$(PY) -m pip install --quiet --upgrade pip
	$(PY) -m pip install --quiet -e '.[web,test]'
	touch $@

venv: $(VENV)/.installed

test: venv
	$(PY) -m pytest

run: venv
	$(PY) -m engine check --units us --fc 4000 --fy 60000 --b 12 --d 21.5 --as 3.16 --mu 180
