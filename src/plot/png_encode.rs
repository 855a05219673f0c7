//! PNG encoding of an RGBA8 image.
//!
//! Method: the PNG format (W3C Recommendation "Portable Network Graphics
//! (PNG) Specification", second edition, 2003; zlib/deflate per RFC 1950/1951),
//! written with the `png` crate (0.17).

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
