//! Rasterising a [`Scene`] with tiny-skia: anti-aliased, at a chosen
//! resolution, in parallel horizontal bands.
//!
//! # Guarantees
//! The page is cut into bands of [`BAND_ROWS`] pixel rows, a constant
//! that does not depend on the thread count; each band is drawn on its
//! own, every item in scene order, so the pixels are the same whatever
//! `RAYON_NUM_THREADS` is.
//!
//! # Stars
//! [`Item::Stars`] is the fast path for big catalogues: stars up to
//! [`SPRITE_MAX_RADIUS_PX`] are stamped from coverage sprites drawn once
//! per radius step (1/8 px) and sub-pixel phase (1/4 px), so a star lands
//! within 1/8 px of its true centre; each stamp is blended with the
//! star's own colour. Larger stars are drawn as vector discs.
//!
//! # Allocations
//! [`rasterise`]: one RGBA pixmap of width × height × 4 bytes; pages
//! needing more than [`MAX_RASTER_BYTES`] are refused before allocating.
//! [`BandRaster`]: the stars in pixels and their band bins (16 bytes a
//! star and 4 bytes a star per band it touches), the sprites, and
//! whatever band buffers the caller draws into; pages with a side longer
//! than [`MAX_RASTER_SIDE_PX`] are refused.

use crate::error::{Error, Result};
use crate::render::paper::mm_to_px;
use crate::render::scene::{Anchor, Item, Rgba, Scene, Shape, Stroke};
use crate::render::text;
use rayon::prelude::*;
use tiny_skia::{
    FillRule, LineCap, LineJoin, Paint, Path, PathBuilder, Pixmap, PixmapMut, Transform,
};

/// Pixel rows per band (fixed, so output does not depend on threads).
pub const BAND_ROWS: u32 = 128;

/// Largest page [`rasterise`] draws as one pixmap, bytes of RGBA pixels
/// (about 1.5 GB). Drawing by band ([`BandRaster`], as the PNG writer
/// does) has no such limit.
pub const MAX_RASTER_BYTES: u64 = 1_500_000_000;

/// Longest side of a page drawn by band, pixels: 2^17, so that every
/// paper size at every resolution a command accepts fits (the long side
/// of A0 at 2400 dpi is 112 346 px) while one band of [`BAND_ROWS`] rows
/// stays under 70 MB of RGBA.
pub const MAX_RASTER_SIDE_PX: u32 = 1 << 17;

/// Stars with a radius above this many pixels are drawn as vector discs.
/// Up to it they are stamped from sprites: at most
/// 16 × 8 radius steps × 16 phases, each at most 37 × 37 px, made only
/// for the (step, phase) pairs a page uses.
pub const SPRITE_MAX_RADIUS_PX: f32 = 16.0;

/// Radius steps per pixel for star sprites.
const RADIUS_STEPS_PER_PX: f32 = 8.0;
/// Sub-pixel phases per pixel and axis for star sprites.
const PHASES: usize = 4;

/// Size of the raster of `scene` at `dpi`, pixels (width, height).
pub fn raster_size_px(scene: &Scene, dpi: f32) -> (u32, u32) {
    (
        mm_to_px(scene.width_mm, dpi).max(1),
        mm_to_px(scene.height_mm, dpi).max(1),
    )
}

/// The highest whole resolution, dots per inch, at which the raster of
/// `scene` passes `fits` (given its width and height in pixels), starting
/// from the estimate `guess`; at least 1.
fn highest_dpi(scene: &Scene, guess: f64, fits: impl Fn(u32, u32) -> bool) -> u32 {
    let fits_at = |dpi: u32| {
        let (w, h) = raster_size_px(scene, dpi as f32);
        fits(w, h)
    };
    // Pixel sizes are rounded, so the estimate can be off by a step.
    let mut best = (guess.floor() as u32).max(1);
    while best > 1 && !fits_at(best) {
        best -= 1;
    }
    while fits_at(best + 1) {
        best += 1;
    }
    best
}

/// Checks that `scene` at `dpi` can be drawn by band: neither side of
/// its raster longer than [`MAX_RASTER_SIDE_PX`].
///
/// # Errors
/// [`Error::TooLarge`] naming the highest resolution that fits.
pub fn check_raster_size(scene: &Scene, dpi: f32) -> Result<()> {
    let (width, height) = raster_size_px(scene, dpi);
    let side = width.max(height);
    if side > MAX_RASTER_SIDE_PX {
        let guess = f64::from(dpi) * f64::from(MAX_RASTER_SIDE_PX) / f64::from(side);
        let fits = highest_dpi(scene, guess, |w, h| w.max(h) <= MAX_RASTER_SIDE_PX);
        return Err(Error::TooLarge(format!(
            "a {width} × {height} pixel page at {dpi} dpi is longer than the {MAX_RASTER_SIDE_PX} pixels a side that can be drawn; this page fits at up to {fits} dpi"
        )));
    }
    Ok(())
}

/// Draws `scene` at `dpi` dots per inch into a new premultiplied RGBA
/// pixmap.
///
/// # Errors
/// [`Error::TooLarge`] for a pixmap of more than [`MAX_RASTER_BYTES`]
/// (refused before allocating), naming the highest resolution that fits;
/// the PNG writer draws such pages by band instead.
pub fn rasterise(scene: &Scene, dpi: f32) -> Result<Pixmap> {
    let (w, h) = raster_size_px(scene, dpi);
    let bytes = u64::from(w) * u64::from(h) * 4;
    if bytes > MAX_RASTER_BYTES {
        let guess = f64::from(dpi) * (MAX_RASTER_BYTES as f64 / bytes as f64).sqrt();
        let fits = highest_dpi(scene, guess, |w, h| {
            u64::from(w) * u64::from(h) * 4 <= MAX_RASTER_BYTES
        });
        return Err(Error::TooLarge(format!(
            "a {w} × {h} pixel page at {dpi} dpi needs {} MB as one pixmap, more than the {} MB allowed; draw it at up to {fits} dpi, or by band",
            bytes.div_ceil(1_000_000),
            MAX_RASTER_BYTES / 1_000_000
        )));
    }
    let bands = BandRaster::new(scene, dpi)?;
    let mut pixmap = Pixmap::new(w, h).ok_or_else(|| {
        Error::TooLarge(format!(
            "a {w} × {h} pixel page cannot be allocated; lower the resolution"
        ))
    })?;
    let band_bytes = (BAND_ROWS * w * 4) as usize;
    pixmap
        .data_mut()
        .par_chunks_mut(band_bytes)
        .enumerate()
        .for_each(|(band, bytes)| bands.draw_into(band, bytes));
    Ok(pixmap)
}

/// A scene prepared for drawing one band of [`BAND_ROWS`] pixel rows at
/// a time, so that a caller can turn each band into output (PNG rows)
/// while it is still in the cache, without keeping the whole page.
///
/// # Guarantees
/// A band's pixels depend only on the scene, the resolution and the
/// band's index, never on the order or the thread the bands are drawn in.
#[allow(missing_debug_implementations)]
pub struct BandRaster<'a> {
    prepared: Prepared<'a>,
    width: u32,
    height: u32,
}

impl<'a> BandRaster<'a> {
    /// Prepares `scene` at `dpi` (pixel positions, star bins and sprites).
    ///
    /// # Errors
    /// [`Error::TooLarge`] for a page with a side longer than
    /// [`MAX_RASTER_SIDE_PX`] (see [`check_raster_size`]).
    pub fn new(scene: &'a Scene, dpi: f32) -> Result<BandRaster<'a>> {
        check_raster_size(scene, dpi)?;
        let (width, height) = raster_size_px(scene, dpi);
        Ok(BandRaster {
            prepared: Prepared::new(scene, dpi, height),
            width,
            height,
        })
    }

    /// Page width, pixels.
    pub fn width(&self) -> u32 {
        self.width
    }

    /// Page height, pixels.
    pub fn height(&self) -> u32 {
        self.height
    }

    /// Whether the page background is opaque (then, drawn with
    /// source-over, most likely every pixel is).
    pub fn background_opaque(&self) -> bool {
        self.prepared.scene.background.a == 255
    }

    /// Number of bands (the last may have fewer than [`BAND_ROWS`] rows).
    pub fn bands(&self) -> usize {
        self.height.div_ceil(BAND_ROWS) as usize
    }

    /// Pixel rows of band `band`.
    pub fn band_rows(&self, band: usize) -> u32 {
        let y0 = band as u32 * BAND_ROWS;
        BAND_ROWS.min(self.height.saturating_sub(y0))
    }

    /// Draws band `band` into `bytes`: premultiplied RGBA, row by row,
    /// exactly `band_rows(band) × width × 4` bytes.
    ///
    /// # Panics
    /// When `bytes` has another length.
    pub fn draw_into(&self, band: usize, bytes: &mut [u8]) {
        let rows = self.band_rows(band);
        let mut pm = PixmapMut::from_bytes(bytes, self.width, rows).expect("band size");
        self.prepared
            .draw_band(&mut pm, band, band as u32 * BAND_ROWS);
    }
}

/// A page with its per-item bounds and star bins, ready to draw by band.
struct Prepared<'a> {
    scene: &'a Scene,
    px_per_mm: f32,
    /// Each item's vertical extent in pixels (top, bottom), for culling.
    extents: Vec<(f32, f32)>,
    /// For each `Item::Stars`, the prepared stars.
    stars: Vec<Option<StarLayer>>,
}

/// Stars of one `Item::Stars`, converted to pixels and binned by band.
struct StarLayer {
    /// Per star: centre in pixels and radius in pixels.
    px: Vec<[f32; 3]>,
    /// Star indices per band, in star order.
    bins: Vec<Vec<u32>>,
    /// Sprites indexed by `sprite_index`.
    sprites: Vec<Option<Sprite>>,
    outline_px: f32,
}

/// Fill and outline coverage of one star sprite.
struct Sprite {
    size: usize,
    half: i32,
    fill: Vec<u8>,
    stroke: Vec<u8>,
    /// Per row, the columns `start..end` where the fill or the outline
    /// covers anything (empty rows have `start == end`).
    spans: Vec<(u16, u16)>,
}

fn radius_step(r_px: f32) -> usize {
    (round_positive(r_px * RADIUS_STEPS_PER_PX) as usize).max(1)
}

/// `x.floor()` for finite `x`, without a library call on targets that
/// lack a rounding instruction (baseline x86-64).
#[inline]
fn floor(x: f32) -> f32 {
    // From 2^23 on every f32 is a whole number.
    if x.abs() >= 8_388_608.0 {
        return x;
    }
    let t = x as i32 as f32;
    if t > x { t - 1.0 } else { t }
}

/// `x.round()` (halves away from zero) for finite `x ≥ 0`, like
/// [`floor`]; the difference `x - t` is exact below 2^23.
#[inline]
fn round_positive(x: f32) -> f32 {
    if x >= 8_388_608.0 {
        return x;
    }
    let t = x as i32 as f32;
    if x - t >= 0.5 { t + 1.0 } else { t }
}

fn phase(f: f32) -> usize {
    ((f * PHASES as f32) as usize).min(PHASES - 1)
}

fn sprite_index(step: usize, px: usize, py: usize) -> usize {
    (step * PHASES + py) * PHASES + px
}

fn make_sprite(step: usize, px: usize, py: usize, outline_px: f32) -> Sprite {
    let r = step as f32 / RADIUS_STEPS_PER_PX;
    let half = (r + outline_px * 0.5 + 1.0).ceil() as i32;
    let size = (2 * half + 1) as usize;
    let cx = half as f32 + (px as f32 + 0.5) / PHASES as f32;
    let cy = half as f32 + (py as f32 + 0.5) / PHASES as f32;
    let circle = PathBuilder::from_circle(cx, cy, r).expect("positive radius");
    let mut paint = Paint::default();
    paint.set_color_rgba8(255, 255, 255, 255);
    paint.anti_alias = true;
    let mut pm = Pixmap::new(size as u32, size as u32).expect("sprite size");
    pm.fill_path(
        &circle,
        &paint,
        FillRule::Winding,
        Transform::identity(),
        None,
    );
    let fill: Vec<u8> = pm.pixels().iter().map(|p| p.alpha()).collect();
    let stroke = if outline_px > 0.0 {
        let mut pm = Pixmap::new(size as u32, size as u32).expect("sprite size");
        let st = tiny_skia::Stroke {
            width: outline_px,
            ..Default::default()
        };
        pm.stroke_path(&circle, &paint, &st, Transform::identity(), None);
        pm.pixels().iter().map(|p| p.alpha()).collect()
    } else {
        Vec::new()
    };
    let spans = (0..size)
        .map(|y| {
            let covered = |x: &usize| {
                let i = y * size + x;
                fill[i] != 0 || stroke.get(i).is_some_and(|&c| c != 0)
            };
            match (0..size).find(covered) {
                Some(a) => {
                    let b = (0..size).rev().find(covered).unwrap_or(a);
                    (a as u16, b as u16 + 1)
                }
                None => (0, 0),
            }
        })
        .collect();
    Sprite {
        size,
        half,
        fill,
        stroke,
        spans,
    }
}

impl<'a> Prepared<'a> {
    fn new(scene: &'a Scene, dpi: f32, height_px: u32) -> Self {
        let px_per_mm = dpi / 25.4;
        let bands = height_px.div_ceil(BAND_ROWS) as usize;
        let extents = scene
            .items
            .iter()
            .map(|it| {
                let (a, b) = item_extent_mm(it);
                (a * px_per_mm - 2.0, b * px_per_mm + 2.0)
            })
            .collect();
        let stars = scene
            .items
            .iter()
            .map(|it| match it {
                Item::Stars {
                    centres_mm,
                    radii_mm,
                    outline,
                    ..
                } => Some(StarLayer::new(
                    centres_mm,
                    radii_mm,
                    outline.as_ref(),
                    px_per_mm,
                    bands,
                )),
                _ => None,
            })
            .collect();
        Prepared {
            scene,
            px_per_mm,
            extents,
            stars,
        }
    }

    fn draw_band(&self, pm: &mut PixmapMut<'_>, band: usize, y0: u32) {
        let bg = self.scene.background;
        pm.fill(tiny_skia::Color::from_rgba8(bg.r, bg.g, bg.b, bg.a));
        let top = y0 as f32;
        let bottom = (y0 + pm.height()) as f32;
        let s = self.px_per_mm;
        let tf = Transform::from_row(s, 0.0, 0.0, s, 0.0, -top);
        for (i, item) in self.scene.items.iter().enumerate() {
            let (a, b) = self.extents[i];
            if b < top || a > bottom {
                continue;
            }
            match item {
                Item::Stars { fills, outline, .. } => {
                    let layer = self.stars[i].as_ref().expect("prepared stars");
                    layer.draw(pm, band, y0, fills, outline.as_ref(), tf, s);
                }
                Item::Marker {
                    centre_mm,
                    radius_mm,
                    shape,
                    fill,
                    stroke,
                } => draw_marker(
                    pm,
                    tf,
                    *centre_mm,
                    *radius_mm,
                    *shape,
                    *fill,
                    stroke.as_ref(),
                ),
                Item::Line {
                    points_mm,
                    closed,
                    stroke,
                } => {
                    if let Some(path) = polyline(points_mm, *closed) {
                        stroke_path(pm, &path, stroke, tf);
                    }
                }
                Item::Polygon {
                    points_mm,
                    fill,
                    stroke,
                } => {
                    if let Some(path) = polyline(points_mm, true) {
                        pm.fill_path(&path, &paint(*fill), FillRule::Winding, tf, None);
                        if let Some(st) = stroke {
                            stroke_path(pm, &path, st, tf);
                        }
                    }
                }
                Item::Text {
                    position_mm,
                    text,
                    size_pt,
                    color,
                    anchor,
                    bold,
                    rotation_deg,
                } => draw_text(
                    pm,
                    y0,
                    s,
                    TextSpec {
                        position_mm: *position_mm,
                        text,
                        size_pt: *size_pt,
                        color: *color,
                        anchor: *anchor,
                        bold: *bold,
                        rotation_deg: *rotation_deg,
                    },
                ),
            }
        }
    }
}

impl StarLayer {
    fn new(
        centres_mm: &[[f32; 2]],
        radii_mm: &[f32],
        outline: Option<&Stroke>,
        px_per_mm: f32,
        bands: usize,
    ) -> Self {
        let outline_px = outline.map_or(0.0, |o| o.width_mm * px_per_mm);
        let px: Vec<[f32; 3]> = centres_mm
            .par_iter()
            .zip(radii_mm.par_iter())
            .map(|(c, r)| [c[0] * px_per_mm, c[1] * px_per_mm, r * px_per_mm])
            .collect();
        // Binned in pieces on all threads, then joined band by band in
        // piece order: the same bins as one pass over the stars.
        let piece = 1 << 15;
        let parts: Vec<(Vec<Vec<u32>>, Vec<bool>)> = px
            .par_chunks(piece)
            .enumerate()
            .map(|(k, stars)| {
                let mut bins = vec![Vec::new(); bands];
                let mut used = Vec::new();
                for (j, p) in stars.iter().enumerate() {
                    if !(p[0].is_finite() && p[1].is_finite() && p[2].is_finite()) || p[2] <= 0.0 {
                        continue;
                    }
                    let reach = p[2] + outline_px * 0.5 + 2.0;
                    let lo = ((p[1] - reach).max(0.0) / BAND_ROWS as f32) as usize;
                    let hi = ((p[1] + reach).max(0.0) / BAND_ROWS as f32) as usize;
                    if lo >= bands {
                        continue;
                    }
                    let i = (k * piece + j) as u32;
                    for bin in &mut bins[lo..=hi.min(bands - 1)] {
                        bin.push(i);
                    }
                    if p[2] <= SPRITE_MAX_RADIUS_PX {
                        let (fx, fy) = (p[0] - floor(p[0]), p[1] - floor(p[1]));
                        let k = sprite_index(radius_step(p[2]), phase(fx), phase(fy));
                        if k >= used.len() {
                            used.resize(k + 1, false);
                        }
                        used[k] = true;
                    }
                }
                (bins, used)
            })
            .collect();
        let mut used = vec![false; parts.iter().map(|(_, u)| u.len()).max().unwrap_or(0)];
        for (_, u) in &parts {
            for (a, &b) in used.iter_mut().zip(u) {
                *a |= b;
            }
        }
        let bins: Vec<Vec<u32>> = (0..bands)
            .into_par_iter()
            .map(|band| {
                let mut bin = Vec::with_capacity(parts.iter().map(|(b, _)| b[band].len()).sum());
                for (b, _) in &parts {
                    bin.extend_from_slice(&b[band]);
                }
                bin
            })
            .collect();
        let sprites = used
            .par_iter()
            .enumerate()
            .map(|(k, &u)| {
                u.then(|| {
                    let px = k % PHASES;
                    let py = (k / PHASES) % PHASES;
                    let step = k / (PHASES * PHASES);
                    make_sprite(step, px, py, outline_px)
                })
            })
            .collect();
        StarLayer {
            px,
            bins,
            sprites,
            outline_px,
        }
    }

    #[allow(clippy::too_many_arguments)]
    fn draw(
        &self,
        pm: &mut PixmapMut<'_>,
        band: usize,
        y0: u32,
        fills: &[Rgba],
        outline: Option<&Stroke>,
        tf: Transform,
        px_per_mm: f32,
    ) {
        let Some(bin) = self.bins.get(band) else {
            return;
        };
        let w = pm.width() as i32;
        let h = pm.height() as i32;
        let data = pm.data_mut();
        for &i in bin {
            let i = i as usize;
            let [x, y, r] = self.px[i];
            let color = fills.get(i).copied().unwrap_or(Rgba::rgb(255, 255, 255));
            if r > SPRITE_MAX_RADIUS_PX {
                // Vector disc, on the same pixmap bytes.
                let mut pmv = PixmapMut::from_bytes(data, w as u32, h as u32).expect("band");
                let mm = [x / px_per_mm, y / px_per_mm];
                draw_marker(
                    &mut pmv,
                    tf,
                    mm,
                    r / px_per_mm,
                    Shape::Disc,
                    Some(color),
                    outline,
                );
                continue;
            }
            let (ix, iy) = (floor(x), floor(y));
            let k = sprite_index(radius_step(r), phase(x - ix), phase(y - iy));
            let Some(sp) = self.sprites[k].as_ref() else {
                continue;
            };
            let ox = ix as i32 - sp.half;
            let oy = iy as i32 - sp.half - y0 as i32;
            let stroke = if self.outline_px > 0.0 {
                outline.map(|o| o.color)
            } else {
                None
            };
            stamp_sprite(data, w, h, ox, oy, sp, color, stroke);
        }
    }
}

/// Stamps a star sprite with its top-left corner at (`ox`, `oy`): the
/// fill in `fill`, then the outline in `stroke`, source-over,
/// premultiplied; only the covered span of each row is visited. Same
/// pixels as blending the two masks one after the other.
#[allow(clippy::too_many_arguments)]
fn stamp_sprite(
    data: &mut [u8],
    w: i32,
    h: i32,
    ox: i32,
    oy: i32,
    sp: &Sprite,
    fill: Rgba,
    stroke: Option<Rgba>,
) {
    let size = sp.size as i32;
    let ya = oy.max(0);
    let yb = (oy + size).min(h);
    if ya >= yb || ox >= w || ox + size <= 0 {
        return;
    }
    let stroke = stroke.filter(|c| c.a != 0 && !sp.stroke.is_empty());
    let size = sp.size;
    for y in ya..yb {
        let my = (y - oy) as usize;
        let (s0, s1) = sp.spans[my];
        let xa = (ox + i32::from(s0)).max(0);
        let xb = (ox + i32::from(s1)).min(w);
        if xa >= xb {
            continue;
        }
        let (ma, mb) = (
            my * size + (xa - ox) as usize,
            my * size + (xb - ox) as usize,
        );
        let drow = (y * w) as usize * 4;
        let dst = &mut data[drow + xa as usize * 4..drow + xb as usize * 4];
        let fills = &sp.fill[ma..mb];
        match stroke {
            Some(sc) => {
                let strokes = &sp.stroke[ma..mb];
                for ((d, &cf), &cs) in dst.chunks_exact_mut(4).zip(fills).zip(strokes) {
                    let d: &mut [u8; 4] = d.try_into().expect("four bytes");
                    if cs == 255 && sc.a == 255 {
                        // The outline covers whatever the fill left.
                        *d = [sc.r, sc.g, sc.b, 255];
                        continue;
                    }
                    if fill.a != 0 {
                        blend_px(d, fill, cf);
                    }
                    blend_px(d, sc, cs);
                }
            }
            None if fill.a != 0 => {
                for (d, &cf) in dst.chunks_exact_mut(4).zip(fills) {
                    blend_px(d.try_into().expect("four bytes"), fill, cf);
                }
            }
            None => {}
        }
    }
}

/// Source-over blend of one premultiplied pixel with a straight-alpha
/// colour at coverage `c`; a fully covered opaque colour is a plain copy
/// (the general formula gives the same bytes).
#[inline(always)]
fn blend_px(d: &mut [u8; 4], color: Rgba, c: u8) {
    if c == 0 {
        return;
    }
    if c == 255 && color.a == 255 {
        *d = [color.r, color.g, color.b, 255];
        return;
    }
    let sa = div255(u32::from(color.a) * u32::from(c));
    let inv = 255 - sa;
    d[0] = (div255(u32::from(color.r) * sa) + div255(u32::from(d[0]) * inv)) as u8;
    d[1] = (div255(u32::from(color.g) * sa) + div255(u32::from(d[1]) * inv)) as u8;
    d[2] = (div255(u32::from(color.b) * sa) + div255(u32::from(d[2]) * inv)) as u8;
    d[3] = (sa + div255(u32::from(d[3]) * inv)) as u8;
}

#[inline]
fn div255(x: u32) -> u32 {
    (x + 128 + ((x + 128) >> 8)) >> 8
}

/// Source-over blend of a straight-alpha colour through a coverage mask.
#[allow(clippy::too_many_arguments)]
fn blend_mask(
    data: &mut [u8],
    w: i32,
    h: i32,
    ox: i32,
    oy: i32,
    mw: usize,
    mh: usize,
    cov: &[u8],
    color: Rgba,
) {
    let x0 = ox.max(0);
    let x1 = (ox + mw as i32).min(w);
    let y0 = oy.max(0);
    let y1 = (oy + mh as i32).min(h);
    if x0 >= x1 || y0 >= y1 || color.a == 0 {
        return;
    }
    for y in y0..y1 {
        let mrow = ((y - oy) as usize) * mw;
        let drow = (y * w) as usize * 4;
        for x in x0..x1 {
            let c = cov[mrow + (x - ox) as usize];
            let d: &mut [u8; 4] = (&mut data[drow + x as usize * 4..drow + x as usize * 4 + 4])
                .try_into()
                .expect("four bytes");
            blend_px(d, color, c);
        }
    }
}

fn paint(c: Rgba) -> Paint<'static> {
    let mut p = Paint::default();
    p.set_color_rgba8(c.r, c.g, c.b, c.a);
    p.anti_alias = true;
    p
}

fn stroke_path(pm: &mut PixmapMut<'_>, path: &Path, st: &Stroke, tf: Transform) {
    if st.width_mm <= 0.0 || st.color.a == 0 {
        return;
    }
    let dash = st
        .dash_mm
        .and_then(|(on, off)| tiny_skia::StrokeDash::new(vec![on, off], 0.0));
    let ts = tiny_skia::Stroke {
        width: st.width_mm,
        line_cap: LineCap::Butt,
        line_join: LineJoin::Round,
        dash,
        ..Default::default()
    };
    pm.stroke_path(path, &paint(st.color), &ts, tf, None);
}

fn polyline(points: &[[f32; 2]], closed: bool) -> Option<Path> {
    let mut pb = PathBuilder::new();
    let mut it = points.iter();
    let first = it.next()?;
    pb.move_to(first[0], first[1]);
    for p in it {
        pb.line_to(p[0], p[1]);
    }
    if closed {
        pb.close();
    }
    pb.finish()
}

/// The outline of a polygonal marker shape (square, diamond, triangle,
/// cross) around `centre` for a marker of radius `r`, mm; `None` for the
/// round shapes (disc, ring).
///
/// Square, diamond and triangle have the area of the disc of radius `r`,
/// so symbol size reads the same whatever the shape; the cross reaches
/// 1.3 r with a waist of 0.35 r.
pub fn marker_polygon(shape: Shape, centre: [f32; 2], r: f32) -> Option<Vec<[f32; 2]>> {
    let [cx, cy] = centre;
    let pts = match shape {
        Shape::Disc | Shape::Ring => return None,
        Shape::Square => {
            let h = r * std::f32::consts::PI.sqrt() / 2.0;
            vec![
                [cx - h, cy - h],
                [cx + h, cy - h],
                [cx + h, cy + h],
                [cx - h, cy + h],
            ]
        }
        Shape::Diamond => {
            let d = r * std::f32::consts::PI.sqrt() / std::f32::consts::SQRT_2;
            vec![[cx, cy - d], [cx + d, cy], [cx, cy + d], [cx - d, cy]]
        }
        Shape::Triangle => {
            // Equilateral: area (3√3/4) R² = π r².
            let big = r * (4.0 * std::f32::consts::PI / (3.0 * 3f32.sqrt())).sqrt();
            let s3 = 3f32.sqrt() / 2.0;
            vec![
                [cx, cy - big],
                [cx + big * s3, cy + big * 0.5],
                [cx - big * s3, cy + big * 0.5],
            ]
        }
        Shape::Cross => {
            let (outer, waist) = (1.3 * r, 0.35 * r);
            (0..8)
                .map(|k| {
                    let ang = k as f32 * std::f32::consts::FRAC_PI_4;
                    let rad = if k % 2 == 0 { outer } else { waist };
                    [cx + rad * ang.sin(), cy - rad * ang.cos()]
                })
                .collect()
        }
    };
    Some(pts)
}

/// Inner radius of a ring marker as a share of its outer radius.
pub const RING_INNER: f32 = 0.55;

fn draw_marker(
    pm: &mut PixmapMut<'_>,
    tf: Transform,
    centre: [f32; 2],
    r: f32,
    shape: Shape,
    fill: Option<Rgba>,
    stroke: Option<&Stroke>,
) {
    if r.is_nan() || r <= 0.0 {
        return;
    }
    let [cx, cy] = centre;
    let path = match shape {
        Shape::Disc => PathBuilder::from_circle(cx, cy, r),
        Shape::Ring => {
            let mut pb = PathBuilder::new();
            pb.push_circle(cx, cy, r);
            pb.push_circle(cx, cy, r * RING_INNER);
            pb.finish()
        }
        _ => polyline(&marker_polygon(shape, centre, r).unwrap_or_default(), true),
    };
    let Some(path) = path else {
        return;
    };
    if let Some(f) = fill {
        pm.fill_path(&path, &paint(f), FillRule::EvenOdd, tf, None);
    }
    if let Some(st) = stroke {
        stroke_path(pm, &path, st, tf);
    }
}

struct TextSpec<'t> {
    position_mm: [f32; 2],
    text: &'t str,
    size_pt: f32,
    color: Rgba,
    anchor: Anchor,
    bold: bool,
    rotation_deg: f32,
}

/// Offset of the line start from the anchor, in the unit of `width_em`
/// (ems in the renderers; the map sheet uses it in mm for text boxes).
pub(crate) fn anchor_shift_em(anchor: Anchor, width_em: f32) -> f32 {
    match anchor {
        Anchor::Start => 0.0,
        Anchor::Middle => -0.5 * width_em,
        Anchor::End => -width_em,
    }
}

fn draw_text(pm: &mut PixmapMut<'_>, y0: u32, px_per_mm: f32, t: TextSpec<'_>) {
    if t.text.is_empty() || t.size_pt.is_nan() || t.size_pt <= 0.0 || t.color.a == 0 {
        return;
    }
    let (glyphs, width_em) = text::layout(t.text, t.bold);
    let em_px = t.size_pt * text::MM_PER_PT * px_per_mm;
    let shift = anchor_shift_em(t.anchor, width_em);
    let ax = t.position_mm[0] * px_per_mm;
    let ay = t.position_mm[1] * px_per_mm - y0 as f32;
    if t.rotation_deg.abs() < 1e-3 {
        let (w, h) = (pm.width() as i32, pm.height() as i32);
        let data = pm.data_mut();
        let base = ay.round() as i32;
        for g in &glyphs {
            let bm = text::glyph_bitmap(g.glyph_id, t.bold, em_px);
            if bm.width == 0 || bm.height == 0 {
                continue;
            }
            let pen = (ax + (shift + g.x_em) * em_px).round() as i32;
            blend_mask(
                data,
                w,
                h,
                pen + bm.left_px,
                base - bm.top_px,
                bm.width,
                bm.height,
                &bm.coverage,
                t.color,
            );
        }
        return;
    }
    // Rotated: glyph outlines, counter-clockwise on the page (y down).
    let mut pb = PathBuilder::new();
    for g in &glyphs {
        let dx = shift + g.x_em;
        for seg in text::glyph_outline(g.glyph_id, t.bold).iter() {
            let p = |q: [f32; 2]| (q[0] + dx, -q[1]);
            match *seg {
                text::Segment::MoveTo(a) => {
                    let (x, y) = p(a);
                    pb.move_to(x, y)
                }
                text::Segment::LineTo(a) => {
                    let (x, y) = p(a);
                    pb.line_to(x, y)
                }
                text::Segment::QuadTo(c, a) => {
                    let ((x1, y1), (x, y)) = (p(c), p(a));
                    pb.quad_to(x1, y1, x, y)
                }
                text::Segment::CubicTo(c1, c2, a) => {
                    let ((x1, y1), (x2, y2), (x, y)) = (p(c1), p(c2), p(a));
                    pb.cubic_to(x1, y1, x2, y2, x, y)
                }
                text::Segment::Close => pb.close(),
            }
        }
    }
    let Some(path) = pb.finish() else {
        return;
    };
    let tf = Transform::from_translate(ax, ay)
        .pre_rotate(-t.rotation_deg)
        .pre_scale(em_px, em_px);
    pm.fill_path(&path, &paint(t.color), FillRule::Winding, tf, None);
}

/// Vertical extent of an item on the page, mm (top, bottom), generous.
fn item_extent_mm(item: &Item) -> (f32, f32) {
    let span = |pts: &[[f32; 2]], pad: f32| {
        let (mut a, mut b) = (f32::INFINITY, f32::NEG_INFINITY);
        for p in pts {
            a = a.min(p[1]);
            b = b.max(p[1]);
        }
        (a - pad, b + pad)
    };
    let sw = |s: Option<&Stroke>| s.map_or(0.0, |s| s.width_mm);
    match item {
        Item::Marker {
            centre_mm,
            radius_mm,
            stroke,
            ..
        } => {
            let pad = 1.4 * radius_mm + sw(stroke.as_ref());
            (centre_mm[1] - pad, centre_mm[1] + pad)
        }
        // Stars are binned one by one.
        Item::Stars { .. } => (f32::NEG_INFINITY, f32::INFINITY),
        Item::Line {
            points_mm, stroke, ..
        } => span(points_mm, stroke.width_mm),
        Item::Polygon {
            points_mm, stroke, ..
        } => span(points_mm, sw(stroke.as_ref())),
        Item::Text {
            position_mm,
            text,
            size_pt,
            bold,
            rotation_deg,
            ..
        } => {
            let size_mm = size_pt * text::MM_PER_PT;
            if rotation_deg.abs() < 1e-3 {
                (
                    position_mm[1] - 1.3 * size_mm,
                    position_mm[1] + 0.5 * size_mm,
                )
            } else {
                let reach = text::text_width_mm(text, *size_pt, *bold) + 1.5 * size_mm;
                (position_mm[1] - reach, position_mm[1] + reach)
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn blank_page(width_mm: f32, height_mm: f32) -> Scene {
        Scene {
            width_mm,
            height_mm,
            background: Rgba::rgb(255, 255, 255),
            items: vec![],
        }
    }

    #[test]
    fn every_paper_at_the_highest_resolution_can_be_drawn_by_band() {
        // Pixel sizes grow with the resolution, so the top of the range
        // stands for all of it.
        let dpi = crate::render::output::DPI_RANGE.1;
        for paper in crate::render::paper::Paper::ALL {
            for landscape in [false, true] {
                let (w, h) = paper.size_mm(landscape);
                let page = blank_page(w, h);
                let bands = BandRaster::new(&page, dpi);
                assert!(bands.is_ok(), "{paper:?} at {dpi} dpi: refused");
            }
        }
        // A0 portrait at 2400 dpi: 841/25.4*2400 = 79464.6 and
        // 1189/25.4*2400 = 112346.5 px (computed by hand).
        let page = blank_page(841.0, 1189.0);
        let bands = BandRaster::new(&page, 2400.0).unwrap();
        assert_eq!((bands.width(), bands.height()), (79465, 112346));
    }

    #[test]
    fn a_page_too_long_names_the_resolution_that_fits() {
        // 1400 mm: 55 118 px at 1000 dpi, 132 283 px at 2400 dpi.
        let err = check_raster_size(&blank_page(1400.0, 1000.0), 2400.0).unwrap_err();
        assert!(matches!(err, Error::TooLarge(_)), "{err}");
        let msg = err.to_string();
        assert!(msg.contains("up to 2378 dpi"), "{msg}");
        for (dpi, fits) in [(2378.0, true), (2379.0, false)] {
            let ok = check_raster_size(&blank_page(1400.0, 1000.0), dpi).is_ok();
            assert_eq!(ok, fits, "{dpi} dpi");
        }
    }

    #[test]
    fn a_pixmap_too_big_names_the_resolution_that_fits() {
        // A4 landscape at 2000 dpi: 23 386 × 16 535 px, 1547 MB of RGBA.
        let page = blank_page(297.0, 210.0);
        let err = rasterise(&page, 2000.0).expect_err("refused");
        let msg = err.to_string();
        assert!(msg.contains("1547 MB") && msg.contains("1500 MB"), "{msg}");
        let fits: u32 = msg
            .split("up to ")
            .nth(1)
            .and_then(|t| t.split(' ').next())
            .and_then(|t| t.parse().ok())
            .expect("a resolution in the message");
        let bytes = |dpi: u32| {
            let (w, h) = raster_size_px(&page, dpi as f32);
            u64::from(w) * u64::from(h) * 4
        };
        assert!(bytes(fits) <= MAX_RASTER_BYTES, "{fits} dpi does not fit");
        assert!(
            bytes(fits + 1) > MAX_RASTER_BYTES,
            "{fits} dpi is not the highest"
        );
    }

    /// A background with every byte different and alpha not always 255
    /// (premultiplied: colour bytes never above alpha).
    fn background(w: usize, h: usize) -> Vec<u8> {
        (0..w * h)
            .flat_map(|i| {
                let a = 128 + (i * 37 % 128) as u8;
                let c = |k: usize| ((i * k) % (usize::from(a) + 1)) as u8;
                [c(7), c(13), c(29), a]
            })
            .collect()
    }

    #[test]
    fn floor_and_round_match_the_standard_library() {
        let mut xs = vec![
            0.0f32,
            -0.0,
            0.5,
            -0.5,
            1.5,
            2.5,
            0.49999997,
            -0.49999997,
            1e-30,
            -1e-30,
            8_388_607.5,
            8_388_608.0,
            -8_388_607.5,
            16_777_215.0,
            3e9,
            -3e9,
            f32::MAX,
            f32::MIN,
        ];
        // Every 1/64 step over a few thousand pixels, and their neighbours.
        for k in -200_000..200_000 {
            let x = k as f32 / 64.0;
            xs.extend([x, x.next_up(), x.next_down()]);
        }
        for &x in &xs {
            assert_eq!(
                floor(x).to_bits() & !(1 << 31),
                x.floor().to_bits() & !(1 << 31),
                "{x}"
            );
            if x >= 0.0 {
                assert_eq!(round_positive(x), x.round(), "{x}");
            }
        }
    }

    #[test]
    fn stamping_equals_the_two_masks_blended_in_turn() {
        let (w, h) = (23usize, 19usize);
        let colours = [
            Rgba::rgb(255, 200, 120),
            Rgba {
                r: 40,
                g: 90,
                b: 250,
                a: 140,
            },
            Rgba {
                r: 9,
                g: 9,
                b: 9,
                a: 0,
            },
        ];
        for step in [1usize, 7, 20, 61] {
            for outline_px in [0.0f32, 1.2, 2.5] {
                let sp = make_sprite(step, 1, 3, outline_px);
                for &fill in &colours {
                    for &line in &colours {
                        // Inside, and clipped on every side.
                        for (ox, oy) in [(3, 2), (-4, -3), (w as i32 - 5, h as i32 - 4), (-40, 0)] {
                            let stroke = (outline_px > 0.0).then_some(line);
                            let mut got = background(w, h);
                            stamp_sprite(&mut got, w as i32, h as i32, ox, oy, &sp, fill, stroke);
                            let mut want = background(w, h);
                            let n = sp.size;
                            blend_mask(&mut want, w as i32, h as i32, ox, oy, n, n, &sp.fill, fill);
                            if let Some(sc) = stroke {
                                blend_mask(
                                    &mut want, w as i32, h as i32, ox, oy, n, n, &sp.stroke, sc,
                                );
                            }
                            assert_eq!(
                                got, want,
                                "step {step}, outline {outline_px}, at {ox},{oy}"
                            );
                        }
                    }
                }
            }
        }
    }
}
