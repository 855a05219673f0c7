// The expression box: a textarea over a mirror that draws a wavy underline under
// the characters the core's error points at ([start, end) in characters).

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
