//! PDF output: one vector page per scene, page size in points from the
//! scene's millimetres; stars as a shared unit-disc form placed per star;
//! text as Noto Sans glyph outlines (one form per glyph), so it shows
//! the same in every viewer without embedding a font program.
//!
//! # Source
//! ISO 32000-1:2008 (PDF 1.7): §8.4 graphics state, §8.5 path
//! construction, §8.10 form XObjects, §11.6.4.4 constant alpha.

use crate::render::raster::{RING_INNER, anchor_shift_em, marker_polygon};
use crate::render::scene::{Item, Rgba, Scene, Shape, Stroke};
use crate::render::text::{self, MM_PER_PT, Segment};
use pdf_writer::{Filter, Finish, Name, Pdf, Rect, Ref};
use std::collections::{BTreeMap, BTreeSet};
use std::io::Write;

/// Points per millimetre (72 pt per inch of 25.4 mm).
const PT_PER_MM: f32 = 72.0 / 25.4;
/// The circle approximation constant for four cubic Béziers.
const KAPPA: f32 = 0.552_284_8;

/// Writes a number with at most 3 decimals, trailing zeros dropped.
fn num(out: &mut Vec<u8>, v: f32) {
    let m = (f64::from(v) * 1000.0).round() as i64;
    if m < 0 {
        out.push(b'-');
    }
    let m = m.unsigned_abs();
    let (int, frac) = (m / 1000, m % 1000);
    let _ = write!(out, "{int}");
    if frac != 0 {
        let s = format!("{frac:03}");
        out.push(b'.');
        out.extend_from_slice(s.trim_end_matches('0').as_bytes());
    }
}

fn nums(out: &mut Vec<u8>, vs: &[f32]) {
    for v in vs {
        num(out, *v);
        out.push(b' ');
    }
}

/// Drawing state kept while writing one content stream, so repeated
/// settings are written once.
struct Writer {
    out: Vec<u8>,
    fill: Option<[u8; 3]>,
    stroke: Option<[u8; 3]>,
    fill_alpha: u8,
    stroke_alpha: u8,
    width: Option<f32>,
    dash: Option<Option<(f32, f32)>>,
    alphas: BTreeSet<(bool, u8)>,
    glyphs: BTreeSet<(bool, u16)>,
}

fn rgb_op(out: &mut Vec<u8>, c: [u8; 3], op: &str) {
    for v in c {
        num(out, f32::from(v) / 255.0);
        out.push(b' ');
    }
    out.extend_from_slice(op.as_bytes());
    out.push(b'\n');
}

impl Writer {
    fn set_fill(&mut self, c: Rgba) {
        let rgb = [c.r, c.g, c.b];
        if self.fill != Some(rgb) {
            rgb_op(&mut self.out, rgb, "rg");
            self.fill = Some(rgb);
        }
        if self.fill_alpha != c.a {
            let _ = writeln!(self.out, "/F{} gs", c.a);
            self.alphas.insert((false, c.a));
            self.fill_alpha = c.a;
        }
    }

    fn set_stroke(&mut self, s: &Stroke) {
        let c = s.color;
        let rgb = [c.r, c.g, c.b];
        if self.stroke != Some(rgb) {
            rgb_op(&mut self.out, rgb, "RG");
            self.stroke = Some(rgb);
        }
        if self.stroke_alpha != c.a {
            let _ = writeln!(self.out, "/S{} gs", c.a);
            self.alphas.insert((true, c.a));
            self.stroke_alpha = c.a;
        }
        if self.width != Some(s.width_mm) {
            num(&mut self.out, s.width_mm);
            self.out.extend_from_slice(b" w\n");
            self.width = Some(s.width_mm);
        }
        if self.dash != Some(s.dash_mm) {
            match s.dash_mm {
                Some((on, off)) => {
                    self.out.push(b'[');
                    nums(&mut self.out, &[on, off]);
                    self.out.extend_from_slice(b"] 0 d\n");
                }
                None => self.out.extend_from_slice(b"[] 0 d\n"),
            }
            self.dash = Some(s.dash_mm);
        }
    }

    fn circle(&mut self, c: [f32; 2], r: f32) {
        let [x, y] = c;
        let k = KAPPA * r;
        let o = &mut self.out;
        nums(o, &[x + r, y]);
        o.extend_from_slice(b"m ");
        nums(o, &[x + r, y + k, x + k, y + r, x, y + r]);
        o.extend_from_slice(b"c ");
        nums(o, &[x - k, y + r, x - r, y + k, x - r, y]);
        o.extend_from_slice(b"c ");
        nums(o, &[x - r, y - k, x - k, y - r, x, y - r]);
        o.extend_from_slice(b"c ");
        nums(o, &[x + k, y - r, x + r, y - k, x + r, y]);
        o.extend_from_slice(b"c h\n");
    }

    fn poly(&mut self, pts: &[[f32; 2]], close: bool) {
        for (i, p) in pts.iter().enumerate() {
            nums(&mut self.out, p);
            self.out
                .extend_from_slice(if i == 0 { b"m " } else { b"l " });
        }
        if close {
            self.out.extend_from_slice(b"h");
        }
        self.out.push(b'\n');
    }

    /// Paints the current path: fill (even-odd when asked), stroke, both
    /// or neither.
    fn paint(&mut self, fill: Option<Rgba>, stroke: Option<&Stroke>, even_odd: bool) {
        let stroke = stroke.filter(|s| s.width_mm > 0.0);
        if let Some(f) = fill {
            self.set_fill(f);
        }
        if let Some(s) = stroke {
            self.set_stroke(s);
        }
        let op: &[u8] = match (fill.is_some(), stroke.is_some(), even_odd) {
            (true, true, false) => b"B\n",
            (true, true, true) => b"B*\n",
            (true, false, false) => b"f\n",
            (true, false, true) => b"f*\n",
            (false, true, _) => b"S\n",
            (false, false, _) => b"n\n",
        };
        self.out.extend_from_slice(op);
    }

    fn item(&mut self, item: &Item) {
        match item {
            Item::Marker {
                centre_mm,
                radius_mm,
                shape,
                fill,
                stroke,
            } => {
                if !(*radius_mm > 0.0) {
                    return;
                }
                match shape {
                    Shape::Disc => self.circle(*centre_mm, *radius_mm),
                    Shape::Ring => {
                        self.circle(*centre_mm, *radius_mm);
                        self.circle(*centre_mm, radius_mm * RING_INNER);
                    }
                    _ => {
                        let pts =
                            marker_polygon(*shape, *centre_mm, *radius_mm).unwrap_or_default();
                        self.poly(&pts, true);
                    }
                }
                self.paint(*fill, stroke.as_ref(), *shape == Shape::Ring);
            }
            Item::Stars {
                centres_mm,
                radii_mm,
                fills,
                outline,
            } => {
                let outline = outline.filter(|s| s.width_mm > 0.0);
                if let Some(s) = &outline {
                    self.set_stroke(s);
                }
                let form: &[u8] = if outline.is_some() { b"/Ds" } else { b"/Df" };
                for (i, (c, r)) in centres_mm.iter().zip(radii_mm).enumerate() {
                    if !(*r > 0.0) {
                        continue;
                    }
                    self.set_fill(fills.get(i).copied().unwrap_or(Rgba::rgb(255, 255, 255)));
                    self.out.extend_from_slice(b"q ");
                    nums(&mut self.out, &[*r, 0.0, 0.0, *r, c[0], c[1]]);
                    self.out.extend_from_slice(b"cm ");
                    if let Some(s) = &outline {
                        num(&mut self.out, s.width_mm / r);
                        self.out.extend_from_slice(b" w ");
                    }
                    self.out.extend_from_slice(form);
                    self.out.extend_from_slice(b" Do Q\n");
                }
                // The line width inside q … Q was restored.
            }
            Item::Line {
                points_mm,
                closed,
                stroke,
            } => {
                if points_mm.len() < 2 {
                    return;
                }
                self.poly(points_mm, *closed);
                self.paint(None, Some(stroke), false);
            }
            Item::Polygon {
                points_mm,
                fill,
                stroke,
            } => {
                if points_mm.len() < 2 {
                    return;
                }
                self.poly(points_mm, true);
                self.paint(Some(*fill), stroke.as_ref(), false);
            }
            Item::Text {
                position_mm,
                text: t,
                size_pt,
                color,
                anchor,
                bold,
                rotation_deg,
            } => {
                if t.is_empty() || !(*size_pt > 0.0) {
                    return;
                }
                let (glyphs, width_em) = text::layout(t, *bold);
                let shift = anchor_shift_em(*anchor, width_em);
                let size = size_pt * MM_PER_PT;
                let (s, c) = rotation_deg.to_radians().sin_cos();
                let [ax, ay] = *position_mm;
                self.set_fill(*color);
                for g in glyphs {
                    if text::glyph_outline(g.glyph_id, *bold).is_empty() {
                        continue;
                    }
                    self.glyphs.insert((*bold, g.glyph_id));
                    let dx = (shift + g.x_em) * size;
                    self.out.extend_from_slice(b"q ");
                    nums(
                        &mut self.out,
                        &[
                            c * size,
                            -s * size,
                            -s * size,
                            -c * size,
                            ax + c * dx,
                            ay - s * dx,
                        ],
                    );
                    let _ = writeln!(self.out, "cm /{} Do Q", glyph_name(*bold, g.glyph_id));
                }
            }
        }
    }
}

fn glyph_name(bold: bool, gid: u16) -> String {
    format!("G{}_{gid}", if bold { "b" } else { "r" })
}

fn glyph_form(bold: bool, gid: u16) -> (Vec<u8>, Rect) {
    let mut out = Vec::new();
    let (mut x0, mut y0, mut x1, mut y1) = (0f32, 0f32, 0f32, 0f32);
    let mut grow = |p: &[f32; 2]| {
        x0 = x0.min(p[0]);
        y0 = y0.min(p[1]);
        x1 = x1.max(p[0]);
        y1 = y1.max(p[1]);
    };
    let (mut cur, mut start) = ([0f32; 2], [0f32; 2]);
    // Coordinates in thousandths of an em keep 3 decimals meaningful.
    let k = 1000.0;
    for seg in text::glyph_outline(gid, bold).iter() {
        match *seg {
            Segment::MoveTo(a) => {
                grow(&a);
                nums(&mut out, &[a[0] * k, a[1] * k]);
                out.extend_from_slice(b"m\n");
                cur = a;
                start = a;
            }
            Segment::LineTo(a) => {
                grow(&a);
                nums(&mut out, &[a[0] * k, a[1] * k]);
                out.extend_from_slice(b"l\n");
                cur = a;
            }
            Segment::QuadTo(c, a) => {
                // Quadratic to cubic: controls 2/3 of the way to the control point.
                grow(&c);
                grow(&a);
                let c1 = [
                    cur[0] + 2.0 / 3.0 * (c[0] - cur[0]),
                    cur[1] + 2.0 / 3.0 * (c[1] - cur[1]),
                ];
                let c2 = [
                    a[0] + 2.0 / 3.0 * (c[0] - a[0]),
                    a[1] + 2.0 / 3.0 * (c[1] - a[1]),
                ];
                nums(
                    &mut out,
                    &[
                        c1[0] * k,
                        c1[1] * k,
                        c2[0] * k,
                        c2[1] * k,
                        a[0] * k,
                        a[1] * k,
                    ],
                );
                out.extend_from_slice(b"c\n");
                cur = a;
            }
            Segment::CubicTo(c1, c2, a) => {
                grow(&c1);
                grow(&c2);
                grow(&a);
                nums(
                    &mut out,
                    &[
                        c1[0] * k,
                        c1[1] * k,
                        c2[0] * k,
                        c2[1] * k,
                        a[0] * k,
                        a[1] * k,
                    ],
                );
                out.extend_from_slice(b"c\n");
                cur = a;
            }
            Segment::Close => {
                out.extend_from_slice(b"h\n");
                cur = start;
            }
        }
    }
    out.extend_from_slice(b"f\n");
    let m = 20.0;
    let rect = Rect::new(
        x0 * 1000.0 - m,
        y0 * 1000.0 - m,
        x1 * 1000.0 + m,
        y1 * 1000.0 + m,
    );
    (out, rect)
}

fn compress(data: &[u8]) -> Vec<u8> {
    let level = if data.len() > 4 << 20 { 1 } else { 6 };
    miniz_oxide::deflate::compress_to_vec_zlib(data, level)
}

/// The whole PDF document for `scenes`, one page each.
pub fn pdf_bytes(scenes: &[Scene]) -> Vec<u8> {
    let mut alphas = BTreeSet::new();
    let mut glyphs = BTreeSet::new();
    let mut contents = Vec::with_capacity(scenes.len());
    for scene in scenes {
        let mut w = Writer {
            out: Vec::with_capacity(4096),
            fill: None,
            stroke: None,
            fill_alpha: 255,
            stroke_alpha: 255,
            width: None,
            dash: None,
            alphas: BTreeSet::new(),
            glyphs: BTreeSet::new(),
        };
        // Millimetres, y down from the top-left corner.
        w.out.extend_from_slice(b"q ");
        nums(
            &mut w.out,
            &[
                PT_PER_MM,
                0.0,
                0.0,
                -PT_PER_MM,
                0.0,
                scene.height_mm * PT_PER_MM,
            ],
        );
        w.out.extend_from_slice(b"cm\n0 J 1 j\n");
        w.poly(
            &[
                [0.0, 0.0],
                [scene.width_mm, 0.0],
                [scene.width_mm, scene.height_mm],
                [0.0, scene.height_mm],
            ],
            true,
        );
        w.paint(Some(scene.background), None, false);
        for item in &scene.items {
            w.item(item);
        }
        w.out.extend_from_slice(b"Q\n");
        alphas.extend(w.alphas.iter().copied());
        glyphs.extend(w.glyphs.iter().copied());
        contents.push(compress(&w.out));
    }

    let mut pdf = Pdf::new();
    let mut next = 1;
    let mut alloc = || {
        let r = Ref::new(next);
        next += 1;
        r
    };
    let catalog_id = alloc();
    let tree_id = alloc();
    let disc_fill = alloc();
    let disc_stroke = alloc();
    let alpha_ids: BTreeMap<(bool, u8), Ref> = alphas.iter().map(|k| (*k, alloc())).collect();
    let glyph_ids: BTreeMap<(bool, u16), Ref> = glyphs.iter().map(|k| (*k, alloc())).collect();
    let page_ids: Vec<(Ref, Ref)> = scenes.iter().map(|_| (alloc(), alloc())).collect();

    pdf.catalog(catalog_id).pages(tree_id);
    pdf.pages(tree_id)
        .kids(page_ids.iter().map(|p| p.0))
        .count(scenes.len() as i32);

    // Unit discs: fill only, and fill plus stroke.
    let mut unit = Writer {
        out: Vec::new(),
        fill: None,
        stroke: None,
        fill_alpha: 255,
        stroke_alpha: 255,
        width: None,
        dash: None,
        alphas: BTreeSet::new(),
        glyphs: BTreeSet::new(),
    };
    unit.circle([0.0, 0.0], 1.0);
    let mut fill_disc = unit.out.clone();
    fill_disc.extend_from_slice(b"f\n");
    let mut stroke_disc = unit.out;
    stroke_disc.extend_from_slice(b"B\n");
    let bbox = Rect::new(-16.0, -16.0, 16.0, 16.0);
    pdf.form_xobject(disc_fill, &fill_disc).bbox(bbox);
    pdf.form_xobject(disc_stroke, &stroke_disc).bbox(bbox);

    for (&(stroking, a), &id) in &alpha_ids {
        let mut g = pdf.ext_graphics(id);
        if stroking {
            g.stroking_alpha(f32::from(a) / 255.0);
        } else {
            g.non_stroking_alpha(f32::from(a) / 255.0);
        }
    }
    for (&(bold, gid), &id) in &glyph_ids {
        let (data, rect) = glyph_form(bold, gid);
        // Outline coordinates are in thousandths of an em.
        pdf.form_xobject(id, &data)
            .bbox(rect)
            .matrix([0.001, 0.0, 0.0, 0.001, 0.0, 0.0]);
    }

    for (scene, ((page_id, content_id), content)) in
        scenes.iter().zip(page_ids.iter().zip(&contents))
    {
        let mut page = pdf.page(*page_id);
        page.parent(tree_id)
            .media_box(Rect::new(
                0.0,
                0.0,
                round2(scene.width_mm * PT_PER_MM),
                round2(scene.height_mm * PT_PER_MM),
            ))
            .contents(*content_id);
        let mut res = page.resources();
        {
            let mut xo = res.x_objects();
            xo.pair(Name(b"Df"), disc_fill);
            xo.pair(Name(b"Ds"), disc_stroke);
            for (&(bold, gid), &id) in &glyph_ids {
                let name = glyph_name(bold, gid);
                xo.pair(Name(name.as_bytes()), id);
            }
        }
        if !alpha_ids.is_empty() {
            let mut gs = res.ext_g_states();
            for (&(stroking, a), &id) in &alpha_ids {
                let name = format!("{}{a}", if stroking { "S" } else { "F" });
                gs.pair(Name(name.as_bytes()), id);
            }
        }
        drop(res);
        page.finish();
        pdf.stream(*content_id, content).filter(Filter::FlateDecode);
    }
    pdf.finish()
}

fn round2(v: f32) -> f32 {
    (v * 100.0).round() / 100.0
}
