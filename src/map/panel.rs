//! The panel beside the map: title block, scale bars, legend. Each block
//! is drawn at (0, 0) and moved into place by the sheet layout.

use crate::map::layout::PANEL_COLUMN_MM;
use crate::map::scale::{format_number, nice_floor};
use crate::map::style::{BODY_PT, HEADING_PT, MM_PER_PT, Palette, Symbol, TITLE_PT, radius_mm};
use crate::render::scene::{Anchor, Item, Rgba, Shape, Stroke};
use crate::render::text::text_width_mm;
use crate::units::LY_PER_PC;

/// A block of the panel, drawn from its top-left corner at (0, 0).
#[derive(Debug, Clone)]
pub struct Block {
    /// Items in block coordinates, mm.
    pub items: Vec<Item>,
    /// Height, mm.
    pub height_mm: f32,
}

/// A text item.
pub fn text(
    x: f32,
    y: f32,
    s: &str,
    size_pt: f32,
    color: Rgba,
    bold: bool,
    anchor: Anchor,
) -> Item {
    Item::Text {
        position_mm: [x, y],
        text: s.to_string(),
        size_pt,
        color,
        anchor,
        bold,
        rotation_deg: 0.0,
    }
}

/// A straight line item.
pub fn line(a: [f32; 2], b: [f32; 2], stroke: Stroke) -> Item {
    Item::Line {
        points_mm: vec![a, b],
        closed: false,
        stroke,
    }
}

/// Cuts `s` so that it fits `width_mm` at `size_pt`, ending in "...".
fn fit_text(s: &str, size_pt: f32, bold: bool, width_mm: f32) -> String {
    if text_width_mm(s, size_pt, bold) <= width_mm {
        return s.to_string();
    }
    let mut out: String = s.to_string();
    while !out.is_empty() && text_width_mm(&format!("{out}..."), size_pt, bold) > width_mm {
        out.pop();
    }
    format!("{}...", out.trim_end())
}

/// Moves items by (dx, dy) mm.
pub fn translate(items: &mut [Item], dx: f32, dy: f32) {
    let m = |p: &mut [f32; 2]| {
        p[0] += dx;
        p[1] += dy;
    };
    for item in items {
        match item {
            Item::Marker { centre_mm, .. } => m(centre_mm),
            Item::Stars { centres_mm, .. } => centres_mm.iter_mut().for_each(m),
            Item::Line { points_mm, .. } | Item::Polygon { points_mm, .. } => {
                points_mm.iter_mut().for_each(m)
            }
            Item::Text { position_mm, .. } => m(position_mm),
        }
    }
}

fn heading(items: &mut Vec<Item>, y: f32, title: &str, pal: &Palette) -> f32 {
    let em = HEADING_PT * MM_PER_PT;
    items.push(text(
        0.0,
        y + em,
        title,
        HEADING_PT,
        pal.ink,
        true,
        Anchor::Start,
    ));
    items.push(line(
        [0.0, y + em * 1.35],
        [PANEL_COLUMN_MM, y + em * 1.35],
        Palette::stroke(pal.muted, 0.15),
    ));
    y + em * 1.35 + 2.0
}

/// The title block: the title, then one line per fact.
pub fn title_block(title: &str, facts: &[String], pal: &Palette) -> Block {
    let mut items = Vec::new();
    let em = TITLE_PT * MM_PER_PT;
    let t = fit_text(title, TITLE_PT, true, PANEL_COLUMN_MM);
    items.push(text(
        0.0,
        em * 0.9,
        &t,
        TITLE_PT,
        pal.ink,
        true,
        Anchor::Start,
    ));
    items.push(line(
        [0.0, em * 1.3],
        [PANEL_COLUMN_MM, em * 1.3],
        Palette::stroke(pal.ink, 0.3),
    ));
    let mut y = em * 1.3 + 1.5;
    let line_mm = BODY_PT * MM_PER_PT * 1.3;
    for f in facts {
        y += line_mm;
        let f = fit_text(f, BODY_PT, false, PANEL_COLUMN_MM);
        items.push(text(0.0, y, &f, BODY_PT, pal.ink, false, Anchor::Start));
    }
    Block {
        items,
        height_mm: y + 1.5,
    }
}

/// One alternating black-and-white bar of `n` segments of `segment_mm`.
fn bar(items: &mut Vec<Item>, y: f32, n: usize, segment_mm: f32, pal: &Palette) {
    let h = 1.6;
    for i in 0..n {
        let x0 = i as f32 * segment_mm;
        let fill = if i % 2 == 0 { pal.ink } else { pal.background };
        items.push(Item::Polygon {
            points_mm: vec![
                [x0, y],
                [x0 + segment_mm, y],
                [x0 + segment_mm, y + h],
                [x0, y + h],
            ],
            fill,
            stroke: Some(Palette::stroke(pal.ink, 0.15)),
        });
    }
}

/// Segments for a bar of `length` units: 4 for round 1, 2, 10…, 5 for 5s,
/// 5 for 2.5s (halves).
fn segments(length: f64) -> usize {
    let lead = length / 10f64.powf(length.log10().floor());
    if (lead - 5.0).abs() < 1e-6 || (lead - 2.5).abs() < 1e-6 {
        5
    } else {
        4
    }
}

/// Scale bars in light years and parsecs for `mm_per_ly`.
pub fn scale_block(mm_per_ly: f64, note: Option<&str>, pal: &Palette) -> Block {
    let mut items = Vec::new();
    let mut y = heading(&mut items, 0.0, "Scale", pal);
    let max_mm = f64::from(PANEL_COLUMN_MM) - 14.0;
    let em = BODY_PT * MM_PER_PT;
    for (unit, per_ly) in [("ly", 1.0), ("pc", 1.0 / LY_PER_PC)] {
        // Length in this unit whose bar fits the column.
        let length = nice_floor(max_mm / mm_per_ly * per_ly);
        let bar_mm = (length / per_ly * mm_per_ly) as f32;
        let n = segments(length);
        bar(&mut items, y, n, bar_mm / n as f32, pal);
        items.push(text(
            0.0,
            y + 1.6 + em * 1.1,
            "0",
            BODY_PT,
            pal.ink,
            false,
            Anchor::Middle,
        ));
        items.push(text(
            bar_mm,
            y + 1.6 + em * 1.1,
            &format_number(length),
            BODY_PT,
            pal.ink,
            false,
            Anchor::Middle,
        ));
        items.push(text(
            bar_mm + 3.0,
            y + 1.6,
            unit,
            BODY_PT,
            pal.ink,
            false,
            Anchor::Start,
        ));
        y += 1.6 + em * 1.1 + 2.5;
    }
    if let Some(note) = note {
        y += em;
        let n = fit_text(note, BODY_PT, false, PANEL_COLUMN_MM);
        items.push(text(0.0, y, &n, BODY_PT, pal.muted, false, Anchor::Start));
    }
    Block {
        items,
        height_mm: y + 1.0,
    }
}

/// What the symbol key lists besides the kinds.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct KeyExtras {
    /// Stalks are drawn.
    pub stalks: bool,
    /// Generated rows are faded.
    pub generated: bool,
    /// Network links are drawn.
    pub links: bool,
    /// A route is drawn.
    pub route: bool,
}

/// Draws one legend symbol centred at (x, y).
pub fn symbol_items(
    items: &mut Vec<Item>,
    symbol: Symbol,
    centre: [f32; 2],
    radius: f32,
    fill: Rgba,
    pal: &Palette,
) {
    let (shape, filled) = symbol.shape();
    let outline = pal.star_outline.unwrap_or(Palette::stroke(fill, 0.1));
    items.push(Item::Marker {
        centre_mm: centre,
        radius_mm: radius,
        shape,
        fill: filled.then_some(fill),
        stroke: Some(if filled {
            outline
        } else {
            Palette::stroke(pal.ink, 0.25)
        }),
    });
}

/// The symbol key: one row per kind, then multiple systems, stalks and
/// overlay lines.
pub fn symbols_block(extras: KeyExtras, pal: &Palette) -> Block {
    let mut items = Vec::new();
    let mut y = heading(&mut items, 0.0, "Symbols", pal);
    let row = 4.3;
    let em = BODY_PT * MM_PER_PT;
    let sample = Rgba::rgb(255, 214, 170);
    let put = |items: &mut Vec<Item>, y: &mut f32, label: &str| {
        items.push(text(
            8.0,
            *y + em * 0.35,
            label,
            BODY_PT,
            pal.ink,
            false,
            Anchor::Start,
        ));
        *y += row;
    };
    y += row / 2.0;
    for (symbol, label) in Symbol::LEGEND {
        symbol_items(&mut items, symbol, [3.0, y], 1.2, sample, pal);
        put(&mut items, &mut y, label);
    }
    symbol_items(&mut items, Symbol::Disc, [3.0, y], 0.9, sample, pal);
    items.push(Item::Marker {
        centre_mm: [3.0, y],
        radius_mm: 1.6,
        shape: Shape::Ring,
        fill: None,
        stroke: Some(Palette::stroke(pal.ink, 0.15)),
    });
    put(&mut items, &mut y, "multiple system (ring)");
    if extras.generated {
        items.push(Item::Marker {
            centre_mm: [3.0, y],
            radius_mm: 1.2,
            shape: Shape::Disc,
            fill: Some(Rgba { a: 90, ..sample }),
            stroke: None,
        });
        put(&mut items, &mut y, "generated (faded)");
    }
    if extras.stalks {
        items.push(line(
            [1.0, y - 1.5],
            [1.0, y + 1.5],
            Palette::stroke(pal.stalk, 0.2),
        ));
        items.push(line(
            [5.0, y - 1.5],
            [5.0, y + 1.5],
            Stroke {
                dash_mm: Some((0.6, 0.4)),
                ..Palette::stroke(pal.stalk, 0.2)
            },
        ));
        put(&mut items, &mut y, "stalk above / below plane");
    }
    if extras.links {
        items.push(line([0.0, y], [6.0, y], Palette::stroke(pal.link, 0.2)));
        put(&mut items, &mut y, "jump link");
    }
    if extras.route {
        items.push(line([0.0, y], [6.0, y], Palette::stroke(pal.route, 0.6)));
        put(&mut items, &mut y, "route");
    }
    Block {
        items,
        height_mm: y - row / 2.0 + 1.0,
    }
}

/// Class colours: one disc per spectral class letter present.
pub fn colours_block(classes: &[(char, Rgba)], pal: &Palette) -> Block {
    let mut items = Vec::new();
    let mut y = heading(&mut items, 0.0, "Colour by class", pal);
    let em = BODY_PT * MM_PER_PT;
    let step = (PANEL_COLUMN_MM / classes.len().max(7) as f32).min(8.0);
    y += 1.8;
    for (i, (letter, colour)) in classes.iter().enumerate() {
        let x = 2.5 + i as f32 * step;
        items.push(Item::Marker {
            centre_mm: [x, y],
            radius_mm: 1.5,
            shape: Shape::Disc,
            fill: Some(*colour),
            stroke: pal.star_outline,
        });
        items.push(text(
            x,
            y + 1.5 + em * 1.1,
            &letter.to_string(),
            BODY_PT,
            pal.ink,
            false,
            Anchor::Middle,
        ));
    }
    Block {
        items,
        height_mm: y + 1.5 + em * 1.1 + 1.5,
    }
}

/// Size key: discs for four luminosities at the sheet's crowding.
pub fn sizes_block(crowding: f32, floor_mm: f32, pal: &Palette) -> Block {
    let mut items = Vec::new();
    let mut y = heading(&mut items, 0.0, "Size: luminosity (Sun = 1)", pal);
    let em = BODY_PT * MM_PER_PT;
    let radius = radius_mm(1e4, crowding, floor_mm);
    y += radius.max(1.0);
    for (i, (lum, label)) in [(0.01, "0.01"), (1.0, "1"), (100.0, "100"), (1e4, "10000")]
        .into_iter()
        .enumerate()
    {
        let x = 3.0 + i as f32 * 13.0;
        items.push(Item::Marker {
            centre_mm: [x, y],
            radius_mm: radius_mm(lum, crowding, floor_mm),
            shape: Shape::Disc,
            fill: Some(Rgba::rgb(255, 240, 220)),
            stroke: Some(pal.star_outline.unwrap_or(Palette::stroke(pal.muted, 0.1))),
        });
        items.push(text(
            x,
            y + radius.max(1.0) + em * 1.1,
            label,
            BODY_PT,
            pal.ink,
            false,
            Anchor::Middle,
        ));
    }
    Block {
        items,
        height_mm: y + radius.max(1.0) + em * 1.1 + 1.5,
    }
}
