//! SVG output: the page in millimetres (`width`/`height` in mm and a
//! `viewBox` in mm, so one user unit is one millimetre), stars as vector
//! circles, markers as vector shapes, text as `<text>` in Noto Sans.
//!
//! # Source
//! Scalable Vector Graphics (SVG) 1.1 (Second Edition), W3C
//! Recommendation, 16 August 2011: §7.10 (units), §9 (basic shapes),
//! §10 (text).

use crate::render::raster::{RING_INNER, marker_polygon};
use crate::render::scene::{Anchor, Item, Rgba, Scene, Shape, Stroke};
use crate::render::text::{FONT_FAMILY, MM_PER_PT};
use std::fmt::Write;

/// Numbers with at most 3 decimals (1 µm), trailing zeros dropped.
fn num(out: &mut String, v: f32) {
    let r = (f64::from(v) * 1000.0).round() / 1000.0;
    let r = if r == 0.0 { 0.0 } else { r };
    let _ = write!(out, "{r}");
}

fn color(c: Rgba) -> String {
    format!("#{:02x}{:02x}{:02x}", c.r, c.g, c.b)
}

fn fill_attrs(out: &mut String, fill: Option<Rgba>) {
    match fill {
        Some(c) => {
            let _ = write!(out, " fill=\"{}\"", color(c));
            if c.a < 255 {
                let _ = write!(out, " fill-opacity=\"{:.3}\"", f32::from(c.a) / 255.0);
            }
        }
        None => out.push_str(" fill=\"none\""),
    }
}

fn stroke_attrs(out: &mut String, stroke: Option<&Stroke>) {
    let Some(s) = stroke else {
        return;
    };
    let _ = write!(out, " stroke=\"{}\" stroke-width=\"", color(s.color));
    num(out, s.width_mm);
    out.push('"');
    if s.color.a < 255 {
        let _ = write!(
            out,
            " stroke-opacity=\"{:.3}\"",
            f32::from(s.color.a) / 255.0
        );
    }
    if let Some((on, off)) = s.dash_mm {
        out.push_str(" stroke-dasharray=\"");
        num(out, on);
        out.push(' ');
        num(out, off);
        out.push('"');
    }
}

fn points(out: &mut String, pts: &[[f32; 2]]) {
    out.push_str(" points=\"");
    for (i, p) in pts.iter().enumerate() {
        if i > 0 {
            out.push(' ');
        }
        num(out, p[0]);
        out.push(',');
        num(out, p[1]);
    }
    out.push('"');
}

fn circle(out: &mut String, c: [f32; 2], r: f32, fill: Option<Rgba>, stroke: Option<&Stroke>) {
    out.push_str("<circle cx=\"");
    num(out, c[0]);
    out.push_str("\" cy=\"");
    num(out, c[1]);
    out.push_str("\" r=\"");
    num(out, r);
    out.push('"');
    fill_attrs(out, fill);
    stroke_attrs(out, stroke);
    out.push_str("/>\n");
}

/// Escapes the five XML special characters.
pub fn xml_escape(text: &str) -> String {
    let mut s = String::with_capacity(text.len());
    for ch in text.chars() {
        match ch {
            '&' => s.push_str("&amp;"),
            '<' => s.push_str("&lt;"),
            '>' => s.push_str("&gt;"),
            '"' => s.push_str("&quot;"),
            '\'' => s.push_str("&apos;"),
            c => s.push(c),
        }
    }
    s
}

/// The whole SVG document for `scene`.
pub fn svg_string(scene: &Scene) -> String {
    let mut out = String::with_capacity(1024 + 80 * item_count(scene));
    let (w, h) = (scene.width_mm, scene.height_mm);
    out.push_str("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
    out.push_str("<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"");
    num(&mut out, w);
    out.push_str("mm\" height=\"");
    num(&mut out, h);
    out.push_str("mm\" viewBox=\"0 0 ");
    num(&mut out, w);
    out.push(' ');
    num(&mut out, h);
    out.push_str("\">\n<rect x=\"0\" y=\"0\" width=\"");
    num(&mut out, w);
    out.push_str("\" height=\"");
    num(&mut out, h);
    out.push('"');
    fill_attrs(&mut out, Some(scene.background));
    out.push_str("/>\n");
    for item in &scene.items {
        write_item(&mut out, item);
    }
    out.push_str("</svg>\n");
    out
}

fn item_count(scene: &Scene) -> usize {
    scene
        .items
        .iter()
        .map(|i| match i {
            Item::Stars { centres_mm, .. } => centres_mm.len(),
            _ => 1,
        })
        .sum()
}

fn write_item(out: &mut String, item: &Item) {
    match item {
        Item::Marker {
            centre_mm,
            radius_mm,
            shape,
            fill,
            stroke,
        } => match shape {
            Shape::Disc => circle(out, *centre_mm, *radius_mm, *fill, stroke.as_ref()),
            Shape::Ring => {
                // An annulus: two circles filled even-odd.
                let [cx, cy] = *centre_mm;
                let mut d = String::new();
                for r in [*radius_mm, radius_mm * RING_INNER] {
                    let _ = write!(
                        d,
                        "M{:.3},{:.3}a{r:.3},{r:.3} 0 1,0 {:.3},0a{r:.3},{r:.3} 0 1,0 {:.3},0z",
                        cx - r,
                        cy,
                        2.0 * r,
                        -2.0 * r
                    );
                }
                let _ = write!(out, "<path fill-rule=\"evenodd\" d=\"{d}\"");
                fill_attrs(out, *fill);
                stroke_attrs(out, stroke.as_ref());
                out.push_str("/>\n");
            }
            _ => {
                let pts = marker_polygon(*shape, *centre_mm, *radius_mm).unwrap_or_default();
                out.push_str("<polygon");
                points(out, &pts);
                fill_attrs(out, *fill);
                stroke_attrs(out, stroke.as_ref());
                out.push_str("/>\n");
            }
        },
        Item::Stars {
            centres_mm,
            radii_mm,
            fills,
            outline,
        } => {
            out.push_str("<g");
            stroke_attrs(out, outline.as_ref());
            out.push_str(">\n");
            for (i, (c, r)) in centres_mm.iter().zip(radii_mm).enumerate() {
                let f = fills.get(i).copied().unwrap_or(Rgba::rgb(255, 255, 255));
                circle(out, *c, *r, Some(f), None);
            }
            out.push_str("</g>\n");
        }
        Item::Line {
            points_mm,
            closed,
            stroke,
        } => {
            out.push_str(if *closed { "<polygon" } else { "<polyline" });
            points(out, points_mm);
            fill_attrs(out, None);
            stroke_attrs(out, Some(stroke));
            out.push_str(" stroke-linejoin=\"round\"/>\n");
        }
        Item::Polygon {
            points_mm,
            fill,
            stroke,
        } => {
            out.push_str("<polygon");
            points(out, points_mm);
            fill_attrs(out, Some(*fill));
            stroke_attrs(out, stroke.as_ref());
            out.push_str(" stroke-linejoin=\"round\"/>\n");
        }
        Item::Text {
            position_mm,
            text,
            size_pt,
            color,
            anchor,
            bold,
            rotation_deg,
        } => {
            out.push_str("<text x=\"");
            num(out, position_mm[0]);
            out.push_str("\" y=\"");
            num(out, position_mm[1]);
            let _ = write!(
                out,
                "\" font-family=\"{FONT_FAMILY}, sans-serif\" font-size=\"{:.3}\"",
                size_pt * MM_PER_PT
            );
            if *bold {
                out.push_str(" font-weight=\"bold\"");
            }
            match anchor {
                Anchor::Start => {}
                Anchor::Middle => out.push_str(" text-anchor=\"middle\""),
                Anchor::End => out.push_str(" text-anchor=\"end\""),
            }
            if rotation_deg.abs() > 1e-3 {
                // SVG rotates clockwise on the y-down page.
                out.push_str(" transform=\"rotate(");
                num(out, -rotation_deg);
                out.push(' ');
                num(out, position_mm[0]);
                out.push(' ');
                num(out, position_mm[1]);
                out.push_str(")\"");
            }
            fill_attrs(out, Some(*color));
            let _ = writeln!(out, ">{}</text>", xml_escape(text));
        }
    }
}
