// The engine: the wasm core on the main thread (quick calls such as the pointer
// readout) plus two Web Workers started from Blob URLs built from the same
// inlined glue and module — one draws phase plots band by band, the other runs
// heavy tasks (singularities, Laurent series) and can be cancelled by ending it.
// When workers are not available everything runs on the main thread in small steps.
import * as wasmGlue from '../../dist/pkg/residuary.js';

/* global WASM_GZIP_BASE64, GLUE_SOURCE, WORKER_SOURCE */

export const Engine = {
  ready: false,
  version: '',
  message: '',
  usesWorkers: false,
  module: null,
  plotWorker: null,
  heavyWorker: null,
  heavyPending: new Map(),
  heavyRequests: new Map(),
  respawning: null,
  nextId: 1,
  plotJob: null,
};

/** Let the browser paint and handle input before continuing. */
export function yieldToBrowser() {
  return new Promise((resolve) => setTimeout(resolve, 0));
}

/** The error object of a response, if any: {code, message, span} or null. `code` is the core's
 *  machine code (e.g. "budget_exhausted"), or one the page sets itself: "cancelled" (Stop),
 *  "not_ready" (the core is still loading), "internal" (anything else that went wrong here);
 *  null when the answer carries none. Decide on `code`, never on the words of `message`. */
export function responseError(response) {
  if (!response || typeof response !== 'object') return { code: 'internal', message: 'no answer from the engine', span: null };
  if (response.error) {
    const e = response.error;
    return { code: typeof e.code === 'string' ? e.code : null, message: String(e.message || 'unknown error'), span: e.span || null };
  }
  return null;
}

function decodeBase64(text) {
  const bin = atob(text);
  const bytes = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
  return bytes;
}

/** The core's wasm bytes from the page: base64 of gzip, inflated by the browser's own
 *  DecompressionStream (every current browser has it; without it the core cannot start, and the
 *  page says so). */
async function wasmBytes(text) {
  if (typeof DecompressionStream !== 'function') throw new Error('this browser cannot inflate the page\'s compressed core (it has no DecompressionStream); use a current browser');
  const stream = new Blob([decodeBase64(text)]).stream().pipeThrough(new DecompressionStream('gzip'));
  return new Uint8Array(await new Response(stream).arrayBuffer());
}

/** An error response from a thrown value: the core's own error object passes through as it is;
 *  anything else (a trap, a failed call) becomes code "internal", or `code` when given. */
function errorObject(e, code = 'internal') {
  if (e && e.error) return { error: e.error };
  return { error: { code, message: String((e && e.message) || e), span: null } };
}

/** Load the core; resolves with {ok, message}. Never rejects. */
export async function startEngine() {
  try {
    if (typeof WASM_GZIP_BASE64 === 'string') {
      Engine.module = await WebAssembly.compile(await wasmBytes(WASM_GZIP_BASE64));
      await wasmGlue.default({ module_or_path: Engine.module });
    } else {
      await wasmGlue.default();
    }
    Engine.version = wasmGlue.version();
    Engine.ready = true;
  } catch (e) {
    Engine.message = 'The computing core could not start: ' + String((e && e.message) || e);
    return { ok: false, message: Engine.message };
  }
  if (Engine.module && typeof GLUE_SOURCE === 'string') {
    Engine.plotWorker = await spawnWorker();
    Engine.heavyWorker = Engine.plotWorker ? await spawnWorker() : null;
    Engine.usesWorkers = Boolean(Engine.plotWorker && Engine.heavyWorker);
    if (Engine.heavyWorker) attachHeavy(Engine.heavyWorker);
    if (Engine.plotWorker) attachPlot(Engine.plotWorker);
  }
  return { ok: true };
}

/** Start one worker and wait for it to load the module; null if that fails. */
function spawnWorker() {
  return new Promise((resolve) => {
    let worker;
    try {
      const blob = new Blob([GLUE_SOURCE, '\n', WORKER_SOURCE], { type: 'text/javascript' });
      const url = URL.createObjectURL(blob);
      worker = new Worker(url);
      URL.revokeObjectURL(url);
    } catch (e) {
      resolve(null);
      return;
    }
    const timer = setTimeout(() => { worker.terminate(); resolve(null); }, 10000);
    worker.onmessage = (event) => {
      clearTimeout(timer);
      if (event.data.type === 'ready') resolve(worker);
      else { worker.terminate(); resolve(null); }
    };
    worker.onerror = (event) => { event.preventDefault(); clearTimeout(timer); worker.terminate(); resolve(null); };
    worker.postMessage({ type: 'init', module: Engine.module });
  });
}

function attachHeavy(worker) {
  worker.onmessage = (event) => {
    const msg = event.data;
    const pending = Engine.heavyPending.get(msg.id);
    if (pending) {
      Engine.heavyPending.delete(msg.id);
      Engine.heavyRequests.delete(msg.id);
      let response = msg.response;
      if (typeof msg.json === 'string') {
        try { response = JSON.parse(msg.json); } catch (e) { response = { error: { code: 'internal', message: 'the answer could not be read: ' + String(e && e.message), span: null } }; }
      }
      pending(response);
    }
  };
}

/** A quick call on the main thread (e.g. evaluate at one point). Never throws. */
export function runNow(request) {
  if (!Engine.ready) return { error: { code: 'not_ready', message: Engine.message || 'the computing core is still loading', span: null } };
  try {
    return wasmGlue.run(request);
  } catch (e) {
    return errorObject(e);
  }
}

/** A heavy call, off the main thread when possible. Resolves with the response (or error object).
 *  `ticket` (optional, an object) gets the call's `id` for abandonHeavy. */
export async function runHeavy(request, ticket = null) {
  if (Engine.respawning) await Engine.respawning; // a worker being restarted (abandonHeavy)
  if (!Engine.heavyWorker) {
    await yieldToBrowser();
    return runNow(request);
  }
  const id = Engine.nextId++;
  if (ticket) ticket.id = id;
  return new Promise((resolve) => {
    Engine.heavyPending.set(id, resolve);
    Engine.heavyRequests.set(id, request);
    Engine.heavyWorker.postMessage({ type: 'run', id, request });
  });
}

/** Abandon one heavy call (its promise resolves with code "cancelled") and keep the others: the
 *  worker is ended (a call cannot be interrupted inside the core), a new one started and the other
 *  calls still waiting are sent to it again. Resolves true when the call was still running. */
export async function abandonHeavy(id) {
  if (!Engine.heavyWorker || !Engine.heavyPending.has(id)) return false;
  Engine.heavyWorker.terminate();
  Engine.heavyWorker = null;
  Engine.heavyPending.get(id)({ error: { code: 'cancelled', message: 'cancelled', span: null } });
  Engine.heavyPending.delete(id);
  Engine.heavyRequests.delete(id);
  Engine.respawning = spawnWorker();
  const worker = await Engine.respawning;
  Engine.respawning = null;
  if (!worker) {
    for (const resolve of Engine.heavyPending.values()) resolve({ error: { code: 'internal', message: 'the computing worker could not be restarted', span: null } });
    Engine.heavyPending.clear();
    Engine.heavyRequests.clear();
    return true;
  }
  attachHeavy(worker);
  Engine.heavyWorker = worker;
  for (const [other, request] of Engine.heavyRequests) worker.postMessage({ type: 'run', id: other, request });
  return true;
}

/** Stop every heavy call in flight (their promises resolve with an error of code "cancelled"). */
export async function cancelHeavy() {
  if (!Engine.heavyWorker) return;
  Engine.heavyWorker.terminate();
  for (const resolve of Engine.heavyPending.values()) resolve({ error: { code: 'cancelled', message: 'cancelled', span: null } });
  Engine.heavyPending.clear();
  Engine.heavyRequests.clear();
  Engine.heavyWorker = null;
  const worker = await spawnWorker();
  if (worker) { attachHeavy(worker); Engine.heavyWorker = worker; }
}

function attachPlot(worker) {
  worker.onmessage = (event) => {
    const msg = event.data;
    const job = Engine.plotJob;
    if (!job || job.id !== msg.id) return;
    if (msg.type === 'band') job.onBand(msg.rows, new Uint8Array(msg.rgba.buffer || msg.rgba));
    else if (msg.type === 'plot-done') { Engine.plotJob = null; job.resolve({ done: true }); }
    else if (msg.type === 'plot-error') { Engine.plotJob = null; job.resolve({ error: msg.error }); }
  };
}

/** Draw a phase plot in row bands; `onBand(rows, rgba)` gets each band.
 *  A newer call makes the older one resolve with {stale:true}. */
export function plotBands(request, bands, onBand) {
  if (Engine.plotJob) { Engine.plotJob.resolve({ stale: true }); Engine.plotJob = null; }
  const id = Engine.nextId++;
  return new Promise((resolve) => {
    const job = { id, resolve, onBand };
    Engine.plotJob = job;
    if (Engine.plotWorker) {
      Engine.plotWorker.postMessage({ type: 'plot', id, request, bands });
      return;
    }
    (async () => {
      for (const rows of bands) {
        await yieldToBrowser();
        if (Engine.plotJob !== job) return;
        let rgba;
        try {
          const req = Object.assign({}, request, rows ? { rows } : {});
          rgba = wasmGlue.phase_plot_rgba(req);
        } catch (e) {
          Engine.plotJob = null;
          resolve(errorObject(e));
          return;
        }
        onBand(rows, rgba);
      }
      if (Engine.plotJob === job) { Engine.plotJob = null; resolve({ done: true }); }
    })();
  });
}

/** One small phase plot in a single call (used for the colour key). */
export function plotOnce(request) {
  if (!Engine.ready) return errorObject(new Error('the computing core is still loading'), 'not_ready');
  try {
    return { rgba: wasmGlue.phase_plot_rgba(request) };
  } catch (e) {
    return errorObject(e);
  }
}
