//! PNG encoding of an RGBA8 image.
//!
//! Method: the PNG format (W3C Recommendation "Portable Network Graphics
//! (PNG) Specification", second edition, 2003; zlib/deflate per RFC 1950/1951),
//! written with the `png` crate (0.17).
//!
//! ```
//! use residuary::plot::png_encode::png_data_url;
//! // Every PNG starts with the signature 89 50 4E 47 0D 0A 1A 0A (PNG
//! // specification §5.2), whose base64 (RFC 4648) begins "iVBORw0KGgo".
//! let url = png_data_url(1, 1, &[255, 0, 0, 255]).unwrap();
//! assert!(url.starts_with("data:image/png;base64,iVBORw0KGgo"));
//! ```

use super::base64;
use crate::error::Failure;

/// Encodes a `width × height` RGBA8 buffer (row 0 = top) as PNG bytes.
pub fn encode_png_rgba(width: u32, height: u32, rgba: &[u8]) -> Result<Vec<u8>, Failure> {
    if width == 0 || height == 0 {
        return Err(Failure::invalid(format!(
            "cannot encode a {width}×{height} PNG: width and height must be at least 1"
        )));
    }
    let need = u64::from(width) * u64::from(height) * 4;
    if rgba.len() as u64 != need {
        return Err(Failure::invalid(format!(
            "RGBA buffer has {} bytes but a {width}×{height} image needs {need}",
            rgba.len()
        )));
    }
    let mut bytes = Vec::new();
    {
        let mut enc = png::Encoder::new(&mut bytes, width, height);
        enc.set_color(png::ColorType::Rgba);
        enc.set_depth(png::BitDepth::Eight);
        enc.set_compression(png::Compression::Fast);
        let mut writer = enc
            .write_header()
            .map_err(|e| Failure::invalid(format!("PNG encoding failed while writing the header: {e}")))?;
        writer
            .write_image_data(rgba)
            .map_err(|e| Failure::invalid(format!("PNG encoding failed while writing pixels: {e}")))?;
        writer
            .finish()
            .map_err(|e| Failure::invalid(format!("PNG encoding failed while finishing: {e}")))?;
    }
    Ok(bytes)
}

/// Encodes as PNG and wraps it in a `data:image/png;base64,…` URL.
pub fn png_data_url(width: u32, height: u32, rgba: &[u8]) -> Result<String, Failure> {
    let png = encode_png_rgba(width, height, rgba)?;
    Ok(format!("data:image/png;base64,{}", base64::encode(&png)))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Slow reference: CRC-32 bit by bit (PNG specification, Annex D: the
    /// polynomial 0xEDB88320 reflected, initial and final XOR 0xFFFFFFFF).
    fn crc32(bytes: &[u8]) -> u32 {
        let mut c = 0xFFFF_FFFFu32;
        for &b in bytes {
            c ^= u32::from(b);
            for _ in 0..8 {
                c = if c & 1 == 1 { (c >> 1) ^ 0xEDB8_8320 } else { c >> 1 };
            }
        }
        c ^ 0xFFFF_FFFF
    }

    fn be32(b: &[u8]) -> u32 {
        u32::from_be_bytes([b[0], b[1], b[2], b[3]])
    }

    /// The file walked by hand: signature, chunks with their lengths and CRCs,
    /// IHDR fields (§11.2.2), IEND last; then the pixels read back.
    #[test]
    fn png_structure_checked_by_hand_and_pixels_read_back() {
        let (w, h) = (5u32, 3u32);
        // Invented pixels.
        let rgba: Vec<u8> = (0..w * h * 4).map(|k| (k * 37 % 251) as u8).collect();
        let png = encode_png_rgba(w, h, &rgba).unwrap();
        assert_eq!(png[..8], [0x89, b'P', b'N', b'G', 0x0D, 0x0A, 0x1A, 0x0A], "signature (§5.2)");
        let mut at = 8;
        let mut names = Vec::new();
        while at < png.len() {
            let len = be32(&png[at..]) as usize;
            let body = &png[at + 4..at + 8 + len];
            assert_eq!(be32(&png[at + 8 + len..]), crc32(body), "CRC of chunk {:?}", &body[..4]);
            if &body[..4] == b"IHDR" {
                let d = &body[4..];
                assert_eq!((be32(d), be32(&d[4..])), (w, h), "IHDR width, height");
                assert_eq!(d[8..13], [8, 6, 0, 0, 0], "bit depth 8, colour type 6 (RGBA), no interlace");
            }
            names.push(String::from_utf8_lossy(&body[..4]).to_string());
            at += 12 + len;
        }
        assert_eq!(at, png.len());
        assert_eq!(names.first().map(String::as_str), Some("IHDR"));
        assert_eq!(names.last().map(String::as_str), Some("IEND"));
        // Pixels: decoded by the png crate's reader.
        let mut reader = png::Decoder::new(&png[..]).read_info().unwrap();
        let mut buf = vec![0u8; reader.output_buffer_size()];
        let info = reader.next_frame(&mut buf).unwrap();
        assert_eq!(buf[..info.buffer_size()], rgba[..]);
        assert!(encode_png_rgba(w, h, &rgba[1..]).is_err());
    }
}
