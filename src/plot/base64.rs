//! Base64 encoding and decoding with the standard alphabet and `=` padding.
//!
//! Method: S. Josefsson, "The Base16, Base32, and Base64 Data Encodings",
//! RFC 4648 (2006), section 4. Used to hand PNG images to the page as
//! `data:` URLs.

use crate::error::Failure;

const ALPHABET: &[u8; 64] = b"ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";

/// Encodes bytes as padded base64 (RFC 4648 §4).
pub fn encode(data: &[u8]) -> String {
    let mut out = String::with_capacity(data.len().div_ceil(3) * 4);
    for chunk in data.chunks(3) {
        let b = [
            chunk[0],
            *chunk.get(1).unwrap_or(&0),
            *chunk.get(2).unwrap_or(&0),
        ];
        let n = (u32::from(b[0]) << 16) | (u32::from(b[1]) << 8) | u32::from(b[2]);
        for k in 0..4 {
            if k <= chunk.len() {
                out.push(ALPHABET[((n >> (18 - 6 * k)) & 63) as usize] as char);
            } else {
                out.push('=');
            }
        }
    }
    out
}

fn value(c: u8) -> Option<u32> {
    match c {
        b'A'..=b'Z' => Some(u32::from(c - b'A')),
        b'a'..=b'z' => Some(u32::from(c - b'a') + 26),
        b'0'..=b'9' => Some(u32::from(c - b'0') + 52),
        b'+' => Some(62),
        b'/' => Some(63),
        _ => None,
    }
}

/// Decodes padded base64 (RFC 4648 §4). Strict: length must be a multiple
/// of 4, only the standard alphabet, `=` only as final padding, and unused
/// padding bits must be zero (RFC 4648 §3.5).
pub fn decode(text: &str) -> Result<Vec<u8>, Failure> {
    let s = text.as_bytes();
    if !s.len().is_multiple_of(4) {
        return Err(Failure::invalid(format!(
            "base64 text has length {}, which is not a multiple of 4; check it was copied whole",
            s.len()
        )));
    }
    let mut out = Vec::with_capacity(s.len() / 4 * 3);
    let groups = s.len() / 4;
    for (g, quad) in s.chunks(4).enumerate() {
        let pad = quad.iter().rev().take_while(|&&c| c == b'=').count();
        if pad > 2 || (pad > 0 && g + 1 != groups) {
            return Err(Failure::invalid(format!("misplaced '=' padding in base64 group {}", g + 1)));
        }
        let mut n = 0u32;
        for (k, &c) in quad.iter().enumerate() {
            let v = if k >= 4 - pad {
                0
            } else {
                value(c).ok_or_else(|| {
                    Failure::invalid(format!(
                        "invalid base64 character {:?} at position {}",
                        c as char,
                        g * 4 + k
                    ))
                })?
            };
            n = (n << 6) | v;
        }
        let bytes = [(n >> 16) as u8, (n >> 8) as u8, n as u8];
        let keep = 3 - pad;
        if bytes[keep..].iter().any(|&b| b != 0) {
            return Err(Failure::invalid("base64 text has nonzero padding bits (non-canonical encoding)"));
        }
        out.extend_from_slice(&bytes[..keep]);
    }
    Ok(out)
}
