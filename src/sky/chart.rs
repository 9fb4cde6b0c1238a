//! The sky chart: a [`Scene`] of one all-sky map (or a stereographic
//! hemisphere) seen from inside the sphere, longitude increasing to the left.
//!
//! Dot radius falls linearly with magnitude between the brightest key
//! magnitude and the limit, clamped (common practice for printed atlases;
//! no standard exists). Stars fainter than the limit are not drawn.

use super::projection::{Projection, wrap_pi};
use super::{SkyStar, SkyView};
use crate::render::paper::{Paper, Theme};
use crate::render::scene::{Anchor, Item, Rgba, Scene, Shape, Stroke};

/// Magnitude drawn with the largest dot (about the brightest star of
/// Earth's night sky, −1.46; brighter objects get the same dot and a ring).
pub const BRIGHT_KEY_MAG: f64 = -1.5;

/// Millimetres per typographic point (1 pt = 1/72 in, 1 in = 25.4 mm).
const MM_PER_PT: f32 = 25.4 / 72.0;

/// Settings for [`sky_chart`].
#[derive(Debug, Clone, PartialEq)]
pub struct ChartOptions {
    /// The projection (stereographic carries the centre latitude).
    pub projection: Projection,
    /// Galactic longitude at the chart centre, degrees.
    pub centre_l_deg: f64,
    /// Paper size.
    pub paper: Paper,
    /// Landscape (true) or portrait.
    pub landscape: bool,
    /// Colour scheme.
    pub theme: Theme,
    /// How many of the brightest stars get a name label.
    pub labels: usize,
    /// Title; `None` for "The sky from NAME".
    pub title: Option<String>,
}

impl Default for ChartOptions {
    fn default() -> Self {
        ChartOptions {
            projection: Projection::HammerAitoff,
            centre_l_deg: 0.0,
            paper: Paper::A4,
            landscape: true,
            theme: Theme::Print,
            labels: 20,
            title: None,
        }
    }
}

struct Palette {
    page: Rgba,
    sky: Rgba,
    grid: Rgba,
    plane: Rgba,
    outline: Rgba,
    text: Rgba,
    faint_text: Rgba,
    dot_outline: Option<Stroke>,
}

fn palette(theme: Theme) -> Palette {
    match theme {
        Theme::Print => Palette {
            page: Rgba::rgb(255, 255, 255),
            sky: Rgba::rgb(246, 247, 251),
            grid: Rgba::rgb(190, 194, 206),
            plane: Rgba::rgb(120, 110, 170),
            outline: Rgba::rgb(60, 60, 70),
            text: Rgba::rgb(20, 20, 28),
            faint_text: Rgba::rgb(100, 100, 115),
            dot_outline: Some(Stroke {
                color: Rgba::rgb(40, 40, 50),
                width_mm: 0.08,
                dash_mm: None,
            }),
        },
        Theme::Screen => Palette {
            page: Rgba::rgb(10, 12, 20),
            sky: Rgba::rgb(3, 5, 14),
            grid: Rgba::rgb(45, 55, 85),
            plane: Rgba::rgb(110, 95, 170),
            outline: Rgba::rgb(120, 130, 160),
            text: Rgba::rgb(225, 228, 240),
            faint_text: Rgba::rgb(150, 155, 175),
            dot_outline: None,
        },
    }
}

/// Dot radius (mm) for an apparent magnitude: linear from `r_max_mm` at
/// [`BRIGHT_KEY_MAG`] to `r_min_mm` at `limit_mag`, clamped to that range.
pub fn dot_radius_mm(mag: f64, limit_mag: f64, r_min_mm: f32, r_max_mm: f32) -> f32 {
    let span = (limit_mag - BRIGHT_KEY_MAG).max(0.5);
    let t = ((limit_mag - mag) / span).clamp(0.0, 1.0) as f32;
    r_min_mm + t * (r_max_mm - r_min_mm)
}

/// Width of a line of regular text, mm, measured with the chart font.
pub fn text_width_mm(text: &str, size_pt: f32) -> f32 {
    crate::render::text::text_width_mm(text, size_pt, false)
}

/// Page frame of the chart: centre and scale (mm per projection unit).
struct Frame {
    cx: f32,
    cy: f32,
    scale: f32,
    projection: Projection,
    centre_l_rad: f64,
}

impl Frame {
    /// Page point of projection coordinates; x is mirrored so that
    /// longitude increases to the left.
    fn page(&self, x: f64, y: f64) -> [f32; 2] {
        [
            self.cx - self.scale * x as f32,
            self.cy - self.scale * y as f32,
        ]
    }

    /// Page point of a galactic direction (degrees), if on the chart.
    fn sky(&self, l_deg: f64, b_deg: f64) -> Option<[f32; 2]> {
        let lon = wrap_pi(l_deg.to_radians() - self.centre_l_rad);
        self.projection
            .forward(lon, b_deg.to_radians())
            .map(|(x, y)| self.page(x, y))
    }

    /// Page polylines through galactic directions, broken where points
    /// leave the chart or jump across the seam.
    fn polylines(&self, points: impl Iterator<Item = (f64, f64)>) -> Vec<Vec<[f32; 2]>> {
        let jump = self.scale * 1.0;
        let mut out: Vec<Vec<[f32; 2]>> = Vec::new();
        let mut cur: Vec<[f32; 2]> = Vec::new();
        for (l, b) in points {
            match self.sky(l, b) {
                Some(p) => {
                    if let Some(last) = cur.last()
                        && ((p[0] - last[0]).hypot(p[1] - last[1])) > jump
                    {
                        out.push(std::mem::take(&mut cur));
                    }
                    cur.push(p);
                }
                None => out.push(std::mem::take(&mut cur)),
            }
        }
        out.push(cur);
        out.retain(|l| l.len() >= 2);
        out
    }

    /// The boundary of the projected sky, page mm.
    fn outline(&self) -> Vec<[f32; 2]> {
        match self.projection {
            Projection::Stereographic { .. } => (0..=360)
                .map(|i| {
                    let a = f64::from(i).to_radians();
                    self.page(2.0 * a.cos(), 2.0 * a.sin())
                })
                .collect(),
            _ => {
                let pi = std::f64::consts::PI;
                let mut pts = Vec::new();
                for i in 0..=180 {
                    let lat = (f64::from(i) - 90.0).to_radians();
                    let (x, y) = self.projection.forward(pi, lat).unwrap_or((0.0, 0.0));
                    pts.push(self.page(x, y));
                }
                for i in 0..=180 {
                    let lat = (90.0 - f64::from(i)).to_radians();
                    let (x, y) = self.projection.forward(-pi, lat).unwrap_or((0.0, 0.0));
                    // forward wraps −π to +π; mirror by hand.
                    pts.push(self.page(-x.abs(), y));
                }
                pts
            }
        }
    }
}

fn text(
    position_mm: [f32; 2],
    text: String,
    size_pt: f32,
    color: Rgba,
    anchor: Anchor,
    bold: bool,
) -> Item {
    Item::Text {
        position_mm,
        text,
        size_pt,
        color,
        anchor,
        bold,
        rotation_deg: 0.0,
    }
}

/// Label text of a star: its name, with the separation for the observer's
/// own companions.
fn label_of(s: &SkyStar) -> String {
    match s.separation_au {
        Some(au) if au >= 100.0 => format!("{} ({:.0} au)", s.name, au),
        Some(au) => format!("{} ({:.2} au)", s.name, au),
        None => s.name.clone(),
    }
}

fn format_mag(m: f64) -> String {
    if m < 0.0 {
        format!("−{}", -m)
    } else {
        format!("{m}")
    }
}

/// Draws the sky of `view` as one page.
pub fn sky_chart(view: &SkyView, opts: &ChartOptions) -> Scene {
    let (w, h) = opts.paper.size_mm(opts.landscape);
    let pal = palette(opts.theme);
    let short = w.min(h);
    let margin = (short * 0.05).max(8.0);
    let title_pt = (short / 210.0 * 15.0).clamp(10.0, 40.0);
    let small_pt = (short / 210.0 * 6.5).clamp(5.0, 18.0);
    let title_h = title_pt * MM_PER_PT * 2.6;
    let key_h = small_pt * MM_PER_PT * 6.0;
    let (hx, hy) = opts.projection.half_extent();
    let area_w = w - 2.0 * margin;
    let area_h = h - 2.0 * margin - title_h - key_h;
    let scale = (area_w / (2.0 * hx as f32)).min(area_h / (2.0 * hy as f32));
    let frame = Frame {
        cx: w / 2.0,
        cy: margin + title_h + area_h / 2.0,
        scale,
        projection: opts.projection,
        centre_l_rad: opts.centre_l_deg.to_radians(),
    };
    let mut items = Vec::new();

    // The sky, graticule, galactic plane and outline.
    let outline = frame.outline();
    items.push(Item::Polygon {
        points_mm: outline.clone(),
        fill: pal.sky,
        stroke: None,
    });
    let thin = Stroke {
        color: pal.grid,
        width_mm: 0.12,
        dash_mm: None,
    };
    for k in 0..12 {
        let l = f64::from(k) * 30.0;
        let rel = wrap_pi(l.to_radians() - frame.centre_l_rad).abs();
        if !matches!(opts.projection, Projection::Stereographic { .. })
            && (rel - std::f64::consts::PI).abs() < 1e-9
        {
            continue; // on the outline
        }
        for pts in frame.polylines((-90..=90).map(|b| (l, f64::from(b)))) {
            items.push(Item::Line {
                points_mm: pts,
                closed: false,
                stroke: thin,
            });
        }
    }
    let c = opts.centre_l_deg;
    for b in [-60.0, -30.0, 30.0, 60.0] {
        let pts = (0..=360).map(|i| (c - 180.0 + f64::from(i) * 0.999_999 + 5e-7, b));
        for pts in frame.polylines(pts) {
            items.push(Item::Line {
                points_mm: pts,
                closed: false,
                stroke: thin,
            });
        }
    }
    let plane = Stroke {
        color: pal.plane,
        width_mm: 0.35,
        dash_mm: Some((2.0, 1.0)),
    };
    let pts = (0..=720).map(|i| (c - 180.0 + f64::from(i) * 0.5 * 0.999_999 + 5e-7, 0.0));
    for pts in frame.polylines(pts) {
        items.push(Item::Line {
            points_mm: pts,
            closed: false,
            stroke: plane,
        });
    }
    items.push(Item::Line {
        points_mm: outline,
        closed: true,
        stroke: Stroke {
            color: pal.outline,
            width_mm: 0.3,
            dash_mm: None,
        },
    });

    // Coordinate labels: longitudes along the plane, latitudes on the
    // centre meridian.
    for k in 0..12 {
        let l = f64::from(k) * 30.0;
        if let Some(p) = frame.sky(l, 0.0) {
            let rel = wrap_pi(l.to_radians() - frame.centre_l_rad).abs();
            if (rel - std::f64::consts::PI).abs() < 1e-9 {
                continue;
            }
            items.push(text(
                [p[0], p[1] + small_pt * MM_PER_PT * 1.3],
                format!("{l:.0}°"),
                small_pt * 0.9,
                pal.faint_text,
                Anchor::Middle,
                false,
            ));
        }
    }
    let centre_b = match opts.projection {
        Projection::Stereographic { centre_lat_rad } => centre_lat_rad.to_degrees(),
        _ => 0.0,
    };
    for b in [-60.0, -30.0, 30.0, 60.0] {
        if (b - centre_b).abs() > 89.0 {
            continue;
        }
        if let Some(p) = frame.sky(c, b) {
            let sign = if b < 0.0 { "−" } else { "+" };
            items.push(text(
                [p[0] + 0.8, p[1] - 0.6],
                format!("{sign}{:.0}°", b.abs()),
                small_pt * 0.9,
                pal.faint_text,
                Anchor::Start,
                false,
            ));
        }
    }

    // Stars, faintest first so bright dots sit on top.
    let limit = view.options.limit_mag;
    let r_max = (scale * 0.03).max(0.6);
    let r_min = 0.15_f32.max(scale * 0.003);
    let mut centres = Vec::new();
    let mut radii = Vec::new();
    let mut fills = Vec::new();
    let mut placed: Vec<(usize, [f32; 2], f32)> = Vec::new();
    for (i, s) in view.visible().iter().enumerate().rev() {
        if let Some(p) = frame.sky(s.l_deg, s.b_deg) {
            let r = dot_radius_mm(s.apparent_mag, limit, r_min, r_max);
            centres.push(p);
            radii.push(r);
            let [r8, g8, b8] = s.color_rgb;
            fills.push(Rgba::rgb(r8, g8, b8));
            placed.push((i, p, r));
        }
    }
    items.push(Item::Stars {
        centres_mm: centres,
        radii_mm: radii,
        fills,
        outline: pal.dot_outline,
    });
    for &(i, p, r) in &placed {
        if view.stars[i].apparent_mag < BRIGHT_KEY_MAG - 2.0 {
            items.push(Item::Marker {
                centre_mm: p,
                radius_mm: r * 1.7,
                shape: Shape::Ring,
                fill: None,
                stroke: Some(Stroke {
                    color: pal.text,
                    width_mm: 0.2,
                    dash_mm: None,
                }),
            });
        }
    }

    // Labels for the brightest stars, skipping any that would overlap.
    placed.sort_by_key(|&(i, _, _)| i);
    let label_pt = small_pt;
    let mut boxes: Vec<[f32; 4]> = Vec::new();
    for &(i, p, r) in placed.iter().take(opts.labels) {
        let s = &view.stars[i];
        let label = label_of(s);
        let tw = text_width_mm(&label, label_pt);
        let th = label_pt * MM_PER_PT;
        let x0 = p[0] + r + 0.6;
        let base = p[1] + th * 0.35;
        let bx = [x0, base - th, x0 + tw, base + th * 0.25];
        if boxes
            .iter()
            .any(|b| bx[0] < b[2] && b[0] < bx[2] && bx[1] < b[3] && b[1] < bx[3])
        {
            continue;
        }
        boxes.push(bx);
        items.push(text(
            [x0, base],
            label,
            label_pt,
            pal.text,
            Anchor::Start,
            false,
        ));
    }

    // Title and subtitle.
    let title = opts
        .title
        .clone()
        .unwrap_or_else(|| format!("The sky from {}", view.observer.name));
    items.push(text(
        [margin, margin + title_pt * MM_PER_PT],
        title,
        title_pt,
        pal.text,
        Anchor::Start,
        true,
    ));
    let mut sub = format!(
        "Galactic coordinates seen from inside the sky (longitude increases to the left), {} projection",
        opts.projection.display_name()
    );
    if let Projection::Stereographic { centre_lat_rad } = opts.projection {
        sub.push_str(&format!(
            " centred on l {:.0}°, b {:.0}°",
            opts.centre_l_deg.rem_euclid(360.0),
            centre_lat_rad.to_degrees()
        ));
    }
    sub.push_str(&format!(
        ". {} of {} brighter than V {}",
        view.visible_count,
        crate::report::counted(view.stars.len() as u64, "star", "stars"),
        format_mag(limit)
    ));
    if view.options.extinction_mag_per_kly > 0.0 {
        sub.push_str(&format!(
            ", extinction {} mag per 1000 ly",
            view.options.extinction_mag_per_kly
        ));
    }
    sub.push('.');
    items.push(text(
        [
            margin,
            margin + title_pt * MM_PER_PT + small_pt * MM_PER_PT * 2.0,
        ],
        sub,
        small_pt,
        pal.faint_text,
        Anchor::Start,
        false,
    ));

    // Magnitude key and the plane's line style.
    let key_y = h - margin - key_h * 0.45;
    let mut x = margin;
    items.push(text(
        [x, key_y + small_pt * MM_PER_PT * 0.35],
        "Apparent magnitude".into(),
        small_pt,
        pal.text,
        Anchor::Start,
        true,
    ));
    x += crate::render::text::text_width_mm("Apparent magnitude", small_pt, true) + 4.0;
    let first = BRIGHT_KEY_MAG.ceil() as i32;
    let last = limit.floor() as i32;
    let mut key_centres = Vec::new();
    let mut key_radii = Vec::new();
    for m in first..=last.max(first) {
        let r = dot_radius_mm(f64::from(m), limit, r_min, r_max);
        x += r_max;
        key_centres.push([x, key_y]);
        key_radii.push(r);
        items.push(text(
            [x, key_y + r_max + small_pt * MM_PER_PT * 1.1],
            format_mag(f64::from(m)),
            small_pt * 0.9,
            pal.text,
            Anchor::Middle,
            false,
        ));
        x += r_max + 3.0;
    }
    let n = key_centres.len();
    items.push(Item::Stars {
        centres_mm: key_centres,
        radii_mm: key_radii,
        fills: vec![pal.faint_text; n],
        outline: pal.dot_outline,
    });
    x += 6.0;
    items.push(Item::Line {
        points_mm: vec![[x, key_y], [x + 10.0, key_y]],
        closed: false,
        stroke: plane,
    });
    items.push(text(
        [x + 12.0, key_y + small_pt * MM_PER_PT * 0.35],
        "galactic plane (b = 0°); grid every 30°; dot colour from the star's temperature".into(),
        small_pt,
        pal.text,
        Anchor::Start,
        false,
    ));

    Scene {
        width_mm: w,
        height_mm: h,
        background: pal.page,
        items,
    }
}
