// The page state as a link, whole: short states as percent-encoded JSON after "#s=" (the form
// every older link has), longer ones packed after "#d=": the JSON's UTF-8 bytes through the
// browser's own deflate (CompressionStream 'deflate': the zlib format, RFC 1950, raw deflate
// RFC 1951 with an Adler-32 checksum of the text) and written in base64url (RFC 4648 §5).
// Nothing is cut: a state comes back from its link exactly as it went in, or the link is refused
// as unreadable: the checksum makes a garbled packed link fail instead of inflating to some other
// state (raw deflate alone has no check). DOM-free, so node runs its tests (tests/e2e/share.test.mjs).

export const PLAIN_MARK = '#s=';
export const PACKED_MARK = '#d=';
/** The packing of '#d=' links: zlib-wrapped deflate (its checksum catches garbling). */
const PACKING = 'deflate';
/** A plain link longer than this (characters) is packed, when the browser can pack. */
export const PACK_BEYOND = 2000;

const canPack = () => typeof CompressionStream === 'function' && typeof DecompressionStream === 'function';

/** Bytes through a (de)compression stream. */
async function through(bytes, stream) {
  const out = new Response(new Blob([bytes]).stream().pipeThrough(stream));
  return new Uint8Array(await out.arrayBuffer());
}

/** base64url without padding. */
export function toBase64url(bytes) {
  let bin = '';
  for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode.apply(null, bytes.subarray(i, i + 0x8000));
  return btoa(bin).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

/** base64url (padding optional) to bytes; throws on any other character or an impossible length. */
export function fromBase64url(text) {
  if (!/^[A-Za-z0-9_-]*={0,2}$/.test(text)) throw new Error('characters outside base64url');
  const bare = text.replace(/=+$/, '');
  if (bare.length % 4 === 1) throw new Error('a base64url length no encoding gives');
  const bin = atob(bare.replace(/-/g, '+').replace(/_/g, '/') + '='.repeat((4 - (bare.length % 4)) % 4));
  const bytes = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
  return bytes;
}

/** The link hash for a state object: plain up to PACK_BEYOND characters, packed beyond. */
export async function encodeLink(state) {
  const json = JSON.stringify(state);
  const plain = PLAIN_MARK + encodeURIComponent(json);
  if (plain.length <= PACK_BEYOND || !canPack()) return plain;
  const packed = PACKED_MARK + toBase64url(await through(new TextEncoder().encode(json), new CompressionStream(PACKING)));
  return packed.length < plain.length ? packed : plain;
}

/** Does this hash claim to carry a state (either form)? */
export function isStateLink(hash) {
  return typeof hash === 'string' && (hash.startsWith(PLAIN_MARK) || hash.startsWith(PACKED_MARK));
}

/** What a hash carries: {kind: 'none'} (not a state link), {kind: 'ok', raw} (the parsed JSON
 *  object, not yet checked field by field) or {kind: 'bad', reason} (cut, garbled or unreadable). */
export async function decodeLink(hash) {
  if (!isStateLink(hash)) return { kind: 'none' };
  const body = hash.slice(PLAIN_MARK.length);
  let json;
  try {
    if (hash.startsWith(PLAIN_MARK)) json = decodeURIComponent(body);
    else {
      if (!canPack()) return { kind: 'bad', reason: 'this browser cannot unpack a packed link (it has no DecompressionStream)' };
      json = new TextDecoder('utf-8', { fatal: true }).decode(await through(fromBase64url(body), new DecompressionStream(PACKING)));
    }
  } catch (e) {
    return { kind: 'bad', reason: hash.startsWith(PLAIN_MARK) ? 'its text is not validly percent-encoded' : 'its packed data is cut or garbled' };
  }
  let raw;
  try { raw = JSON.parse(json); } catch (e) { return { kind: 'bad', reason: 'its contents are cut or garbled (not a complete state)' }; }
  if (!raw || typeof raw !== 'object' || Array.isArray(raw) || typeof raw.f !== 'string') {
    return { kind: 'bad', reason: 'it does not hold a page state (no function f)' };
  }
  return { kind: 'ok', raw };
}
