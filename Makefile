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

.PHONY: run build test test-native test-wasm test-e2e bench bench-wasm tools clean

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

# `cargo test` includes tests/fuzz (22 000 seeded requests through the doorway;
# RESIDUARY_FUZZ_CASES / RESIDUARY_FUZZ_SEED change that, DEVELOPERS.md).
test-native:
	RESIDUARY_FUZZ_SEED=8 $(CARGO) test

test-wasm: tools
	CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_RUNNER=wasm-bindgen-test-runner \
	  $(CARGO) test --target $(WASM_TARGET) --test wasm_api

test-e2e: build $(E2E_DEPS)
	node --test tests/e2e/run.mjs

# Benchmarks print figures and ratios; they are not tests. The python parts
# (numpy side by side) run only when python3 can import numpy.
BENCH_WASM := bench/wasm/target/$(WASM_TARGET)/release/residuary_bench_wasm.wasm
HAVE_NUMPY = python3 -c 'import numpy' 2>/dev/null
# One BLAS thread: the Rust side is single-threaded, and on a shared machine
# extra BLAS threads only contend.
ONE_THREAD := OPENBLAS_NUM_THREADS=1 OMP_NUM_THREADS=1 MKL_NUM_THREADS=1

bench: bench-wasm
	@echo "== phase plot, native: interpreted vs hand-written (bench/phase_plot_native.rs) =="
	$(CARGO) run -q --release --example phase_plot_native
	@echo
	@echo "== phase plot, wasm in node: (a) interpreted, (b) hand-written, (c) numpy =="
	$(ONE_THREAD) node bench/wasm/run.mjs
	@echo
	@echo "== polynomial roots: Aberth-Ehrlich vs numpy.roots, one BLAS thread (bench/roots.rs, bench/roots.py) =="
	@if $(HAVE_NUMPY); then $(ONE_THREAD) python3 bench/roots.py && $(CARGO) run -q --release --example roots; \
	else echo "skipped: python3 with numpy not found"; fi
	@echo
	@echo "== singularities: degree-100 timing and residue accuracy (bench/singularities.rs) =="
	$(CARGO) run -q --release --example singularities
	@echo
	@echo "== transfer_function and pole_trails on degree 10 (bench/transfer_function.rs) =="
	$(CARGO) run -q --release --example transfer_function
	@echo
	@echo "== peers: residuary / scipy, mpmath on inverse z, partial fractions, contour, inverse Laplace (bench/peers.py, bench/peers.rs) =="
	@if python3 -c 'import scipy, mpmath' 2>/dev/null; then $(ONE_THREAD) python3 bench/peers.py && $(CARGO) run -q --release --example peers; \
	else echo "skipped: python3 with scipy and mpmath not found"; fi

# The benchmark's own wasm module (bench/wasm, not part of the product's module).
bench-wasm: tools
	$(CARGO) build --release --target $(WASM_TARGET) --manifest-path bench/wasm/Cargo.toml --target-dir bench/wasm/target
	wasm-bindgen --target nodejs --out-dir bench/wasm/pkg $(BENCH_WASM)

clean:
	rm -rf dist tests/e2e/artifacts
