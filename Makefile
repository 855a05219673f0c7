# residuary — build the single-file page and run every test suite.
#   make run    build, then open dist/residuary.html (or print its path when there is no display)
#   make build  build dist/residuary.html only
#   make test   native tests, wasm tests in node, headless-Chromium page tests
#   make bench  benchmarks
SHELL := /bin/bash
CARGO ?= cargo
WASM_TARGET := wasm32-unknown-unknown
# The wasm-bindgen CLI must match the library version pinned in Cargo.toml exactly.
WBG_VERSION := $(shell sed -n 's/^wasm-bindgen *= *"=\([0-9.]*\)".*/\1/p' Cargo.toml)
WASM := target/$(WASM_TARGET)/release/residuary.wasm
PAGE := dist/residuary.html
E2E_DEPS := tests/e2e/node_modules/playwright-core/package.json
export PATH := $(HOME)/.cargo/bin:$(PATH)

.PHONY: run build test test-native test-wasm test-e2e bench tools clean

run: build
	@page="$(abspath $(PAGE))"; \
	if [ "$$(uname)" = "Darwin" ] && command -v open >/dev/null; then open "$$page"; \
	elif [ -n "$${DISPLAY:-}$${WAYLAND_DISPLAY:-}" ] && command -v xdg-open >/dev/null; then (xdg-open "$$page" >/dev/null 2>&1 &); \
	else echo "Open this in a browser: file://$$page"; fi

build: tools
	$(CARGO) build --release --target $(WASM_TARGET) --lib
	wasm-bindgen --target web --out-dir dist/pkg $(WASM)
	node www/tools/build-page.mjs

# Install what is missing: the wasm target and the wasm-bindgen CLI at the pinned version.
tools:
	@test -n "$(WBG_VERSION)" || { echo "could not read the pinned wasm-bindgen version from Cargo.toml"; exit 1; }
	@rustup target list --installed 2>/dev/null | grep -qx $(WASM_TARGET) || rustup target add $(WASM_TARGET)
	@if [ "$$(wasm-bindgen --version 2>/dev/null)" != "wasm-bindgen $(WBG_VERSION)" ]; then \
	  echo "installing wasm-bindgen-cli $(WBG_VERSION) (matches Cargo.toml)"; \
	  $(CARGO) install wasm-bindgen-cli --version $(WBG_VERSION) --force; fi

$(E2E_DEPS):
	cd tests/e2e && PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1 npm install --no-audit --no-fund

test: test-native test-wasm test-e2e

test-native:
	$(CARGO) test

test-wasm: tools
	CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_RUNNER=wasm-bindgen-test-runner \
	  $(CARGO) test --target $(WASM_TARGET) --test wasm_api

test-e2e: build $(E2E_DEPS)
	node --test tests/e2e/run.mjs

bench:
	@echo "bench: no benchmarks yet"

clean:
	rm -rf dist tests/e2e/artifacts
