# Rhoscope: `make run` (the app) and `make test` (set-up and every test).
#   make test         venv, Python packages, Pyodide (npm), then every test except `online`
#   make build        the static site in build/ (python -m webapp build --out build)
#   make run          build, then serve build/ at http://localhost:8000 (first look offline; full page needs the Pyodide CDN)
#   make serve        the app from a local Panel server at http://localhost:5006/ (offline)
#   make bench        engine benchmarks in CPython and in Pyodide under Node
#   make fuzz         the fuzz tests (tests/fuzz) at full size: 100,000 sections, 1,500 CLI calls, 3,000 schedules
#   make test-online  build/ in Chromium with Pyodide from its CDN (skips when unreachable)
#   make clean        remove generated files (build/, node_modules, caches); distclean also .venv

# The first of these that is Python 3.11 or newer.
PYTHON ?= $(shell for p in python3 python3.13 python3.12 python3.11; do \
	command -v $$p >/dev/null 2>&1 && $$p -c 'import sys; sys.exit(sys.version_info < (3, 11))' 2>/dev/null && { echo $$p; break; }; done)
VENV := .venv
PY := $(VENV)/bin/python
NODE_DIR := tests/pyodide
NODE_STAMP := $(NODE_DIR)/node_modules/.package-lock.json
PORT ?= 8000
SERVE_PORT ?= 5006
PYTEST_ARGS ?=

.PHONY: run test build bench fuzz test-online serve clean distclean venv pyodide

$(VENV)/.installed: pyproject.toml
	@test -n "$(PYTHON)" || { echo "make: Rhoscope needs Python 3.11 or newer; none of python3, python3.13, python3.12, python3.11 is. Install one (e.g. apt-get install python3.11 python3.11-venv) and retry." >&2; exit 1; }
	@echo "make: using $(PYTHON) ($$($(PYTHON) --version))"
	$(PYTHON) -m venv $(VENV)
	$(PY) -m pip install --quiet --disable-pip-version-check --upgrade pip
	$(PY) -m pip install --quiet --disable-pip-version-check -e '.[web,test]'
	touch $@

venv: $(VENV)/.installed

# Pyodide for the engine-in-Pyodide tests and the build (npm package, pinned by package-lock.json).
$(NODE_STAMP): $(NODE_DIR)/package.json $(NODE_DIR)/package-lock.json
	@command -v npm >/dev/null 2>&1 || { echo "make: npm (Node.js 18 or newer) is needed for the Pyodide tests and the build; install nodejs and npm." >&2; exit 1; }
	npm ci --prefix $(NODE_DIR) --no-audit --no-fund --loglevel=error
	@touch $@

pyodide: $(NODE_STAMP)

test: venv pyodide
	@echo "make test: every test except those marked online (-m 'not online'); run 'make test-online' for those"
	@$(PY) -m pytest -m "not online" $(PYTEST_ARGS); status=$$?; \
	if [ $$status -eq 5 ]; then echo "make test: pytest collected no tests; that is a failure" >&2; fi; \
	exit $$status

build: venv pyodide
	$(PY) -m webapp build --out build

run: build
	@echo "make run: serving build/ at http://localhost:$(PORT)/ (a link's first look works offline; the interactive page also needs numpy and three other compiled packages from the Pyodide CDN, cdn.jsdelivr.net; Ctrl-C stops)"
	$(PY) -m http.server --directory build $(PORT)

serve: venv
	$(PY) -m webapp serve --port $(SERVE_PORT)

bench: venv pyodide
	$(PY) -m pytest tests/bench --benchmark-enable --benchmark-group-by=group \
		--benchmark-columns=min,median,mean,stddev,rounds --benchmark-sort=name -q
	$(PY) tests/bench/compare_runtimes.py
	$(PY) tests/bench/first_look_bench.py
	@if grep -rqsE --include='*.py' 'mark\.bench([^a-z_]|$$)' tests; then \
		echo "make bench: browser latency benchmarks (-m bench)"; \
		$(PY) -m pytest -m bench -q -rs -s tests; fi

# The fuzz tests run in `make test` at a size that fits CI; here at full size
# (generated sections, CLI calls, schedules and their rows; RHOSCOPE_FUZZ_SEED picks the draw).
FUZZ_SECTIONS ?= 100000
FUZZ_CLI ?= 1500
FUZZ_SCHEDULES ?= 3000
FUZZ_SCHEDULE_ROWS ?= 40
fuzz: venv
	RHOSCOPE_FUZZ_SECTIONS=$(FUZZ_SECTIONS) RHOSCOPE_FUZZ_CLI=$(FUZZ_CLI) \
	RHOSCOPE_FUZZ_SCHEDULES=$(FUZZ_SCHEDULES) RHOSCOPE_FUZZ_SCHEDULE_ROWS=$(FUZZ_SCHEDULE_ROWS) \
		$(PY) -m pytest tests/fuzz -q -s -p no:cacheprovider

test-online: build
	@echo "make test-online: Chromium against build/, with Pyodide from its CDN (skips with the reason when the CDN is unreachable)"
	@$(PY) -m pytest -m online -rs $(PYTEST_ARGS) tests/test_online.py; status=$$?; \
	if [ $$status -eq 5 ]; then echo "make test-online: pytest collected no tests; that is a failure" >&2; fi; \
	exit $$status

clean:
	rm -rf build $(NODE_DIR)/node_modules .pytest_cache .benchmarks .hypothesis tests/screenshots
	find . -name __pycache__ -type d -not -path './.venv/*' -prune -exec rm -rf {} +

distclean: clean
	rm -rf $(VENV) *.egg-info
