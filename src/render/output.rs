//! Writing scenes to files: the format follows the extension (`.png`
//! with its DPI in the pHYs chunk, `.svg` with its page size in mm,
//! `.pdf` with one page per scene).

use crate::atomic_file;
use crate::error::{Error, Result};
use crate::render::raster;
use crate::render::scene::Scene;
use rayon::prelude::*;
use std::io::Write;
use std::path::Path;

/// The file formats [`write_scenes`] knows, by extension.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Format {
    /// PNG raster with its resolution in the pHYs chunk.
    Png,
    /// SVG vector drawing, page size in millimetres.
    Svg,
    /// PDF vector document, one page per scene.
    Pdf,
}

/// Allowed extensions, for error messages.
pub const ALLOWED_EXTENSIONS: &str = ".png, .svg or .pdf";

impl Format {
    /// The format named by `path`'s extension (case-insensitive).
    pub fn from_path(path: &Path) -> Result<Format> {
        let ext = path
            .extension()
            .map(|e| e.to_string_lossy().to_ascii_lowercase());
        match ext.as_deref() {
            Some("png") => Ok(Format::Png),
            Some("svg") => Ok(Format::Svg),
            Some("pdf") => Ok(Format::Pdf),
            _ => Err(Error::invalid(
                "the output file",
                path.display(),
                format!("its name must end in {ALLOWED_EXTENSIONS}"),
            )),
        }
    }
}

/// Lowest and highest resolution accepted, dots per inch.
pub const DPI_RANGE: (f32, f32) = (10.0, 2400.0);

/// Checks a resolution typed for `option`: 10–2400 dpi.
pub fn check_dpi(option: &str, dpi: f32) -> Result<()> {
    if !(DPI_RANGE.0..=DPI_RANGE.1).contains(&dpi) {
        return Err(Error::invalid(
            option,
            dpi,
            "it must be a resolution from 10 to 2400 dots per inch",
        ));
    }
    Ok(())
}

/// Parses `--dpi` as typed: a number within [`DPI_RANGE`].
pub fn parse_dpi(text: &str) -> Result<f32> {
    let bad = || {
        Error::invalid(
            "--dpi",
            text,
            "it must be a number of dots per inch from 10 to 2400",
        )
    };
    let v: f32 = text.trim().parse().map_err(|_| bad())?;
    if !(DPI_RANGE.0..=DPI_RANGE.1).contains(&v) {
        return Err(bad());
    }
    Ok(v)
}

/// Checks everything [`write_scenes`] would refuse (extension, scene
/// count, resolution, raster size, target folder and an existing file)
/// without drawing anything.
pub fn check_output(scenes: &[Scene], path: &Path, dpi: f32, force: bool) -> Result<Format> {
    let format = Format::from_path(path)?;
    if scenes.is_empty() {
        return Err(Error::Usage(format!(
            "there is nothing to draw into {}",
            path.display()
        )));
    }
    if format != Format::Pdf && scenes.len() > 1 {
        return Err(Error::Usage(format!(
            "{} can hold one page but {} were drawn; write a .pdf or one file per sheet",
            path.display(),
            scenes.len()
        )));
    }
    if format == Format::Png {
        check_dpi("--dpi", dpi)?;
        let (w, h) = raster::raster_size_px(&scenes[0], dpi);
        raster::check_raster_size(w, h, dpi)?;
    }
    atomic_file::check_target(path, force)?;
    Ok(format)
}

/// Writes `scenes` to `path` in the format its extension names. PNG and
/// SVG take exactly one scene; PDF writes one page per scene. Raster
/// output uses `dpi` dots per inch.
///
/// # Guarantees
/// The file is written atomically; on any error nothing is left behind
/// and an existing file is kept unless `force`.
pub fn write_scenes(scenes: &[Scene], path: &Path, dpi: f32, force: bool) -> Result<()> {
    match check_output(scenes, path, dpi, force)? {
        Format::Png => {
            let bytes = png_bytes(&scenes[0], dpi)?;
            atomic_file::write_bytes(path, force, &bytes)
        }
        Format::Svg => {
            let text = crate::render::svg::svg_string(&scenes[0]);
            atomic_file::write_bytes(path, force, text.as_bytes())
        }
        Format::Pdf => {
            let bytes = crate::render::pdf::pdf_bytes(scenes);
            atomic_file::write_bytes(path, force, &bytes)
        }
    }
}

/// Pixels per metre for a resolution in dots per inch (1 in = 0.0254 m),
/// the unit of the PNG pHYs chunk.
pub fn pixels_per_metre(dpi: f32) -> u32 {
    (f64::from(dpi) / 0.0254).round() as u32
}

/// Draws `scene` at `dpi` and encodes it as PNG bytes: 8-bit RGB when the
/// background is opaque (RGBA otherwise), the resolution in pHYs, fast
/// compression.
pub fn png_bytes(scene: &Scene, dpi: f32) -> Result<Vec<u8>> {
    let pixmap = raster::rasterise(scene, dpi)?;
    let mut out = Vec::with_capacity(pixmap.data().len() / 4);
    encode_png(&pixmap, dpi, &mut out).map_err(|e| Error::Write {
        path: "PNG data".into(),
        message: e.to_string(),
    })?;
    Ok(out)
}

/// Encodes a premultiplied pixmap as PNG into `w`.
pub fn encode_png<W: Write>(
    pixmap: &tiny_skia::Pixmap,
    dpi: f32,
    w: W,
) -> std::result::Result<(), png::EncodingError> {
    let data = pixmap.data();
    let opaque = data
        .par_chunks(4 * 4096)
        .all(|c| c.chunks_exact(4).all(|p| p[3] == 255));
    let (color, bytes): (png::ColorType, Vec<u8>) = if opaque {
        let mut rgb = vec![0u8; data.len() / 4 * 3];
        rgb.par_chunks_mut(3 * 4096)
            .zip(data.par_chunks(4 * 4096))
            .for_each(|(d, s)| {
                for (d, s) in d.chunks_exact_mut(3).zip(s.chunks_exact(4)) {
                    d.copy_from_slice(&s[..3]);
                }
            });
        (png::ColorType::Rgb, rgb)
    } else {
        let mut rgba = data.to_vec();
        rgba.par_chunks_mut(4 * 4096).for_each(|c| {
            for p in c.chunks_exact_mut(4) {
                let a = u32::from(p[3]);
                if a != 0 && a != 255 {
                    for v in &mut p[..3] {
                        *v = ((u32::from(*v) * 255 + a / 2) / a).min(255) as u8;
                    }
                }
            }
        });
        (png::ColorType::Rgba, rgba)
    };
    let mut enc = png::Encoder::new(w, pixmap.width(), pixmap.height());
    enc.set_color(color);
    enc.set_depth(png::BitDepth::Eight);
    enc.set_compression(png::Compression::Fast);
    let ppm = pixels_per_metre(dpi);
    enc.set_pixel_dims(Some(png::PixelDimensions {
        xppu: ppm,
        yppu: ppm,
        unit: png::Unit::Meter,
    }));
    let mut wr = enc.write_header()?;
    wr.write_image_data(&bytes)?;
    wr.finish()
}
