// Worker side of the engine (a classic script; the build puts the wasm glue,
// as `wasmGlue`, in front of it and starts it from a Blob URL).
// Messages in:  {type:'init', module} | {type:'run', id, request} | {type:'plot', id, request, bands}
// Messages out: {type:'ready', version} | {type:'init-error', message} | {type:'result', id, json} (the
//               response as JSON text; {…, response} when it cannot be written as JSON)
//               {type:'band', id, rows, width, rgba} | {type:'plot-done', id} | {type:'plot-error', id, error}
/* global wasmGlue */
let latestPlot = -1;

/** The core's error object as it is; anything else thrown becomes code "internal". */
function errorOf(e) {
  if (e && e.error) return e.error;
  return { code: 'internal', message: String((e && e.message) || e), span: null };
}

self.onmessage = async (event) => {
  const msg = event.data;
  if (msg.type === 'init') {
    try {
      wasmGlue.initSync({ module: msg.module });
      self.postMessage({ type: 'ready', version: wasmGlue.version() });
    } catch (e) {
      self.postMessage({ type: 'init-error', message: String((e && e.message) || e) });
    }
  } else if (msg.type === 'run') {
    let response;
    try {
      response = wasmGlue.run(msg.request);
    } catch (e) {
      response = { error: errorOf(e) };
    }
    // As JSON text: one string crosses to the page and is parsed there in a few milliseconds,
    // where a structured clone of a large answer (thousands of poles) is slow to unpack.
    let json = null;
    try { json = JSON.stringify(response); } catch (e) { json = null; }
    if (json !== null) self.postMessage({ type: 'result', id: msg.id, json });
    else self.postMessage({ type: 'result', id: msg.id, response });
  } else if (msg.type === 'plot') {
    latestPlot = msg.id;
    for (const rows of msg.bands) {
      // Let a newer request arrive; drop this one if it has been superseded.
      await new Promise((resolve) => setTimeout(resolve, 0));
      if (latestPlot !== msg.id) return;
      try {
        const request = Object.assign({}, msg.request, rows ? { rows } : {});
        const rgba = wasmGlue.phase_plot_rgba(request);
        self.postMessage({ type: 'band', id: msg.id, rows, width: msg.request.size[0], rgba }, [rgba.buffer]);
      } catch (e) {
        self.postMessage({ type: 'plot-error', id: msg.id, error: errorOf(e) });
        return;
      }
    }
    self.postMessage({ type: 'plot-done', id: msg.id });
  } else if (msg.type === 'cancel-plot') {
    latestPlot = -1;
  }
};
