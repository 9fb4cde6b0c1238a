//! The Hertzsprung–Russell diagram of a catalogue: luminosity against
//! effective temperature, both on log axes, hot stars on the left (the
//! astronomers' convention), each dot in the star's own colour.
//!
//! # Units
//! Page in millimetres (an A4 landscape sheet), temperatures in kelvin,
//! luminosities in solar luminosities.

use crate::catalogue::Catalogue;
use crate::physics::kinds::StarKind;
use crate::render::paper::{Paper, Theme};
use crate::render::scene::{Anchor, Item, Rgba, Scene, Stroke};

/// Page size of the diagram, mm (A4 landscape, ISO 216).
pub const PAGE_MM: (f32, f32) = (297.0, 210.0);

/// The plot frame on the page and the ranges it shows.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct HrAxes {
    /// Left, top, right, bottom edges of the plot frame, mm.
    pub frame_mm: [f32; 4],
    /// log10 of the temperature at the left edge (the hottest), K.
    pub log_t_left: f32,
    /// log10 of the temperature at the right edge (the coolest), K.
    pub log_t_right: f32,
    /// log10 of the luminosity at the bottom edge, Lsun.
    pub log_l_bottom: f32,
    /// log10 of the luminosity at the top edge, Lsun.
    pub log_l_top: f32,
}

impl HrAxes {
    /// Axes fitted to the rows with a finite, positive temperature and
    /// luminosity (temperatures kept within 100 K – 10^7 K, luminosities
    /// within 10^-12 – 10^10 Lsun), padded to whole decades of luminosity.
    pub fn fit(cat: &Catalogue) -> HrAxes {
        let (mut t0, mut t1, mut l0, mut l1) = (f32::MAX, f32::MIN, f32::MAX, f32::MIN);
        for (t, l) in cat.teff_k.iter().zip(&cat.luminosity_lsun) {
            if let Some((lt, ll)) = log_point(*t, *l) {
                t0 = t0.min(lt);
                t1 = t1.max(lt);
                l0 = l0.min(ll);
                l1 = l1.max(ll);
            }
        }
        if t0 > t1 {
            // No plottable rows: the range of ordinary stars.
            (t0, t1, l0, l1) = (3.4, 4.5, -4.0, 5.0);
        }
        let pad_t = ((t1 - t0) * 0.04).max(0.05);
        let (mut lb, mut lt) = ((l0 - 0.2).floor(), (l1 + 0.2).ceil());
        if lt - lb < 2.0 {
            lb -= 1.0;
            lt += 1.0;
        }
        HrAxes {
            frame_mm: [28.0, 22.0, 222.0, 182.0],
            log_t_left: t1 + pad_t,
            log_t_right: t0 - pad_t,
            log_l_bottom: lb,
            log_l_top: lt,
        }
    }

    /// Where a star of `teff_k` and `luminosity_lsun` sits on the page,
    /// mm; `None` when it cannot be plotted or falls outside the frame.
    pub fn to_page(&self, teff_k: f64, luminosity_lsun: f64) -> Option<[f32; 2]> {
        let (lt, ll) = log_point(teff_k, luminosity_lsun)?;
        let [x0, y0, x1, y1] = self.frame_mm;
        let u = (self.log_t_left - lt) / (self.log_t_left - self.log_t_right);
        let v = (ll - self.log_l_bottom) / (self.log_l_top - self.log_l_bottom);
        if !(0.0..=1.0).contains(&u) || !(0.0..=1.0).contains(&v) {
            return None;
        }
        Some([x0 + u * (x1 - x0), y1 - v * (y1 - y0)])
    }

    fn x_of(&self, log_t: f32) -> f32 {
        let [x0, _, x1, _] = self.frame_mm;
        x0 + (self.log_t_left - log_t) / (self.log_t_left - self.log_t_right) * (x1 - x0)
    }

    fn y_of(&self, log_l: f32) -> f32 {
        let [_, y0, _, y1] = self.frame_mm;
        y1 - (log_l - self.log_l_bottom) / (self.log_l_top - self.log_l_bottom) * (y1 - y0)
    }
}

/// Temperatures an HR diagram shows, K: from below the coldest known brown
/// dwarfs (Y dwarfs near 250 K) to above young neutron stars' surfaces.
const TEFF_RANGE_K: (f64, f64) = (100.0, 1.0e7);
/// Luminosities it shows, Lsun: from old neutron stars (10^-9 Lsun and
/// fainter) to above the brightest stars.
const LUMINOSITY_RANGE_LSUN: (f64, f64) = (1e-12, 1e10);

fn log_point(teff_k: f64, lum: f64) -> Option<(f32, f32)> {
    let ok = (TEFF_RANGE_K.0..=TEFF_RANGE_K.1).contains(&teff_k)
        && (LUMINOSITY_RANGE_LSUN.0..=LUMINOSITY_RANGE_LSUN.1).contains(&lum);
    ok.then(|| (teff_k.log10() as f32, lum.log10() as f32))
}

struct Ink {
    paper: Rgba,
    ink: Rgba,
    grid: Rgba,
    outline: Option<Stroke>,
}

fn ink(theme: Theme) -> Ink {
    match theme {
        Theme::Print => Ink {
            paper: Rgba::rgb(255, 255, 255),
            ink: Rgba::rgb(25, 25, 35),
            grid: Rgba::rgb(215, 215, 222),
            outline: Some(Stroke {
                color: Rgba::rgb(90, 90, 100),
                width_mm: 0.05,
                dash_mm: None,
            }),
        },
        Theme::Screen => Ink {
            paper: Rgba::rgb(8, 10, 22),
            ink: Rgba::rgb(225, 228, 240),
            grid: Rgba::rgb(45, 50, 75),
            outline: None,
        },
    }
}

/// Tick temperatures within [lo, hi] (log10 K): 1, 2, 3 and 5 times
/// powers of ten.
fn temperature_ticks(lo: f32, hi: f32) -> Vec<f32> {
    let mut out = Vec::new();
    for e in 2..=6 {
        for m in [1.0f32, 2.0, 3.0, 5.0] {
            let t = m * 10f32.powi(e);
            let lt = t.log10();
            if lt >= lo - 1e-4 && lt <= hi + 1e-4 {
                out.push(t);
            }
        }
    }
    out
}

fn format_kelvin(t: f32) -> String {
    let t = t.round() as u64;
    if t >= 10_000 {
        format!("{} {:03}", t / 1000, t % 1000)
    } else {
        t.to_string()
    }
}

fn format_decade(e: i32) -> String {
    match e {
        0 => "1".into(),
        1 => "10".into(),
        -1 => "0.1".into(),
        _ => format!("1e{e}"),
    }
}

/// The diagram of every plottable row of `cat` as a scene (A4 landscape).
///
/// # Allocations
/// One `Item::Stars` with a centre, radius and colour per plotted row;
/// the rest is a few hundred items.
pub fn hr_scene(cat: &Catalogue, theme: Theme) -> Scene {
    let (w, h) = Paper::A4.size_mm(true);
    debug_assert_eq!((w, h), PAGE_MM);
    let ink = ink(theme);
    let axes = HrAxes::fit(cat);
    let [x0, y0, x1, y1] = axes.frame_mm;
    let mut items = Vec::new();
    let thin = |c: Rgba, wmm: f32| Stroke {
        color: c,
        width_mm: wmm,
        dash_mm: None,
    };
    let text =
        |pos: [f32; 2], s: String, size: f32, anchor: Anchor, bold: bool, rot: f32| Item::Text {
            position_mm: pos,
            text: s,
            size_pt: size,
            color: ink.ink,
            anchor,
            bold,
            rotation_deg: rot,
        };

    // Grid and ticks.
    let t_ticks = temperature_ticks(axes.log_t_right, axes.log_t_left);
    for &t in &t_ticks {
        let x = axes.x_of(t.log10());
        items.push(Item::Line {
            points_mm: vec![[x, y0], [x, y1]],
            closed: false,
            stroke: thin(ink.grid, 0.15),
        });
        items.push(Item::Line {
            points_mm: vec![[x, y1], [x, y1 + 1.5]],
            closed: false,
            stroke: thin(ink.ink, 0.25),
        });
        items.push(text(
            [x, y1 + 5.5],
            format_kelvin(t),
            8.0,
            Anchor::Middle,
            false,
            0.0,
        ));
    }
    let (lb, lt) = (axes.log_l_bottom as i32, axes.log_l_top as i32);
    let step = if lt - lb > 10 { 2 } else { 1 };
    for e in (lb..=lt).filter(|e| (e - lb) % step == 0) {
        let y = axes.y_of(e as f32);
        items.push(Item::Line {
            points_mm: vec![[x0, y], [x1, y]],
            closed: false,
            stroke: thin(ink.grid, 0.15),
        });
        items.push(Item::Line {
            points_mm: vec![[x0 - 1.5, y], [x0, y]],
            closed: false,
            stroke: thin(ink.ink, 0.25),
        });
        items.push(text(
            [x0 - 2.5, y + 1.1],
            format_decade(e),
            8.0,
            Anchor::End,
            false,
            0.0,
        ));
    }

    // Stars.
    let n = cat.len();
    let r_mm = (2.0 / (n.max(1) as f32).powf(1.0 / 6.0)).clamp(0.22, 1.2);
    let mut centres = Vec::with_capacity(n);
    let mut fills = Vec::with_capacity(n);
    let mut counts = [0usize; StarKind::ALL.len()];
    let mut sample: [Option<Rgba>; StarKind::ALL.len()] = [None; StarKind::ALL.len()];
    for i in 0..n {
        if let Some(p) = axes.to_page(cat.teff_k[i], cat.luminosity_lsun[i]) {
            let [r, g, b] = cat.color_rgb[i];
            centres.push(p);
            fills.push(Rgba::rgb(r, g, b));
            if let Some(k) = StarKind::ALL.iter().position(|k| *k == cat.kind[i]) {
                counts[k] += 1;
                sample[k].get_or_insert(Rgba::rgb(r, g, b));
            }
        }
    }
    let plotted = centres.len();
    items.push(Item::Stars {
        radii_mm: vec![r_mm; plotted],
        centres_mm: centres,
        fills,
        outline: ink.outline,
    });

    // Frame, axis labels, title.
    items.push(Item::Line {
        points_mm: vec![[x0, y0], [x1, y0], [x1, y1], [x0, y1]],
        closed: true,
        stroke: thin(ink.ink, 0.35),
    });
    items.push(text(
        [(x0 + x1) / 2.0, y1 + 13.0],
        "Effective temperature (K), hotter to the left".into(),
        10.0,
        Anchor::Middle,
        false,
        0.0,
    ));
    items.push(text(
        [x0 - 15.0, (y0 + y1) / 2.0],
        "Luminosity (L / Lsun)".into(),
        10.0,
        Anchor::Middle,
        false,
        90.0,
    ));
    let title = match &cat.meta.title {
        Some(t) => format!("{t}: Hertzsprung–Russell diagram"),
        None => "Hertzsprung–Russell diagram".into(),
    };
    items.push(text([x0, y0 - 8.0], title, 14.0, Anchor::Start, true, 0.0));
    items.push(text(
        [x0, y0 - 2.5],
        format!("{plotted} of {n} objects plotted (those with a temperature and luminosity)"),
        8.0,
        Anchor::Start,
        false,
        0.0,
    ));

    // Key of kinds.
    let kx = x1 + 8.0;
    let mut ky = y0 + 4.0;
    items.push(text(
        [kx, ky],
        "Kinds plotted".into(),
        10.0,
        Anchor::Start,
        true,
        0.0,
    ));
    ky += 7.0;
    for (k, kind) in StarKind::ALL.iter().enumerate() {
        if counts[k] == 0 {
            continue;
        }
        items.push(Item::Marker {
            centre_mm: [kx + 1.5, ky - 1.0],
            radius_mm: 1.3,
            shape: crate::render::scene::Shape::Disc,
            fill: sample[k],
            stroke: Some(thin(ink.ink, 0.15)),
        });
        items.push(text(
            [kx + 5.0, ky],
            format!("{} ({})", kind.as_str().replace('-', " "), counts[k]),
            8.0,
            Anchor::Start,
            false,
            0.0,
        ));
        ky += 5.5;
    }
    items.push(text(
        [kx, ky + 3.0],
        "Dot colour: the star's own colour".into(),
        7.0,
        Anchor::Start,
        false,
        0.0,
    ));
    items.push(text(
        [kx, ky + 6.5],
        "from its effective temperature.".into(),
        7.0,
        Anchor::Start,
        false,
        0.0,
    ));

    Scene {
        width_mm: w,
        height_mm: h,
        background: ink.paper,
        items,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ticks_and_labels() {
        // 2500 K – 40000 K spans ticks 3000, 5000, 10000, 20000, 30000.
        let t = temperature_ticks(2500f32.log10(), 40000f32.log10());
        assert_eq!(t, vec![3000.0, 5000.0, 10000.0, 20000.0, 30000.0]);
        assert_eq!(format_kelvin(20000.0), "20 000");
        assert_eq!(format_decade(-3), "1e-3");
    }
}
