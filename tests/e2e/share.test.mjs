// Unit tests (node, no browser) of www/js/share.js, the link codec: short states as the old
// "#s=" percent-encoded JSON, long ones packed as "#d=" deflate (zlib format, RFC 1950/1951) +
// base64url, and links that are cut or garbled refused (never read as another state). The packed
// form is checked against node's own zlib (an independent implementation of RFC 1950/1951) and
// Buffer's base64url (RFC 4648 §5).
// run.mjs imports this file; alone: node --test tests/e2e/share.test.mjs
import { test, describe, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { cpSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { inflateSync, deflateSync } from 'node:zlib';

const here = dirname(fileURLToPath(import.meta.url));
const jsDir = resolve(here, '..', '..', 'www', 'js');

/** A valid sum of simple poles exactly `n` characters long (the last numerator padded with 0s after its point). */
export function longSum(n, v = 'z') {
  let f = '';
  for (let k = 1; ; k++) {
    const term = `${(k % 7) + 1}/(${v} - ${(k * 0.0137).toFixed(4)})`;
    if (f.length + 3 + term.length + 40 > n) break;
    f += (k > 1 ? ' + ' : '') + term;
  }
  const rest = n - f.length - ' + 1.'.length - `/(${v} - 0.5)`.length;
  return f + ' + 1.' + '0'.repeat(rest) + `/(${v} - 0.5)`;
}

describe('links: the state codec (node)', () => {
  let S, dir;
  before(async () => {
    dir = mkdtempSync(join(tmpdir(), 'residuary-share-'));
    cpSync(jsDir, dir, { recursive: true });
    writeFileSync(join(dir, 'package.json'), '{"type": "module"}');
    S = await import(pathToFileURL(join(dir, 'share.js')).href);
  });
  after(() => { if (dir) rmSync(dir, { recursive: true, force: true }); });

  test('a short state keeps the old plain form, and an old plain link opens', async () => {
    const state = { f: '(z^3 - 1) / (z^2 + 0.4*z + 4)', var: 'z', view: [-3, 3, -3, 3] };
    const hash = await S.encodeLink(state);
    assert.equal(hash, '#s=' + encodeURIComponent(JSON.stringify(state)));
    assert.deepEqual(await S.decodeLink(hash), { kind: 'ok', raw: state });
  });

  test('a 10 000-character f is packed, read back exactly by node zlib, and by the page', async () => {
    const f = longSum(10000);
    assert.equal(f.length, 10000);
    const state = { f, var: 'z', params: [{ name: 'a', value: '0.3+0.1i', lo: null, hi: null }] };
    const hash = await S.encodeLink(state);
    assert.ok(hash.startsWith('#d='), hash.slice(0, 10));
    assert.ok(hash.length < ('#s=' + encodeURIComponent(JSON.stringify(state))).length / 2, `packed ${hash.length} characters`);
    // node zlib, RFC 1950 (deflate with its Adler-32 check); Buffer's base64url, RFC 4648 §5
    const json = inflateSync(Buffer.from(hash.slice(3), 'base64url')).toString('utf8');
    assert.equal(JSON.parse(json).f, f);
    const back = await S.decodeLink(hash);
    assert.equal(back.kind, 'ok');
    assert.equal(back.raw.f, f);
    assert.deepEqual(back.raw, state);
  });

  test('a link packed by node zlib opens (the page reads standard zlib deflate)', async () => {
    const state = { f: 'exp(1/z)/(z - 2)', var: 'z', note: 'ü €' };
    const hash = '#d=' + deflateSync(Buffer.from(JSON.stringify(state), 'utf8')).toString('base64url');
    assert.deepEqual(await S.decodeLink(hash), { kind: 'ok', raw: state });
  });

  test('base64url agrees with Buffer for every byte value and every length mod 3', () => {
    for (const n of [0, 1, 2, 3, 255, 256, 257]) {
      const bytes = Uint8Array.from({ length: n }, (_, i) => (i * 37 + 11) & 255);
      const text = S.toBase64url(bytes);
      assert.equal(text, Buffer.from(bytes).toString('base64url'));
      assert.deepEqual(Array.from(S.fromBase64url(text)), Array.from(bytes));
    }
  });

  test('a cut, garbled or foreign link is refused with a reason; other hashes are not state links', async () => {
    const hash = await S.encodeLink({ f: longSum(6000), var: 'z' });
    assert.ok(hash.startsWith('#d='));
    const cut = await S.decodeLink(hash.slice(0, Math.floor(hash.length / 2)));
    assert.equal(cut.kind, 'bad');
    assert.match(cut.reason, /cut or garbled/);
    const mid = 3 + Math.floor((hash.length - 3) / 2);
    const flipped = hash.slice(0, mid) + (hash[mid] === 'A' ? 'B' : 'A') + hash.slice(mid + 1);
    assert.equal((await S.decodeLink(flipped)).kind, 'bad'); // the Adler-32 check fails
    // every single changed character in the packed body is caught (a sample of positions)
    for (let at = 3; at < hash.length - 2; at += 97) {
      const other = hash.slice(0, at) + (hash[at] === 'Q' ? 'R' : 'Q') + hash.slice(at + 1);
      assert.equal((await S.decodeLink(other)).kind, 'bad', `changed at ${at}`);
    }
    assert.equal((await S.decodeLink('#d=not*base64url')).kind, 'bad');
    assert.equal((await S.decodeLink('#s=%E0%A4%A')).kind, 'bad');                       // a cut escape
    assert.equal((await S.decodeLink('#s=' + encodeURIComponent('{"f": "z"'))).kind, 'bad'); // cut JSON
    assert.equal((await S.decodeLink('#s=' + encodeURIComponent('{"var": "z"}'))).kind, 'bad'); // no f
    assert.equal((await S.decodeLink('#s=' + encodeURIComponent('[1, 2]'))).kind, 'bad');
    assert.deepEqual(await S.decodeLink(''), { kind: 'none' });
    assert.deepEqual(await S.decodeLink('#section-2'), { kind: 'none' });
  });
});
