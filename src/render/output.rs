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
        raster::check_raster_size(&scenes[0], dpi)?;
    }
    atomic_file::check_target(path, force)?;
    Ok(format)
}

/// Writes `scenes` to `path` in the format its extension names. PNG and
/// SVG take exactly one scene; PDF writes one page per scene. Raster
/// output uses `dpi` dots per inch.
///
/// # Allocations
/// A PNG goes to the file as it is compressed, the bytes of
/// [`png_bytes`]: its memory does not grow with the page but is bounded
/// by [`PNG_PIPELINE_BYTES`] (plus the scene and its stars in pixels).
///
/// # Guarantees
/// The file is written atomically; on any error nothing is left behind
/// and an existing file is kept unless `force`.
pub fn write_scenes(scenes: &[Scene], path: &Path, dpi: f32, force: bool) -> Result<()> {
    match check_output(scenes, path, dpi, force)? {
        Format::Png => {
            let bands = raster::BandRaster::new(&scenes[0], dpi)?;
            atomic_file::write_atomic(path, force, |file| {
                write_png(&bands, dpi, file, |file| {
                    use std::io::Seek;
                    file.rewind()?;
                    file.get_mut().set_len(0)
                })
            })
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

/// Draws `scene` at `dpi` and encodes it as PNG bytes: 8-bit RGB when
/// every pixel is opaque (RGBA, straight alpha, otherwise), the
/// resolution in pHYs, fast compression. [`write_scenes`] writes the same
/// bytes straight to a file.
///
/// # Speed
/// The page is never held whole: each band of [`raster::BAND_ROWS`] rows
/// is drawn into a per-thread scratch buffer, turned into filtered
/// scanlines while still in the cache, and handed to one compressor
/// thread that deflates the bands in page order as they arrive, so
/// compression overlaps drawing.
///
/// # Allocations
/// The PNG bytes, plus about [`PNG_PIPELINE_BYTES`] of bands in flight at
/// most (see [`write_scenes`]).
///
/// # Guarantees
/// Same bytes whatever `RAYON_NUM_THREADS` is: a band's pixels and
/// filtered rows depend only on its index, and the stream takes the bands
/// in page order.
pub fn png_bytes(scene: &Scene, dpi: f32) -> Result<Vec<u8>> {
    let bands = raster::BandRaster::new(scene, dpi)?;
    let mut out = Vec::new();
    write_png(&bands, dpi, &mut out, |out| {
        out.clear();
        Ok(())
    })
    .map_err(|e| Error::Write {
        path: "PNG data".into(),
        message: e.to_string(),
    })?;
    Ok(out)
}

/// Memory the PNG pipeline plans to fill with bands in flight, bytes:
/// each drawing thread's RGBA scratch band and two filtered bands per
/// thread, drawn ahead or waiting for the compressor (plus the one being
/// compressed). Fewer threads draw
/// when a band is so wide that all of them would need more (A0 landscape
/// at 2400 dpi: 57.5 MB of RGBA and 43.1 MB of filtered rows a band, so
/// three threads at most); the output does not depend on the number of
/// threads.
pub const PNG_PIPELINE_BYTES: usize = 512 << 20;

/// How many of `threads` draw bands `width` pixels wide for a PNG of
/// `per_px` bytes a pixel, so that their bands fit in
/// [`PNG_PIPELINE_BYTES`]; at least one.
fn pipeline_threads(width: usize, per_px: usize, threads: usize) -> usize {
    let rows = raster::BAND_ROWS as usize;
    let band_rgba = rows * width * 4;
    let band_filtered = rows * (per_px * width + 1);
    (PNG_PIPELINE_BYTES / (band_rgba + 2 * band_filtered)).clamp(1, threads.max(1))
}

/// What each pixel of a streamed PNG holds.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Channels {
    /// RGB, for a page whose every pixel is opaque.
    Rgb,
    /// RGBA with straight alpha.
    Rgba,
}

/// Writes the PNG of `bands` at `dpi` into `out`, band by band. The
/// colour type is guessed from the page background; when the pixels
/// prove it wrong (a transparent pixel on an opaque page, or no
/// transparent pixel on a transparent one), `rewind` empties `out` and
/// the page is written again with the other one.
fn write_png<W, F>(
    bands: &raster::BandRaster<'_>,
    dpi: f32,
    out: &mut W,
    mut rewind: F,
) -> std::io::Result<()>
where
    W: Write + Send,
    F: FnMut(&mut W) -> std::io::Result<()>,
{
    let mut channels = if bands.background_opaque() {
        Channels::Rgb
    } else {
        Channels::Rgba
    };
    for _ in 0..2 {
        if stream_png(bands, channels, dpi, out)? {
            return Ok(());
        }
        rewind(out)?;
        channels = match channels {
            Channels::Rgb => Channels::Rgba,
            Channels::Rgba => Channels::Rgb,
        };
    }
    // The second colour type always fits: the first one's pass saw the
    // pixels that decide it.
    Err(std::io::Error::other("the PNG colour type did not settle"))
}

/// How far the drawing threads may run ahead of the compressor: the
/// count of bands it has written, and whether the page was abandoned.
struct Gate {
    state: std::sync::Mutex<(usize, bool)>,
    moved: std::sync::Condvar,
}

impl Gate {
    /// Waits until band `band` is fewer than `window` bands ahead of the
    /// compressor; false when the page was abandoned meanwhile.
    fn wait_for_room(&self, band: usize, window: usize) -> bool {
        let mut state = self.state.lock().expect("the PNG gate");
        while !state.1 && band >= state.0 + window {
            state = self.moved.wait(state).expect("the PNG gate");
        }
        !state.1
    }

    fn written(&self, bands: usize) {
        self.state.lock().expect("the PNG gate").0 = bands;
        self.moved.notify_all();
    }

    fn abandon(&self) {
        self.state.lock().expect("the PNG gate").1 = true;
        self.moved.notify_all();
    }
}

/// Abandons the page when dropped, so that no drawing thread waits for a
/// compressor that stopped (finished, failed or panicked).
struct AbandonOnDrop<'a>(&'a Gate);

impl Drop for AbandonOnDrop<'_> {
    fn drop(&mut self) {
        self.0.abandon();
    }
}

/// Draws every band, filters its rows as `channels` and deflates them in
/// page order into a whole PNG in `out`. Returns false, with `out` holding
/// an unfinished file, when the pixels need the other colour type.
///
/// Threads take bands in page order and wait while they are more than a
/// window of bands ahead of the compressor, so at most a window of
/// filtered bands is ever in memory (the compressor can only wait for a
/// band that a thread is drawing, never for one that waits).
fn stream_png<W: Write + Send>(
    bands: &raster::BandRaster<'_>,
    channels: Channels,
    dpi: f32,
    out: &mut W,
) -> std::io::Result<bool> {
    use std::sync::atomic::{AtomicBool, AtomicUsize, Ordering};
    let n = bands.bands();
    let w = bands.width() as usize;
    let per_px = match channels {
        Channels::Rgb => 3,
        Channels::Rgba => 4,
    };
    let stride = per_px * w + 1;
    let workers = pipeline_threads(w, per_px, rayon::current_num_threads().min(n));
    let window = 2 * workers;
    let next = AtomicUsize::new(0);
    // A pixel that does not fit `channels`: transparent on an RGB page;
    // on an RGBA page, any pixel at all that is not opaque.
    let misfit = AtomicBool::new(false);
    let seen_transparent = AtomicBool::new(false);
    let gate = Gate {
        state: std::sync::Mutex::new((0, false)),
        moved: std::sync::Condvar::new(),
    };
    // Filtered bands the compressor is done with, for the threads to fill
    // again: a wide band is tens of megabytes, and a fresh one each time
    // cost as much system time in page faults as all the drawing.
    let spare = std::sync::Mutex::new(Vec::<Vec<u8>>::new());
    let (tx, rx) = std::sync::mpsc::channel::<(usize, Vec<u8>)>();
    std::thread::scope(|s| {
        let (gate, spare) = (&gate, &spare);
        let deflater = s.spawn(move || -> std::io::Result<bool> {
            let _abandon = AbandonOnDrop(gate);
            let color = match channels {
                Channels::Rgb => png::ColorType::Rgb,
                Channels::Rgba => png::ColorType::Rgba,
            };
            let png = png_header(out, bands.width(), bands.height(), color, dpi)?;
            let idat = IdatChunks {
                png,
                pending: Vec::with_capacity(IDAT_BYTES),
            };
            let mut z = fdeflate::Compressor::new(idat)?;
            let mut pending = std::collections::BTreeMap::new();
            let mut want = 0;
            for (k, rows) in rx {
                pending.insert(k, rows);
                while let Some(rows) = pending.remove(&want) {
                    z.write_data(&rows)?;
                    want += 1;
                    gate.written(want);
                    spare.lock().expect("the spare PNG bands").push(rows);
                }
            }
            if want < n {
                return Ok(false);
            }
            z.finish()?.finish()?;
            Ok(true)
        });
        rayon::scope(|sc| {
            for _ in 0..workers {
                let tx = tx.clone();
                let (next, misfit, seen_transparent) = (&next, &misfit, &seen_transparent);
                sc.spawn(move |_| {
                    let mut rgba = Vec::new();
                    loop {
                        let k = next.fetch_add(1, Ordering::Relaxed);
                        if k >= n || !gate.wait_for_room(k, window) {
                            break;
                        }
                        let rows = bands.band_rows(k) as usize;
                        rgba.resize(rows * w * 4, 0);
                        bands.draw_into(k, &mut rgba);
                        // Every byte is written below.
                        let mut filtered = spare
                            .lock()
                            .expect("the spare PNG bands")
                            .pop()
                            .unwrap_or_default();
                        filtered.resize(rows * stride, 0);
                        match channels {
                            Channels::Rgb => {
                                if !filter_rgb_rows(&rgba, w, &mut filtered) {
                                    misfit.store(true, Ordering::Relaxed);
                                    gate.abandon();
                                    break;
                                }
                            }
                            Channels::Rgba => {
                                if !rgba.chunks_exact(4).all(|p| p[3] == 255) {
                                    seen_transparent.store(true, Ordering::Relaxed);
                                }
                                unpremultiply(&mut rgba);
                                filter_rgba_rows(&rgba, w, &mut filtered);
                            }
                        }
                        if tx.send((k, filtered)).is_err() {
                            break;
                        }
                    }
                });
            }
        });
        drop(tx);
        let finished = deflater.join().expect("the PNG compressor thread")?;
        if channels == Channels::Rgba && !seen_transparent.load(Ordering::Relaxed) {
            return Ok(false);
        }
        Ok(finished && !misfit.load(Ordering::Relaxed))
    })
}

/// A writer that cuts the zlib stream into IDAT chunks of [`IDAT_BYTES`]
/// (the last one shorter) as it arrives.
struct IdatChunks<W: Write> {
    png: png::Writer<W>,
    pending: Vec<u8>,
}

impl<W: Write> IdatChunks<W> {
    /// Writes the last chunk and IEND.
    fn finish(mut self) -> std::io::Result<()> {
        if !self.pending.is_empty() {
            self.png.write_chunk(png::chunk::IDAT, &self.pending)?;
        }
        self.png.finish()?;
        Ok(())
    }
}

impl<W: Write> Write for IdatChunks<W> {
    fn write(&mut self, mut data: &[u8]) -> std::io::Result<usize> {
        let n = data.len();
        while !data.is_empty() {
            let take = (IDAT_BYTES - self.pending.len()).min(data.len());
            self.pending.extend_from_slice(&data[..take]);
            data = &data[take..];
            if self.pending.len() == IDAT_BYTES {
                self.png.write_chunk(png::chunk::IDAT, &self.pending)?;
                self.pending.clear();
            }
        }
        Ok(n)
    }

    fn flush(&mut self) -> std::io::Result<()> {
        Ok(())
    }
}

/// Premultiplied RGBA pixels to straight alpha, in place.
fn unpremultiply(rgba: &mut [u8]) {
    for p in rgba.chunks_exact_mut(4) {
        let a = u32::from(p[3]);
        if a != 0 && a != 255 {
            for v in &mut p[..3] {
                *v = ((u32::from(*v) * 255 + a / 2) / a).min(255) as u8;
            }
        }
    }
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

/// Writes the PNG signature, IHDR and pHYs into `w` and returns the
/// writer for the IDAT chunks.
fn png_header<W: Write>(
    w: W,
    width: u32,
    height: u32,
    color: png::ColorType,
    dpi: f32,
) -> std::result::Result<png::Writer<W>, png::EncodingError> {
    let mut enc = png::Encoder::new(w, width, height);
    enc.set_color(color);
    enc.set_depth(png::BitDepth::Eight);
    let ppm = pixels_per_metre(dpi);
    enc.set_pixel_dims(Some(png::PixelDimensions {
        xppu: ppm,
        yppu: ppm,
        unit: png::Unit::Meter,
    }));
    enc.write_header()
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
    let mut wr = png_header(w, width, height, color, dpi)?;
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
                unpremultiply(&mut straight);
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

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn wide_bands_are_drawn_by_fewer_threads() {
        // A4 at 300 dpi (3508 px): 1.8 MB of RGBA and 1.3 MB of RGB rows a
        // band, so every thread of a big machine draws.
        assert_eq!(pipeline_threads(3508, 3, 64), 64);
        assert_eq!(pipeline_threads(3508, 3, 1), 1);
        // A0 landscape at 2400 dpi (112 346 px): 57.5 + 2 × 43.1 MB a
        // thread, three threads in 512 MiB.
        assert_eq!(pipeline_threads(112_346, 3, 64), 3);
        assert_eq!(pipeline_threads(112_346, 3, 2), 2);
        // Never none, however wide.
        assert_eq!(pipeline_threads(1 << 24, 4, 8), 1);
    }
}
