//! Text: measuring, laying out and drawing labels in Noto Sans.
//!
//! The font is Noto Sans (Regular and Bold, v1.04) from the `notosans`
//! crate, under the SIL Open Font License 1.1; the licence ships in
//! `assets/fonts/OFL.txt`. Layout (advances and kerning) comes from the
//! font's own tables, so every back end places glyphs at the same
//! positions: raster output draws fontdue coverage bitmaps (cached per
//! glyph and pixel size) or, for rotated text, glyph outlines; PDF
//! output draws the outlines from ttf-parser; SVG output names the font.
//!
//! # Units
//! Sizes in points (1 pt = 25.4/72 mm), lengths in millimetres, layout
//! positions in ems (multiples of the font size).

use std::collections::HashMap;
use std::sync::{Arc, Mutex, OnceLock};

/// Millimetres per point (1 pt = 1/72 in, 1 in = 25.4 mm exactly).
pub const MM_PER_PT: f32 = 25.4 / 72.0;

/// The family name written into SVG files.
pub const FONT_FAMILY: &str = "Noto Sans";

struct FontFace {
    raster: fontdue::Font,
    face: ttf_parser::Face<'static>,
    units_per_em: f32,
}

fn load(bytes: &'static [u8]) -> FontFace {
    let raster = fontdue::Font::from_bytes(bytes, fontdue::FontSettings::default())
        .expect("the bundled Noto Sans font parses");
    let face = ttf_parser::Face::parse(bytes, 0).expect("the bundled Noto Sans font parses");
    let units_per_em = f32::from(face.units_per_em());
    FontFace {
        raster,
        face,
        units_per_em,
    }
}

fn font(bold: bool) -> &'static FontFace {
    static REGULAR: OnceLock<FontFace> = OnceLock::new();
    static BOLD: OnceLock<FontFace> = OnceLock::new();
    if bold {
        BOLD.get_or_init(|| load(notosans::BOLD_TTF))
    } else {
        REGULAR.get_or_init(|| load(notosans::REGULAR_TTF))
    }
}

/// Starts parsing both faces on a thread of its own and returns at once,
/// so a caller with other work first (reading a catalogue) does not wait
/// for them later. Parsing builds every glyph's outline: tens of
/// milliseconds.
pub fn warm_up() {
    std::thread::spawn(|| {
        font(false);
        font(true);
    });
}

/// One glyph of a laid-out line.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PlacedGlyph {
    /// Glyph index in the font.
    pub glyph_id: u16,
    /// Pen position of the glyph's origin from the start of the line, ems.
    pub x_em: f32,
}

/// Lays out one line: each glyph's pen position in ems and the line's
/// total advance in ems. Characters the font lacks become its
/// "missing glyph" box.
pub fn layout(text: &str, bold: bool) -> (Vec<PlacedGlyph>, f32) {
    let f = font(bold);
    let upem = f.units_per_em;
    let mut out = Vec::with_capacity(text.len());
    let mut pen = 0.0f32;
    let mut prev: Option<u16> = None;
    for ch in text.chars() {
        let gid = f.face.glyph_index(ch).map_or(0, |g| g.0);
        if let Some(p) = prev {
            pen += f
                .raster
                .horizontal_kern_indexed(p, gid, upem)
                .unwrap_or(0.0)
                / upem;
        }
        out.push(PlacedGlyph {
            glyph_id: gid,
            x_em: pen,
        });
        let adv = f
            .face
            .glyph_hor_advance(ttf_parser::GlyphId(gid))
            .unwrap_or(0);
        pen += f32::from(adv) / upem;
        prev = Some(gid);
    }
    (out, pen)
}

/// Advance width of `text` set in one line at `size_pt`, millimetres.
pub fn text_width_mm(text: &str, size_pt: f32, bold: bool) -> f32 {
    layout(text, bold).1 * size_pt * MM_PER_PT
}

/// Height of the font's ascender above the baseline at `size_pt`, mm.
pub fn ascent_mm(size_pt: f32, bold: bool) -> f32 {
    let f = font(bold);
    f32::from(f.face.ascender()) / f.units_per_em * size_pt * MM_PER_PT
}

/// Depth of the font's descender below the baseline at `size_pt`, mm
/// (a positive number).
pub fn descent_mm(size_pt: f32, bold: bool) -> f32 {
    let f = font(bold);
    -f32::from(f.face.descender()) / f.units_per_em * size_pt * MM_PER_PT
}

/// Height of capital letters above the baseline at `size_pt`, mm.
pub fn cap_height_mm(size_pt: f32, bold: bool) -> f32 {
    let f = font(bold);
    let cap = f
        .face
        .capital_height()
        .unwrap_or((f.units_per_em * 0.714) as i16);
    f32::from(cap) / f.units_per_em * size_pt * MM_PER_PT
}

/// One segment of a glyph outline, in ems, y up from the baseline.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Segment {
    /// Start a contour.
    MoveTo([f32; 2]),
    /// Straight line.
    LineTo([f32; 2]),
    /// Quadratic Bézier (control, end).
    QuadTo([f32; 2], [f32; 2]),
    /// Cubic Bézier (control 1, control 2, end).
    CubicTo([f32; 2], [f32; 2], [f32; 2]),
    /// Close the contour.
    Close,
}

struct Collect {
    scale: f32,
    segs: Vec<Segment>,
}

impl ttf_parser::OutlineBuilder for Collect {
    fn move_to(&mut self, x: f32, y: f32) {
        let s = self.scale;
        self.segs.push(Segment::MoveTo([x * s, y * s]));
    }
    fn line_to(&mut self, x: f32, y: f32) {
        let s = self.scale;
        self.segs.push(Segment::LineTo([x * s, y * s]));
    }
    fn quad_to(&mut self, x1: f32, y1: f32, x: f32, y: f32) {
        let s = self.scale;
        self.segs
            .push(Segment::QuadTo([x1 * s, y1 * s], [x * s, y * s]));
    }
    fn curve_to(&mut self, x1: f32, y1: f32, x2: f32, y2: f32, x: f32, y: f32) {
        let s = self.scale;
        self.segs.push(Segment::CubicTo(
            [x1 * s, y1 * s],
            [x2 * s, y2 * s],
            [x * s, y * s],
        ));
    }
    fn close(&mut self) {
        self.segs.push(Segment::Close);
    }
}

/// The outline of a glyph in ems (y up), cached; empty for blank glyphs
/// such as the space.
pub fn glyph_outline(glyph_id: u16, bold: bool) -> Arc<Vec<Segment>> {
    type Cache = Mutex<HashMap<(bool, u16), Arc<Vec<Segment>>>>;
    static CACHE: OnceLock<Cache> = OnceLock::new();
    let cache = CACHE.get_or_init(|| Mutex::new(HashMap::new()));
    if let Some(o) = cache.lock().expect("glyph cache").get(&(bold, glyph_id)) {
        return o.clone();
    }
    let f = font(bold);
    let mut c = Collect {
        scale: 1.0 / f.units_per_em,
        segs: Vec::new(),
    };
    f.face.outline_glyph(ttf_parser::GlyphId(glyph_id), &mut c);
    let o = Arc::new(c.segs);
    cache
        .lock()
        .expect("glyph cache")
        .insert((bold, glyph_id), o.clone());
    o
}

/// A glyph's anti-aliased coverage bitmap at one pixel size.
#[derive(Debug)]
pub struct GlyphBitmap {
    /// Offset of the bitmap's left edge from the pen position, px.
    pub left_px: i32,
    /// Offset of the bitmap's top edge above the baseline, px (positive up).
    pub top_px: i32,
    /// Width, px.
    pub width: usize,
    /// Height, px.
    pub height: usize,
    /// Coverage 0–255, row by row from the top.
    pub coverage: Vec<u8>,
}

/// The coverage bitmap of a glyph at `size_px` pixels per em, cached per
/// glyph, face and size (sizes rounded to 1/8 px).
///
/// # Allocations
/// One bitmap per new (glyph, face, size); later calls share it.
pub fn glyph_bitmap(glyph_id: u16, bold: bool, size_px: f32) -> Arc<GlyphBitmap> {
    type Cache = Mutex<HashMap<(bool, u16, u32), Arc<GlyphBitmap>>>;
    static CACHE: OnceLock<Cache> = OnceLock::new();
    let cache = CACHE.get_or_init(|| Mutex::new(HashMap::new()));
    let eighths = (size_px * 8.0).round().max(1.0) as u32;
    let key = (bold, glyph_id, eighths);
    if let Some(g) = cache.lock().expect("glyph cache").get(&key) {
        return g.clone();
    }
    let (m, coverage) = font(bold)
        .raster
        .rasterize_indexed(glyph_id, eighths as f32 / 8.0);
    let g = Arc::new(GlyphBitmap {
        left_px: m.xmin,
        top_px: m.ymin + m.height as i32,
        width: m.width,
        height: m.height,
        coverage,
    });
    cache.lock().expect("glyph cache").insert(key, g.clone());
    g
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn width_scales_with_size_and_adds_up() {
        let w10 = text_width_mm("Amberline", 10.0, false);
        let w20 = text_width_mm("Amberline", 20.0, false);
        assert!((w20 - 2.0 * w10).abs() < 1e-4);
        // Without kerning pairs between the parts, widths add.
        let a = text_width_mm("ab", 10.0, false);
        let b = text_width_mm("cd", 10.0, false);
        let ab = text_width_mm("abcd", 10.0, false);
        assert!((ab - a - b).abs() < 0.05 * ab);
        assert!(text_width_mm("Amberline", 10.0, true) > w10);
        assert_eq!(text_width_mm("", 10.0, false), 0.0);
    }

    #[test]
    fn metrics_are_plausible() {
        // Noto Sans: ascender 1069, descender -293, cap height 714 per 1000
        // units (the font's own hhea/OS2 tables, read here).
        let asc = ascent_mm(72.0, false);
        assert!(asc > 20.0 && asc < 30.0, "{asc}");
        assert!(descent_mm(72.0, false) > 0.0);
        let cap = cap_height_mm(72.0, false);
        assert!(cap > 15.0 && cap < asc);
    }
}
