# copoly build and test entry points. See DEVELOPERS.md.
SHELL := /bin/bash
GO ?= go
GOROOT := $(shell $(GO) env GOROOT)
WASMEXEC := $(GOROOT)/lib/wasm/go_js_wasm_exec
PY ?= /usr/bin/python3
DIST := dist

.PHONY: all wasm site run test vet test-native test-noasm test-wasm test-fixtures test-browser test-firefox bench clean

all: site

# Inlining is kept for the science (copoly, gonum, math, math/rand/v2) and switched off for the
# rest (runtime, standard library, bridge): the module compresses about 5 % smaller, which the
# 2.0 MB page budget needs, at no measurable cost to the computations (see make bench).
WASM_GCFLAGS := -gcflags='all=-l' -gcflags='copoly/...=' -gcflags='gonum.org/...=' -gcflags='math=' -gcflags='math/bits=' -gcflags='math/rand/v2='

## wasm: build the WebAssembly module and copy the matching wasm_exec.js beside it
wasm:
	@mkdir -p $(DIST)
	GOOS=js GOARCH=wasm $(GO) build -trimpath -ldflags="-s -w" $(WASM_GCFLAGS) -o $(DIST)/copoly.wasm ./wasm
	cp "$(GOROOT)/lib/wasm/wasm_exec.js" $(DIST)/wasm_exec.js

## site: the one self-contained offline page, dist/copoly.html
site: wasm
	$(GO) run ./site/build -wasm $(DIST)/copoly.wasm -wasmexec $(DIST)/wasm_exec.js -o $(DIST)/copoly.html

## run: build the page and serve dist/ on localhost
run: site
	$(GO) run ./site/serve -dir $(DIST)

vet:
	$(GO) vet ./...
	GOOS=js GOARCH=wasm $(GO) vet ./...

test-native:
	$(GO) test -count=1 ./...

test-noasm:
	$(GO) test -count=1 -tags noasm ./copoly/...

test-wasm:
	GOOS=js GOARCH=wasm $(GO) test -count=1 -exec="$(WASMEXEC)" ./copoly/... ./wasm/...

## test-fixtures: re-run the scipy scripts that made testdata/ fixtures and compare with the committed files
test-fixtures:
	@if [ -x "$(PY)" ]; then \
		$(PY) testdata/table_python.py --check && echo "testdata/table_python.*: agree with Python's csv module"; \
	elif [ -n "$$CI" ]; then echo "FAIL: $(PY) is required in CI"; exit 1; \
	else echo "*** SKIPPED fixture re-check: no $(PY) ***"; fi
	@if [ -x "$(PY)" ] && $(PY) -c 'import scipy' 2>/dev/null; then \
		$(PY) testdata/fit_scipy.py --check || exit 1; \
		$(PY) testdata/plan_scipy.py --check || exit 1; \
		$(PY) testdata/averages_numpy.py --check || exit 1; \
		$(PY) testdata/multi_scipy.py --check || exit 1; \
		$(PY) testdata/skeist_scipy.py --check; \
	elif [ -n "$$CI" ]; then echo "FAIL: $(PY) with scipy is required in CI (apt-get install -y python3-scipy)"; exit 1; \
	else echo "*** SKIPPED fixture re-check: $(PY) has no scipy. Install with: apt-get install -y python3-scipy ***"; fi

## test-browser: open dist/copoly.html from file:// in headless Chromium
test-browser: site
	@if [ ! -x /usr/bin/chromium ] && ! command -v chromium >/dev/null 2>&1; then \
		echo "*** BROWSER TEST SKIPPED: install chromium: apt-get install -y chromium ***"; \
		if [ -n "$$CI" ] || [ "$$COPOLY_REQUIRE_BROWSER" = 1 ]; then echo "(CI or COPOLY_REQUIRE_BROWSER=1: the test below fails instead)"; fi; \
	fi
	COPOLY_HTML=$(abspath $(DIST)/copoly.html) $(GO) test -count=1 -v -run Browser ./site/browsertest/

## test-firefox: open dist/copoly.html from file:// in headless Firefox ESR over WebDriver BiDi
## (puppeteer-core, installed into site/firefoxtest/node_modules by npm ci from its lock file)
FIREFOX ?= /usr/bin/firefox-esr
FIREFOXTEST := site/firefoxtest
test-firefox: site
	@if [ ! -x "$(FIREFOX)" ]; then \
		if [ "$$COPOLY_REQUIRE_FIREFOX" = 1 ]; then \
			echo "FAIL: the Firefox test is required (COPOLY_REQUIRE_FIREFOX=1) but $(FIREFOX) is missing; install it with: apt-get install -y firefox-esr"; exit 1; \
		fi; \
		echo "****************************************************************************"; \
		echo "*** FIREFOX TEST SKIPPED: no $(FIREFOX)"; \
		echo "*** install it with: apt-get install -y firefox-esr   (then: make test-firefox)"; \
		echo "****************************************************************************"; \
		exit 0; \
	fi; \
	cd $(FIREFOXTEST) && \
	if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then \
		npm ci --no-audit --no-fund || exit 1; \
	fi && \
	COPOLY_HTML=$(abspath $(DIST)/copoly.html) COPOLY_FIREFOX=$(FIREFOX) node --test firefox.test.mjs

## check-js: type-check the page's ES modules (site/src, each // @ts-check with JSDoc types)
## against the API's types in site/copoly.d.ts with the TypeScript checker (typescript, installed
## into site/jscheck/node_modules by npm ci from its lock file when missing or older than it)
JSCHECK := site/jscheck
.PHONY: check-js
check-js:
	@cd $(JSCHECK) && \
	if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then \
		npm ci --no-audit --no-fund || exit 1; \
	fi && \
	node_modules/.bin/tsc -p tsconfig.json && echo "check-js: site/src type-checks against site/copoly.d.ts ($$(node_modules/.bin/tsc --version))"

test: setup vet test-native test-noasm test-wasm test-fixtures check-js test-browser test-firefox

## setup: the system packages the tests need (Chromium, Firefox ESR, scipy). Run as root with
## apt-get available (CI, a fresh container), it installs what is missing; otherwise it prints
## the one command that would, and the tests that need a missing package skip loudly (or fail,
## under CI=true or COPOLY_REQUIRE_BROWSER=1 / COPOLY_REQUIRE_FIREFOX=1).
.PHONY: setup
setup:
	@need=""; \
	[ -x /usr/bin/chromium ] || need="$$need chromium"; \
	[ -x /usr/bin/firefox-esr ] || need="$$need firefox-esr"; \
	/usr/bin/python3 -c 'import scipy' 2>/dev/null || need="$$need python3-scipy"; \
	[ -f /etc/ssl/certs/ca-certificates.crt ] || need="$$need ca-certificates"; \
	if [ -z "$$need" ]; then echo "setup: chromium, firefox-esr and python3-scipy are present"; exit 0; fi; \
	if [ "$$(id -u)" = 0 ] && command -v apt-get >/dev/null 2>&1; then \
		echo "setup: installing$$need"; \
		export DEBIAN_FRONTEND=noninteractive; \
		apt-get update -qq && apt-get install -y -qq --no-install-recommends $$need || exit 1; \
	else \
		echo "****************************************************************************"; \
		echo "*** setup: missing$$need; install with: sudo apt-get install -y$$need"; \
		echo "*** (the tests that need them are skipped with a notice until then)"; \
		echo "****************************************************************************"; \
	fi

## fuzz: run every fuzz target of the parsers for FUZZTIME each (default 30s). Not part of make
## test, whose go test runs the seed corpora (f.Add and testdata/fuzz/) as ordinary tests.
## A failing input is written to testdata/fuzz/FuzzXxx/ of its package: fix the bug, keep it.
## Go 1.26's fuzzing coordinator can end a run with "context deadline exceeded" at the very end
## of -fuzztime without any failing input (golang/go#75804); that alone is reported, not failed.
FUZZTIME ?= 30s
FUZZ_PACKAGES := ./copoly/bench/ ./copoly/project/ ./copoly/multi/
.PHONY: fuzz
fuzz:
	@set -e; for pkg in $(FUZZ_PACKAGES); do \
		for name in $$($(GO) test -list '^Fuzz' $$pkg | grep '^Fuzz'); do \
			echo "== $$pkg $$name for $(FUZZTIME)"; \
			dir=$$pkg/testdata/fuzz/$$name; before=$$(ls $$dir 2>/dev/null | wc -l); log=$$(mktemp); \
			$(GO) test -run='^$$' -fuzz="^$$name\$$" -fuzztime=$(FUZZTIME) $$pkg 2>&1 | tee $$log; status=$${PIPESTATUS[0]}; \
			if [ $$status -ne 0 ]; then \
				if [ "$$(ls $$dir 2>/dev/null | wc -l)" = "$$before" ] && grep -q 'context deadline exceeded' $$log; then \
					echo "== $$name: no failing input was written; the coordinator's end-of-run race (golang/go#75804), not a failure"; \
				else rm -f $$log; exit 1; fi; \
			fi; \
			rm -f $$log; \
		done; \
	done

## bench: sizes, load time against a bare Go page, and Go benchmarks natively and as js/wasm
bench: site
	bash site/bench.sh

clean:
	rm -rf $(DIST)
