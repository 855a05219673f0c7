#!/usr/bin/env node
// Builds ONE self-contained page, dist/residuary.html, from:
//   www/index.html (the template), www/style.css, www/js/*.js (our modules),
//   dist/pkg/residuary.js + residuary_bg.wasm (wasm-bindgen --target web output),
//   demo-data/*.json (the example menu).
// Our modules are written as ES modules for development; here they are joined
// in dependency order with their import lines removed and `export` dropped, so
// every top-level name must be unique (checked below). The order comes from the
// imports themselves: a depth-first walk of the import graph from www/js/main.js
// puts every module after the modules it imports (a cycle or a missing file
// stops the build with the chain of imports that leads to it). The wasm-bindgen glue is
// wrapped into one namespace object `wasmGlue`; the wasm goes in gzip-compressed, as base64.
// The same glue text, plus www/js/worker-body.js, is kept as a string so the
// page can start Web Workers from Blob URLs (nothing is fetched, even from file://).
// No npm dependencies: node's standard library only.
import { readFileSync, writeFileSync, readdirSync, mkdirSync, existsSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { spawnSync } from 'node:child_process';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
const www = join(root, 'www');
const out = join(root, 'dist', 'residuary.html');
const pkg = join(root, 'dist', 'pkg');

const jsDir = join(www, 'js');
const ENTRY = 'main';
// The one import that is not one of our modules: the wasm-bindgen glue, which the
// bundle provides as `wasmGlue` (see wrapGlue).
const GLUE_IMPORT = { path: join(pkg, 'residuary.js'), name: 'wasmGlue' };

function fail(message) {
  console.error('build-page: ' + message);
  process.exit(1);
}

function read(path) {
  if (!existsSync(path)) fail(`missing ${path} (run the wasm build first: make build)`);
  return readFileSync(path, 'utf8');
}

// An import statement: `import {a, b} from './x.js';`, `import * as n from '...';`
// or `import './x.js';` (possibly over several lines), and a re-export `export {..} from '...'`.
const IMPORT_RE = /^import\s+(?:([^;'"]*?)\s+from\s+)?['"]([^'"]+)['"];?[ \t]*$/gm;
const REEXPORT_RE = /^export\s*\{[^}]*\}\s*from\s+['"]([^'"]+)['"];?[ \t]*$/gm;

/** Module name (path under www/js without .js, e.g. "plot/view") of an import `spec` in module `from`. */
function resolveImport(from, spec, clause) {
  const target = resolve(dirname(join(jsDir, from + '.js')), spec);
  if (target === GLUE_IMPORT.path) {
    if (clause !== `* as ${GLUE_IMPORT.name}`) fail(`www/js/${from}.js: import the wasm glue as \`import * as ${GLUE_IMPORT.name} from '${spec}'\``);
    return null;
  }
  const rel = relative(jsDir, target).split(sep).join('/');
  if (rel.startsWith('..') || !rel.endsWith('.js')) fail(`www/js/${from}.js imports '${spec}', which is not a .js module under www/js`);
  if (clause && !/^\{[^}]*\}$/.test(clause.trim())) fail(`www/js/${from}.js: write \`import { a, b } from '${spec}'\` (the bundle joins modules into one scope, so default and namespace imports cannot work)`);
  if (clause && /\sas\s/.test(clause)) fail(`www/js/${from}.js: \`as\` renames in imports from '${spec}' cannot work in the joined bundle; use the exported name`);
  return rel.slice(0, -3);
}

/** The modules `name` imports, in the order written. */
function importsOf(name, text) {
  const found = [];
  for (const m of text.matchAll(IMPORT_RE)) found.push([m[2], m[1] || '']);
  for (const m of text.matchAll(REEXPORT_RE)) found.push([m[1], '']);
  return found.map(([spec, clause]) => resolveImport(name, spec, clause)).filter((n) => n !== null);
}

/** Every module reachable from `entry`, each after the modules it imports (depth-first post-order). */
function moduleOrder(entry) {
  const order = [];
  const state = new Map(); // name -> 'open' while its imports are walked, 'done' after
  const walk = (name, chain) => {
    if (state.get(name) === 'done') return;
    if (state.get(name) === 'open') {
      const loop = chain.slice(chain.indexOf(name)).concat(name);
      fail('import cycle: ' + loop.map((n) => `www/js/${n}.js`).join(' -> ') + ' (the joined bundle needs an order; move the shared part into its own module)');
    }
    const path = join(jsDir, name + '.js');
    if (!existsSync(path)) {
      const by = chain.length ? `www/js/${chain[chain.length - 1]}.js imports www/js/${name}.js` : `the entry www/js/${name}.js`;
      fail(`missing module: ${by}, which does not exist (import chain: ${chain.concat(name).join(' -> ')})`);
    }
    state.set(name, 'open');
    for (const dep of importsOf(name, readFileSync(path, 'utf8'))) walk(dep, chain.concat(name));
    state.set(name, 'done');
    order.push(name);
  };
  walk(entry, []);
  return order;
}

/** Strip import lines and `export` keywords from one of our modules. */
function flattenModule(name) {
  const text = read(join(jsDir, name + '.js'));
  const stripped = text
    .replace(IMPORT_RE, '')
    .replace(/^export\s*\{[^}]*\}\s*(from\s+['"][^'"]+['"])?;?[ \t]*$/gm, '');
  const lines = stripped.split('\n');
  const body = lines.map((l) => l.replace(/^export\s+(default\s+)?(?=(async\s+)?function|const|let|class)/, '')).join('\n');
  if (/^\s*(import|export)\s/m.test(body)) fail(`www/js/${name}.js: an import/export the bundler cannot flatten (write import {..} from './x.js'; or export function ...)`);
  return `// ---- www/js/${name}.js ----\n${body}`;
}

/** Top-level names declared at column 0. */
function topLevelNames(code) {
  const names = [];
  const re = /^(?:async\s+)?(?:function\*?|const|let|var|class)\s+([A-Za-z_$][\w$]*)/gm;
  let m;
  while ((m = re.exec(code))) names.push(m[1]);
  return names;
}

/** Wrap the wasm-bindgen glue into `const wasmGlue = (() => {...})();`. */
function wrapGlue(glue) {
  if (/^\s*import\s/m.test(glue)) fail('the wasm-bindgen glue imports other files; this build expects none (no JS snippets)');
  const exported = [];
  let body = glue.replace(/^export\s+(function|class|const|let)\s+([A-Za-z_$][\w$]*)/gm, (_, kind, name) => {
    exported.push([name, name]);
    return `${kind} ${name}`;
  });
  body = body.replace(/^export\s*\{([^}]*)\};?\s*$/gm, (_, list) => {
    for (const item of list.split(',')) {
      const parts = item.trim().split(/\s+as\s+/);
      if (parts[0]) exported.push([parts[1] || parts[0], parts[0]]);
    }
    return '';
  });
  body = body.replace(/^export\s+default\s+([A-Za-z_$][\w$]*);?\s*$/gm, (_, name) => { exported.push(['default', name]); return ''; });
  if (/^\s*export\s/m.test(body)) fail('an export in the wasm-bindgen glue was not understood');
  // Classic worker scripts cannot contain import.meta; the page never uses that path (it passes the module).
  body = body.replace(/import\.meta\.url/g, 'self.location.href');
  const names = exported.map(([as, name]) => `${JSON.stringify(as)}: ${name}`).join(', ');
  for (const need of ['run', 'run_json', 'phase_plot_rgba', 'version', 'initSync', 'default']) {
    if (!exported.some(([as]) => as === need)) fail(`the wasm glue does not export ${need}`);
  }
  return `const wasmGlue = (() => {\n${body}\nreturn { ${names} };\n})();\n`;
}

/** Safe inside a <script> element. */
function scriptSafe(code, what) {
  if (/<\/script/i.test(code)) fail(`${what} contains "</script", which would end the inline script`);
  return code;
}
const jsonString = (s) => JSON.stringify(s).replace(/</g, '\\u003c');

// Demo data: our own scenarios.
function loadDemos() {
  const dir = join(root, 'demo-data');
  if (!existsSync(dir)) return [];
  return readdirSync(dir).filter((f) => f.endsWith('.json')).sort().map((f) => {
    let d;
    try { d = JSON.parse(readFileSync(join(dir, f), 'utf8')); } catch (e) { fail(`demo-data/${f}: ${e.message}`); }
    for (const k of ['title', 'f']) if (typeof d[k] !== 'string') fail(`demo-data/${f}: needs a "${k}" string`);
    if (d.view && !(Array.isArray(d.view) && d.view.length === 4 && d.view[1] > d.view[0] && d.view[3] > d.view[2])) {
      fail(`demo-data/${f}: "view" must be [x0, x1, y0, y1] with x0 < x1 and y0 < y1`);
    }
    return { id: f.replace(/\.json$/, ''), ...d };
  });
}

const modules = moduleOrder(ENTRY);
if (process.argv.includes('--order')) { // print the module order and stop (needs no wasm build)
  console.log(modules.map((n) => `www/js/${n}.js`).join('\n'));
  process.exit(0);
}
const glue = wrapGlue(read(join(pkg, 'residuary.js')));
const wasm = readFileSync(join(pkg, 'residuary_bg.wasm'));
// The wasm goes in gzip-compressed (the page inflates it with the browser's own
// DecompressionStream): about a third of the bytes, so the file opens and parses sooner.
const wasmGzip = gzipSync(wasm, { level: 9 });
const workerBody = read(join(www, 'js', 'worker-body.js'));
const app = modules.map(flattenModule).join('\n');
const demos = loadDemos();

const seen = new Map();
for (const name of topLevelNames(app)) {
  if (seen.has(name)) fail(`top-level name "${name}" is declared twice in www/js; rename one`);
  seen.set(name, true);
}

// What the page bundle and the element bundle (writeElementBundle) both carry: the core and its glue.
const corePieces = [
  `const WASM_GZIP_BASE64 = "${wasmGzip.toString('base64')}";`,
  `const GLUE_SOURCE = ${jsonString(glue)};`,
  `const WORKER_SOURCE = ${jsonString(workerBody)};`,
];
const bundle = [
  '// residuary page bundle (generated by www/tools/build-page.mjs)',
  ...corePieces,
  `const DEMO_DATA = ${JSON.stringify(demos).replace(/</g, '\\u003c')};`,
  scriptSafe(glue, 'the wasm glue'),
  scriptSafe(app, 'www/js'),
].join('\n');

// The bundle must parse as one module: a brace lost in one file would otherwise swallow the
// files after it (each file alone parses), and the page would be dead.
{
  const probe = join(tmpdir(), `residuary-bundle-${process.pid}.mjs`);
  writeFileSync(probe, bundle);
  const check = spawnSync(process.execPath, ['--check', probe], { encoding: 'utf8' });
  rmSync(probe, { force: true });
  if (check.status !== 0) fail('the page bundle does not parse:\n' + (check.stderr || '').split('\n').slice(0, 6).join('\n'));
}

let html = read(join(www, 'index.html'));
const css = read(join(www, 'style.css'));
const linkTag = /<link rel="stylesheet" href="style\.css">/;
const scriptTag = /<script type="module" src="js\/main\.js"><\/script>/;
if (!linkTag.test(html) || !scriptTag.test(html)) fail('www/index.html must contain the style.css link and the js/main.js module script');
html = html.replace(linkTag, () => `<style>\n${scriptSafe(css, 'style.css').replace(/<\/style/gi, '<\\/style')}\n</style>`);
html = html.replace(scriptTag, () => `<script type="module">\n${bundle}\n</script>`);

mkdirSync(dirname(out), { recursive: true });
writeFileSync(out, html);
console.log(`build-page: wrote ${out} (${(html.length / 1024).toFixed(0)} KiB; wasm ${(wasm.length / 1024).toFixed(0)} KiB, ${(wasmGzip.length / 1024).toFixed(0)} KiB gzipped; ${modules.length} modules; ${demos.length} examples)`);

writeElementBundle(corePieces, glue);

/** The second output, dist/residuary-view.js: the <residuary-view> element (www/js/embed-element.js
 *  and what it imports, joined by the same walk and flattening as the page) with the same core
 *  pieces, as ONE classic script wrapped in a function scope. A classic script, because Chromium
 *  refuses module scripts from file: (docs/embedding.md); the scope keeps every name off the host
 *  page's globals. */
function writeElementBundle(pieces, glueText) {
  const names = moduleOrder('embed-element');
  const code = names.map(flattenModule).join('\n');
  const seenHere = new Set();
  for (const name of topLevelNames(code)) {
    if (seenHere.has(name)) fail(`top-level name "${name}" is declared twice in the element's modules; rename one`);
    seenHere.add(name);
  }
  const text = [
    '// <residuary-view>: the residuary element (generated by www/tools/build-page.mjs; docs/embedding.md)',
    '(() => {',
    '"use strict";',
    ...pieces,
    glueText,
    code,
    '})();',
    '',
  ].join('\n');
  const probe = join(tmpdir(), `residuary-view-${process.pid}.js`);
  writeFileSync(probe, text);
  const check = spawnSync(process.execPath, ['--check', probe], { encoding: 'utf8' });
  rmSync(probe, { force: true });
  if (check.status !== 0) fail('the element bundle does not parse:\n' + (check.stderr || '').split('\n').slice(0, 6).join('\n'));
  const path = join(root, 'dist', 'residuary-view.js');
  writeFileSync(path, text);
  console.log(`build-page: wrote ${path} (${(text.length / 1024).toFixed(0)} KiB; ${names.length} modules)`);
}
