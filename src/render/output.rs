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
    /// The format named by `path`'s extension (case-insensitive); an
    /// error names `option`, the option that gave the path (`--hr`).
    pub fn from_path(path: &Path, option: &str) -> Result<Format> {
        let ext = path
            .extension()
            .map(|e| e.to_string_lossy().to_ascii_lowercase());
        match ext.as_deref() {
            Some("png") => Ok(Format::Png),
            Some("svg") => Ok(Format::Svg),
            Some("pdf") => Ok(Format::Pdf),
            _ => Err(Error::invalid(
                option,
                path.display(),
                format!("it must end in {ALLOWED_EXTENSIONS}"),
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
    // Commands check their own options first; this names the file only.
    let format = Format::from_path(path, "the output file")?;
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
///
/// # Speed
/// An opaque page is never held whole as RGBA: each band of
/// [`raster::BAND_ROWS`] rows is drawn into a per-thread scratch buffer,
/// turned into filtered RGB scanlines while still in the cache, and
/// handed to one compressor thread that deflates the bands in page
/// order as they arrive, so compression overlaps drawing.
///
/// # Guarantees
/// Same bytes whatever `RAYON_NUM_THREADS` is: a band's pixels and
/// filtered rows depend only on its index, and the stream takes the bands
/// in page order.
pub fn png_bytes(scene: &Scene, dpi: f32) -> Result<Vec<u8>> {
    let bands = raster::BandRaster::new(scene, dpi)?;
    let png_err = |e: png::EncodingError| Error::Write {
        path: "PNG data".into(),
        message: e.to_string(),
    };
    if scene.background.a == 255
        && let Some(zlib) = opaque_zlib(&bands).map_err(|e| png_err(e.into()))?
    {
        let mut out = Vec::with_capacity(zlib.len() + 1024);
        write_chunks(
            &mut out,
            bands.width(),
            bands.height(),
            png::ColorType::Rgb,
            dpi,
            &zlib,
        )
        .map_err(png_err)?;
        return Ok(out);
    }
    let pixmap = raster::rasterise(scene, dpi)?;
    let mut out = Vec::with_capacity(pixmap.data().len() / 4);
    encode_png(&pixmap, dpi, &mut out).map_err(png_err)?;
    Ok(out)
}

/// Draws every band of an opaque page and deflates its filtered RGB rows
/// into one zlib stream; `None` if some pixel turned out not opaque.
fn opaque_zlib(bands: &raster::BandRaster<'_>) -> std::io::Result<Option<Vec<u8>>> {
    use std::sync::atomic::{AtomicBool, AtomicUsize, Ordering};
    let n = bands.bands();
    let w = bands.width() as usize;
    let stride = 3 * w + 1;
    let next = AtomicUsize::new(0);
    let transparent = AtomicBool::new(false);
    let (tx, rx) = std::sync::mpsc::channel::<(usize, Vec<u8>)>();
    std::thread::scope(|s| {
        let deflater = s.spawn(move || -> std::io::Result<Option<Vec<u8>>> {
            let size_guess = stride * bands.height() as usize / 6;
            let mut z = fdeflate::Compressor::new(Vec::with_capacity(size_guess))?;
            let mut pending = std::collections::BTreeMap::new();
            let mut want = 0;
            for (k, rows) in rx {
                pending.insert(k, rows);
                while let Some(rows) = pending.remove(&want) {
                    z.write_data(&rows)?;
                    want += 1;
                }
            }
            Ok((want == n).then_some(z.finish()?))
        });
        // Workers take bands in page order, so the compressor rarely waits.
        rayon::scope(|sc| {
            for _ in 0..rayon::current_num_threads().min(n) {
                let tx = tx.clone();
                let (next, transparent) = (&next, &transparent);
                sc.spawn(move |_| {
                    let mut rgba = Vec::new();
                    loop {
                        let k = next.fetch_add(1, Ordering::Relaxed);
                        if k >= n || transparent.load(Ordering::Relaxed) {
                            break;
                        }
                        let rows = bands.band_rows(k) as usize;
                        rgba.resize(rows * w * 4, 0);
                        bands.draw_into(k, &mut rgba);
                        let mut out = vec![0u8; rows * stride];
                        if !filter_rgb_rows(&rgba, w, &mut out) {
                            transparent.store(true, Ordering::Relaxed);
                            break;
                        }
                        if tx.send((k, out)).is_err() {
                            break;
                        }
                    }
                });
            }
        });
        drop(tx);
        let zlib = deflater.join().expect("the PNG compressor thread")?;
        Ok(zlib.filter(|_| !transparent.load(Ordering::Relaxed)))
    })
}

/// Turns premultiplied RGBA rows of `width` pixels into PNG scanlines of
/// RGB (each a filter byte then the filtered bytes) in `out`: the first
/// row with the Sub filter (it needs no row above, so bands are
/// independent), the others with Up. Returns false, leaving `out`
/// unspecified, when a pixel is not opaque.
fn filter_rgb_rows(rgba: &[u8], width: usize, out: &mut [u8]) -> bool {
    let (src_stride, dst_stride) = (4 * width, 3 * width + 1);
    let mut alpha = 255u8;
    for (r, (src, dst)) in rgba
        .chunks_exact(src_stride)
        .zip(out.chunks_exact_mut(dst_stride))
        .enumerate()
    {
        let (tag, dst) = dst.split_first_mut().expect("a scanline");
        if r == 0 {
            *tag = 1;
            let mut left = [0u8; 3];
            for (d, s) in dst.chunks_exact_mut(3).zip(src.chunks_exact(4)) {
                d[0] = s[0].wrapping_sub(left[0]);
                d[1] = s[1].wrapping_sub(left[1]);
                d[2] = s[2].wrapping_sub(left[2]);
                left = [s[0], s[1], s[2]];
                alpha &= s[3];
            }
        } else {
            *tag = 2;
            let up = &rgba[(r - 1) * src_stride..r * src_stride];
            for ((d, s), u) in dst
                .chunks_exact_mut(3)
                .zip(src.chunks_exact(4))
                .zip(up.chunks_exact(4))
            {
                d[0] = s[0].wrapping_sub(u[0]);
                d[1] = s[1].wrapping_sub(u[1]);
                d[2] = s[2].wrapping_sub(u[2]);
                alpha &= s[3];
            }
        }
    }
    alpha == 255
}

/// Turns straight-alpha RGBA rows into PNG scanlines, Sub filter on the
/// first row and Up on the others (as [`filter_rgb_rows`]).
fn filter_rgba_rows(rgba: &[u8], width: usize, out: &mut [u8]) {
    let (src_stride, dst_stride) = (4 * width, 4 * width + 1);
    for (r, (src, dst)) in rgba
        .chunks_exact(src_stride)
        .zip(out.chunks_exact_mut(dst_stride))
        .enumerate()
    {
        let (tag, dst) = dst.split_first_mut().expect("a scanline");
        if r == 0 {
            *tag = 1;
            for i in 0..src_stride {
                dst[i] = src[i].wrapping_sub(if i >= 4 { src[i - 4] } else { 0 });
            }
        } else {
            *tag = 2;
            let up = &rgba[(r - 1) * src_stride..r * src_stride];
            for i in 0..src_stride {
                dst[i] = src[i].wrapping_sub(up[i]);
            }
        }
    }
}

/// Writes the PNG signature, IHDR, pHYs, the zlib stream `zlib` of the
/// filtered scanlines as IDAT chunks, and IEND.
fn write_chunks<W: Write>(
    w: W,
    width: u32,
    height: u32,
    color: png::ColorType,
    dpi: f32,
    zlib: &[u8],
) -> std::result::Result<(), png::EncodingError> {
    let mut enc = png::Encoder::new(w, width, height);
    enc.set_color(color);
    enc.set_depth(png::BitDepth::Eight);
    let ppm = pixels_per_metre(dpi);
    enc.set_pixel_dims(Some(png::PixelDimensions {
        xppu: ppm,
        yppu: ppm,
        unit: png::Unit::Meter,
    }));
    let mut wr = enc.write_header()?;
    for chunk in zlib.chunks(IDAT_BYTES) {
        wr.write_chunk(png::chunk::IDAT, chunk)?;
    }
    wr.finish()
}

/// Largest IDAT chunk written, bytes.
const IDAT_BYTES: usize = 1 << 20;

/// Encodes a premultiplied pixmap as PNG into `w`: RGB when every pixel
/// is opaque, else RGBA (straight alpha); rows filtered in parallel bands
/// of [`raster::BAND_ROWS`] (Sub for a band's first row, Up for the
/// rest), one fast deflate stream, the resolution in pHYs. The bytes are
/// the same as [`png_bytes`] gives for an opaque page.
pub fn encode_png<W: Write>(
    pixmap: &tiny_skia::Pixmap,
    dpi: f32,
    w: W,
) -> std::result::Result<(), png::EncodingError> {
    let data = pixmap.data();
    let width = pixmap.width() as usize;
    let band_px = width * raster::BAND_ROWS as usize;
    let opaque = data
        .par_chunks(4 * 4096)
        .all(|c| c.chunks_exact(4).all(|p| p[3] == 255));
    let (color, channels) = if opaque {
        (png::ColorType::Rgb, 3)
    } else {
        (png::ColorType::Rgba, 4)
    };
    let stride = channels * width + 1;
    let mut filtered = vec![0u8; stride * pixmap.height() as usize];
    filtered
        .par_chunks_mut(stride * raster::BAND_ROWS as usize)
        .zip(data.par_chunks(4 * band_px))
        .for_each(|(out, src)| {
            if opaque {
                filter_rgb_rows(src, width, out);
            } else {
                let mut straight = src.to_vec();
                for p in straight.chunks_exact_mut(4) {
                    let a = u32::from(p[3]);
                    if a != 0 && a != 255 {
                        for v in &mut p[..3] {
                            *v = ((u32::from(*v) * 255 + a / 2) / a).min(255) as u8;
                        }
                    }
                }
                filter_rgba_rows(&straight, width, out);
            }
        });
    let mut z = fdeflate::Compressor::new(Vec::with_capacity(filtered.len() / 6))?;
    for band in filtered.chunks(stride * raster::BAND_ROWS as usize) {
        z.write_data(band)?;
    }
    let zlib = z.finish()?;
    write_chunks(w, pixmap.width(), pixmap.height(), color, dpi, &zlib)
}
