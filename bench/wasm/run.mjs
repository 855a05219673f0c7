// Phase-plot throughput in WebAssembly under node, for the three functions of
// bench/cases.rs: (a) the interpreted evaluator, (b) the same function
// hand-written in Rust, both compiled to wasm and drawn by residuary's
// renderer; (c) numpy vectorised (bench/phase_plot_numpy.py) when python3
// with numpy is available. Prints Mpixel/s (median of REPS timed calls after
// a warm-up) and the throughput ratios a/b and a/c.
//
// Build the module first (make bench-wasm), then: node bench/wasm/run.mjs
import { createRequire } from "node:module";
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import path from "node:path";
import { performance } from "node:perf_hooks";

const here = path.dirname(fileURLToPath(import.meta.url));
const require = createRequire(import.meta.url);
let bench;
try {
  bench = require(path.join(here, "pkg", "residuary_bench_wasm.js"));
} catch (e) {
  console.error(`cannot load bench/wasm/pkg (${e.message}); build it with: make bench-wasm`);
  process.exit(1);
}

const REPS = 9;
const mpx = bench.pixels() / 1e6;

/**
 * Mpixel/s of workA and workB: medians of REPS timed calls each, after one
 * warm-up call each. The calls alternate (A, B, A, B, ...) so that load from
 * other processes on a shared machine falls on both alike.
 */
function ratePair(workA, workB) {
  workA();
  workB();
  const ta = [];
  const tb = [];
  for (let k = 0; k < REPS; k++) {
    for (const [work, times] of [[workA, ta], [workB, tb]]) {
      const t = performance.now();
      work();
      times.push(performance.now() - t);
    }
  }
  const median = (ts) => ts.sort((x, y) => x - y)[REPS >> 1];
  return [mpx / (median(ta) / 1000), mpx / (median(tb) / 1000)];
}

/** numpy figures by function name, or null when python3 + numpy is not there. */
function numpyRates() {
  const probe = spawnSync("python3", ["-c", "import numpy"], { stdio: "ignore" });
  if (probe.status !== 0) return null;
  const script = path.join(here, "..", "phase_plot_numpy.py");
  const run = spawnSync("python3", [script, "--json"], { encoding: "utf8" });
  if (run.status !== 0) {
    console.error(`phase_plot_numpy.py failed: ${run.stderr}`);
    return null;
  }
  const byName = {};
  for (const line of run.stdout.split("\n")) {
    if (line.trim()) {
      const r = JSON.parse(line);
      byName[r.function] = r;
    }
  }
  return byName;
}

const fmt = (x) => (Number.isFinite(x) ? x.toFixed(2) : "-").padStart(8);
console.log(`wasm phase plot under node ${process.version}, ${mpx * 1e6} pixels, median of ${REPS} runs, Mpixel/s`);
console.log("plain = colour only (no lines, what numpy times); lines = modulus and phase lines on");
const rows = [];
for (let i = 0; i < bench.case_count(); i++) {
  const name = bench.case_name(i);
  const expr = bench.case_expr(i);
  const diff = bench.max_difference(i);
  const a = {};
  const b = {};
  [a.eval, b.eval] = ratePair(() => bench.eval_interpreted(expr), () => bench.eval_handwritten(i));
  [a.plain, b.plain] = ratePair(
    () => bench.render_interpreted(expr, false),
    () => bench.render_handwritten(i, false),
  );
  [a.lines, b.lines] = ratePair(
    () => bench.render_interpreted(expr, true),
    () => bench.render_handwritten(i, true),
  );
  rows.push({ name, expr, diff, a, b });
  console.log(`\n${name}: f(z) = ${expr}   (interpreted vs hand-written agree to ${diff.toExponential(1)} relative)`);
  console.log(`  ${"".padEnd(24)}${"eval".padStart(8)}${"plain".padStart(8)}${"lines".padStart(8)}`);
  console.log(`  ${"(a) interpreted, wasm".padEnd(24)}${fmt(a.eval)}${fmt(a.plain)}${fmt(a.lines)}`);
  console.log(`  ${"(b) hand-written, wasm".padEnd(24)}${fmt(b.eval)}${fmt(b.plain)}${fmt(b.lines)}`);
  console.log(`  ${"a/b".padEnd(24)}${fmt(a.eval / b.eval)}${fmt(a.plain / b.plain)}${fmt(a.lines / b.lines)}`);
}

const np = numpyRates();
if (!np) {
  console.log("\n(c) numpy: skipped (python3 with numpy not found)");
} else {
  const version = Object.values(np)[0]?.numpy ?? "?";
  console.log(`\n(c) numpy ${version} vectorised, same grid and functions (eval, and eval + colour lookup = plain)`);
  console.log(`  ${"function".padEnd(12)}${"c eval".padStart(8)}${"c plain".padStart(8)}${"a/c eval".padStart(10)}${"a/c plain".padStart(10)}`);
  for (const r of rows) {
    const c = np[r.name];
    if (!c) continue;
    console.log(
      `  ${r.name.padEnd(12)}${fmt(c.eval_mpx_s)}${fmt(c.plain_mpx_s)}` +
        `${fmt(r.a.eval / c.eval_mpx_s).padStart(10)}${fmt(r.a.plain / c.plain_mpx_s).padStart(10)}`,
    );
  }
}
console.log("\nratios are of throughput: above 1 means (a) is faster");
