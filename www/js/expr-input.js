// The expression box: a textarea over a mirror that draws a wavy underline under
// the characters the core's error points at ([start, end) in characters), and the
// line under it saying whether the function is understood.
import { Engine, runNow, responseError } from './engine.js';
import { paramsForRequest, functionInput } from './params.js';

/** Underline `span` of `text` in the mirror; a null span clears it. */
export function showUnderline(mirror, text, span) {
  mirror.textContent = '';
  if (!span) { mirror.textContent = text + '\u200b'; return; }
  const chars = Array.from(text);            // the core counts characters, not UTF-16 units
  let [start, end] = span;
  start = Math.max(0, Math.min(start, chars.length));
  end = Math.max(start, Math.min(end, chars.length));
  const before = chars.slice(0, start).join('');
  let marked = chars.slice(start, end).join('');
  const after = chars.slice(end).join('');
  if (marked === '' || /^\s+$/.test(marked)) marked = marked + '\u00a0\u00a0'; // a visible mark at the end
  const mark = document.createElement('mark');
  mark.className = 'err';
  mark.textContent = marked;
  mirror.append(before, mark, after + '\u200b');
}

/** Keep the mirror's scroll and size in step with the textarea. */
export function syncMirror(textarea, mirror) {
  textarea.style.height = 'auto';
  textarea.style.height = Math.min(textarea.scrollHeight + 2, 220) + 'px';
  mirror.style.height = textarea.style.height;
  mirror.scrollTop = textarea.scrollTop;
}

/** Ask the core whether the function (and the parameters) can be evaluated, and say so under
 *  the box (`parts`: expr, mirror, message). True when a picture and a search can go ahead. */
export function checkExpression(parts, state) {
  syncMirror(parts.expr, parts.mirror);
  const { problems } = paramsForRequest(state.params);
  if (!Engine.ready) {
    showUnderline(parts.mirror, state.f, null);
    parts.message.textContent = Engine.message || 'Loading the computing core…';
    return false;
  }
  if (state.f.trim() === '') {
    showUnderline(parts.mirror, state.f, null);
    parts.message.textContent = 'Type a function of ' + (state.var.trim() || 'z') + ', for example 1/(' + (state.var.trim() || 'z') + '^2 + 1.5*' + (state.var.trim() || 'z') + ' + 4).';
    parts.message.className = 'expr-message';
    return false;
  }
  const resp = runNow(Object.assign(functionInput(state), { task: 'evaluate', at: [[0.31, 0.17]] }));
  const err = responseError(resp);
  showUnderline(parts.mirror, state.f, err && err.span);
  if (err) {
    parts.message.textContent = err.message.charAt(0).toUpperCase() + err.message.slice(1) + (err.message.endsWith('.') ? '' : '.');
    parts.message.className = 'expr-message bad';
    parts.expr.setAttribute('aria-invalid', 'true');
    return false;
  }
  parts.expr.removeAttribute('aria-invalid');
  if (problems.length) {
    parts.message.textContent = 'Parameter: ' + problems[0] + '.';
    parts.message.className = 'expr-message bad';
    return false;
  }
  parts.message.textContent = 'f(' + functionInput(state).var + ') is understood.';
  parts.message.className = 'expr-message good';
  return true;
}
