//! Base64 encoding and decoding with the standard alphabet and `=` padding.
//!
//! Method: S. Josefsson, "The Base16, Base32, and Base64 Data Encodings",
//! RFC 4648 (2006), section 4. Used to hand PNG images to the page as
//! `data:` URLs.
//!
//! ```
//! use residuary::plot::base64::{decode, encode};
//! // Test vectors of RFC 4648 §10: "foobar" ↔ "Zm9vYmFy", "fo" ↔ "Zm8=".
//! assert_eq!(encode(b"foobar"), "Zm9vYmFy");
//! assert_eq!(encode(b"fo"), "Zm8=");
//! assert_eq!(decode("Zm8=").unwrap(), b"fo");
//! ```

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

#[cfg(test)]
mod tests {
    use super::*;
    use crate::reference::assert_close;
    use crate::C;

    /// Slow reference: RFC 4648 §4 read literally, one bit at a time — each
    /// character's alphabet position gives 6 bits (most significant first),
    /// the bits are concatenated, and every complete run of 8 is a byte;
    /// `=` contributes no bits and the leftover (< 8) bits are dropped.
    fn slow_decode(text: &str) -> Vec<u8> {
        let mut bits: Vec<u8> = Vec::new();
        for c in text.chars().filter(|&c| c != '=') {
            let v = ALPHABET.iter().position(|&a| a as char == c).expect("alphabet character");
            for k in (0..6).rev() {
                bits.push(((v >> k) & 1) as u8);
            }
        }
        bits.chunks_exact(8)
            .map(|b| b.iter().fold(0u8, |acc, &bit| (acc << 1) | bit))
            .collect()
    }

    /// Slow reference for the encoder: the bits of the data, padded with zero
    /// bits to a multiple of 6, each 6 looked up in the alphabet, then `=` up
    /// to a multiple of 4 characters (RFC 4648 §4).
    fn slow_encode(data: &[u8]) -> String {
        let mut bits: Vec<u8> = Vec::new();
        for &byte in data {
            for k in (0..8).rev() {
                bits.push((byte >> k) & 1);
            }
        }
        while bits.len() % 6 != 0 {
            bits.push(0);
        }
        let mut out: String = bits
            .chunks(6)
            .map(|b| ALPHABET[b.iter().fold(0usize, |acc, &bit| (acc << 1) | bit as usize)] as char)
            .collect();
        while out.len() % 4 != 0 {
            out.push('=');
        }
        out
    }

    /// Byte strings of every length 0..=40 with all residues mod 3 and every
    /// byte value somewhere (invented data: a fixed linear congruential sequence).
    fn samples() -> Vec<Vec<u8>> {
        let mut x: u32 = 12345;
        let mut all: Vec<Vec<u8>> = (0..=40)
            .map(|n| {
                (0..n)
                    .map(|_| {
                        x = x.wrapping_mul(1_103_515_245).wrapping_add(12345);
                        (x >> 16) as u8
                    })
                    .collect()
            })
            .collect();
        all.push((0..=255).collect());
        all
    }

    #[test]
    fn encode_and_decode_match_the_bit_by_bit_reference() {
        for data in samples() {
            let text = encode(&data);
            assert_eq!(text, slow_encode(&data), "encode of {} bytes", data.len());
            let back = decode(&text).unwrap();
            let want = slow_decode(&text);
            // Exact comparison, byte by byte, through the shared harness (rel 0).
            assert_eq!(back.len(), want.len(), "decoded length of {text:?}");
            for (k, (g, w)) in back.iter().zip(&want).enumerate() {
                let what = format!("byte {k} of {text:?}");
                assert_close(C::new(f64::from(*g), 0.0), C::new(f64::from(*w), 0.0), 0.0, &what);
            }
        }
    }

    #[test]
    fn strict_decoder_refuses_what_rfc_4648_forbids() {
        // RFC 4648 §3.3 (characters outside the alphabet), §3.5 (canonical
        // padding bits), §4 (length a multiple of 4, padding only at the end).
        assert!(decode("Zm9").is_err());
        assert!(decode("Zm9*").is_err());
        assert!(decode("Zg==Zm8=").is_err());
        assert!(decode("Zh==").is_err());
    }
}
