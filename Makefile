# chemcheck: `make lab` to work, `make test` to check. Both set up everything from nothing.
SHELL := /bin/bash
PYTHON ?= python3
VENV := .venv
BIN := $(CURDIR)/$(VENV)/bin
STAMP := $(VENV)/.installed
LABEXT := chemcheck/labextension/package.json
EXT_SOURCES := $(wildcard extension/src/*.ts extension/style/* extension/scripts/*.js) extension/package.json extension/yarn.lock extension/tsconfig.json
PORT ?= 8888
# the venv's tools (jlpm, jupyter-builder) come first for every recipe
export PATH := $(BIN):$(PATH)
ROOT_FLAG := $(if $(filter 0,$(shell id -u)),--allow-root,)

.PHONY: lab test install extension test-python test-ts test-browser browser-deps bench fuzz docs lint clean system-deps

## Python environment with chemcheck installed editable, the built labextension linked
$(STAMP): pyproject.toml | system-deps
	@test -x $(BIN)/python || $(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install -q --upgrade pip
	$(BIN)/python -m pip install -q 'hatchling>=1.21,<2' 'hatch-jupyter-builder>=0.9,<1' 'jupyterlab>=4.4,<5' 'editables>=0.5,<1'
	$(MAKE) extension
	$(BIN)/python -m pip install -q --no-build-isolation -e '.[test,lab]'
	$(BIN)/jupyter-builder develop --overwrite . >/dev/null
	@touch $@

install: $(STAMP) $(LABEXT)

## node is needed to build the extension (users of the wheel need none)
system-deps:
	@command -v node >/dev/null || { \
	  if [ "$$(id -u)" = 0 ]; then apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq nodejs npm; \
	  else echo "node is needed to build the JupyterLab extension: install Node.js 18 or newer" >&2; exit 1; fi; }

$(LABEXT): $(EXT_SOURCES)
	@test -x $(BIN)/jlpm || { $(PYTHON) -m venv $(VENV) && $(BIN)/python -m pip install -q 'jupyterlab>=4.4,<5'; }
	@# yarn prints a line per cached package (YN0013): keep its warnings and errors only
	cd extension && set -o pipefail && jlpm install 2>&1 | { grep -vE 'YN0013|YN0000: (┌|└|│ *$$)' || true; } && jlpm build:prod
	@touch $@

extension: $(LABEXT)

## open JupyterLab on the demo notebooks (127.0.0.1 only)
lab: install
	@echo "chemcheck: JupyterLab starts on port $(PORT) (another: make lab PORT=8890);"
	@echo "chemcheck: open the http://127.0.0.1:$(PORT)/lab?token=... address it prints below."
	$(BIN)/jupyter lab --no-browser --ServerApp.ip=127.0.0.1 --ServerApp.port=$(PORT) \
	  --ServerApp.root_dir=$(CURDIR)/notebooks $(ROOT_FLAG)

## everything: Python units, notebooks, TypeScript units, browser tests in Chromium
test: install browser-deps test-ts test-python

browser-deps:
	@if ! command -v chromium >/dev/null && ! command -v chromium-browser >/dev/null; then \
	  if [ "$$(id -u)" = 0 ]; then \
	    echo "installing Debian's chromium for the browser tests"; \
	    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends chromium chromium-driver; \
	  else echo "chromium is not installed: browser tests will be skipped (install Debian's 'chromium' package, or run make test as root)"; fi; \
	fi

test-python: install
	@$(BIN)/python -m pytest $(PYTEST_ARGS); rc=$$?; \
	if [ $$rc -eq 5 ]; then echo "pytest collected no tests: that is a failure here" >&2; exit 1; fi; exit $$rc

test-ts: install
	cd extension && jlpm test

test-browser: install browser-deps
	$(BIN)/python -m pytest tests/browser $(PYTEST_ARGS)

bench: install
	$(BIN)/python benchmarks/run.py

fuzz: install
	$(BIN)/python -m tests.fuzz_long

docs: install
	$(BIN)/python -m chemcheck.docs

lint: install
	$(BIN)/python -m ruff check chemcheck tests || true

clean:
	rm -rf $(VENV) extension/node_modules extension/lib extension/lib-test chemcheck/labextension extension/tsconfig.tsbuildinfo
