//! The night sky seen from one star of a catalogue: which stars are bright
//! there, where they stand, and how bright the observer's own companions
//! are.
//!
//! # Model
//! - Directions are in the observer's galactic frame: the catalogue's
//!   galactic axes (+x toward the Galactic centre, l = 0°; +y toward
//!   l = 90°; +z toward the north Galactic pole) moved to the observer, so
//!   from the origin they are true galactic longitude and latitude.
//! - Apparent magnitude: the catalogue's absolute visual magnitude
//!   (`abs_mag_v`, from the physics core with Torres 2010 bolometric
//!   corrections) plus the distance modulus m − M = 5 log10(d / 10 pc),
//!   plus an optional uniform extinction in magnitudes per 1000 ly.
//! - Companions: members of one system share the primary's position in
//!   the catalogue, which gives only each companion's separation from the
//!   primary. A companion is placed at that separation in a fixed
//!   direction drawn from its star id ([`companion_direction`]); the
//!   observer's own companions are then seen at their true separation in
//!   au, and distant stars are seen from the observer's exact place.
//! - A star exactly behind another is never merged with it: every row other
//!   than the observer gets its own entry.
//!
//! ```
//! use starloom::catalogue::{Catalogue, StarRow};
//! use starloom::physics::{star_profile, Fidelity, KindChoice, StarRequest};
//! use starloom::sky::{sky_view, SkyOptions};
//! use starloom::units::{Gigayears, SolarMasses};
//!
//! let sun = star_profile(
//!     &StarRequest {
//!         mass: SolarMasses::new(1.0).unwrap(),
//!         age: Gigayears::new(4.6).unwrap(),
//!         kind: KindChoice::Auto,
//!     },
//!     Fidelity::Fitted,
//! );
//! let mut cat = Catalogue::default();
//! for (id, x) in [(1, 0.0), (2, 32.6)] {
//!     cat.push(StarRow {
//!         id,
//!         system: id,
//!         name: format!("Star {id}"),
//!         position_ly: [x, 0.0, 0.0],
//!         profile: sun.clone(),
//!         separation_au: 0.0,
//!         period_days: 0.0,
//!         origin: Default::default(),
//!     });
//! }
//! let view = sky_view(&cat, 0, &SkyOptions::default());
//! // Seen from 10 pc, a star looks as bright as its absolute magnitude.
//! assert!((view.stars[0].apparent_mag - cat.abs_mag_v[1]).abs() < 0.01);
//! assert!(view.stars[0].l_deg.abs() < 1e-9);
//! ```

pub mod chart;
pub mod parse;
pub mod projection;

use crate::catalogue::Catalogue;
use crate::catalogue::number_format::{push_fixed, push_sig, push_u64};
use crate::error::{Error, Result};
use crate::physics::photometry::{NO_LIGHT_MAG, apparent_mag};
use crate::routes::close_names;
use crate::units::AU_PER_LY;
use rayon::prelude::*;
use std::path::Path;

pub use chart::{ChartOptions, sky_chart};
pub use projection::Projection;

/// The naked-eye limiting magnitude used unless asked otherwise: the
/// Bright Star Catalogue covers "stars brighter than visual magnitude
/// 6.50" (Hoffleit & Warren 1991, BSC 5th ed., ReadMe).
pub const NAKED_EYE_LIMIT_MAG: f64 = 6.5;

/// Settings for [`sky_view`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SkyOptions {
    /// Faintest apparent V magnitude counted as visible.
    pub limit_mag: f64,
    /// Uniform interstellar extinction, V magnitudes per 1000 ly (0 = none).
    pub extinction_mag_per_kly: f64,
}

impl Default for SkyOptions {
    fn default() -> Self {
        SkyOptions {
            limit_mag: NAKED_EYE_LIMIT_MAG,
            extinction_mag_per_kly: 0.0,
        }
    }
}

/// Who is looking.
#[derive(Debug, Clone, PartialEq)]
pub struct SkyObserver {
    /// Catalogue row of the observer's star.
    pub row: usize,
    /// Star id.
    pub id: u64,
    /// System id.
    pub system: u64,
    /// Display name.
    pub name: String,
    /// Catalogue position of the observer's system, light years.
    pub position_ly: [f64; 3],
    /// The observer's offset from its system primary, au (zero for a primary).
    pub offset_au: [f64; 3],
}

/// One star as seen from the observer.
#[derive(Debug, Clone, PartialEq)]
pub struct SkyStar {
    /// Catalogue row.
    pub row: usize,
    /// Star id.
    pub id: u64,
    /// System id.
    pub system: u64,
    /// Display name.
    pub name: String,
    /// Apparent visual magnitude (99 for objects that give no light).
    pub apparent_mag: f64,
    /// Galactic longitude in the observer's frame, degrees in [0, 360).
    pub l_deg: f64,
    /// Galactic latitude in the observer's frame, degrees.
    pub b_deg: f64,
    /// Distance from the observer, light years.
    pub distance_ly: f64,
    /// Distance in au for members of the observer's own system, else `None`.
    pub separation_au: Option<f64>,
    /// Brighter than (or at) the limiting magnitude.
    pub visible: bool,
    /// Effective temperature, kelvin.
    pub teff_k: f64,
    /// Display colour (sRGB) from the catalogue.
    pub color_rgb: [u8; 3],
}

/// The sky from one star: every other row of the catalogue, brightest first.
#[derive(Debug, Clone, PartialEq)]
pub struct SkyView {
    /// The observer.
    pub observer: SkyObserver,
    /// The settings used.
    pub options: SkyOptions,
    /// Every other star, sorted by apparent magnitude (then row).
    pub stars: Vec<SkyStar>,
    /// How many stars are visible (they come first in `stars`).
    pub visible_count: usize,
}

impl SkyView {
    /// The visible stars, brightest first.
    pub fn visible(&self) -> &[SkyStar] {
        &self.stars[..self.visible_count]
    }

    /// How many stars are fainter than the limit.
    pub fn fainter_count(&self) -> usize {
        self.stars.len() - self.visible_count
    }
}

/// A fixed unit vector for star `id`: uniform on the sphere, drawn from a
/// SplitMix64 hash of the id (Steele, Lea & Flood 2014), so the same star
/// always gets the same direction. Companions sit at their separation in
/// this direction from their primary.
pub fn companion_direction(id: u64) -> [f64; 3] {
    let a = splitmix64(id ^ 0x005E_EDF5_C1E5);
    let b = splitmix64(a);
    let u = (a >> 11) as f64 / (1u64 << 53) as f64;
    let v = (b >> 11) as f64 / (1u64 << 53) as f64;
    let z = 2.0 * u - 1.0;
    let r = (1.0 - z * z).max(0.0).sqrt();
    let phi = std::f64::consts::TAU * v;
    [r * phi.cos(), r * phi.sin(), z]
}

fn splitmix64(x: u64) -> u64 {
    let mut z = x.wrapping_add(0x9E37_79B9_7F4A_7C15);
    z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
    z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
    z ^ (z >> 31)
}

/// The offset of row `row` from its system primary, au: zero for the first
/// row of a system, else `separation_au` (1 au when the catalogue gives none)
/// along [`companion_direction`].
pub fn companion_offset_au(cat: &Catalogue, row: usize) -> [f64; 3] {
    if row == 0 || cat.system[row - 1] != cat.system[row] {
        return [0.0; 3];
    }
    let sep = cat.separation_au[row];
    let sep = if sep.is_finite() && sep > 0.0 {
        sep
    } else {
        1.0
    };
    let d = companion_direction(cat.id[row]);
    [sep * d[0], sep * d[1], sep * d[2]]
}

/// Row range of the system that holds `row`.
fn system_range(cat: &Catalogue, row: usize) -> std::ops::Range<usize> {
    let s = cat.system[row];
    let mut start = row;
    while start > 0 && cat.system[start - 1] == s {
        start -= 1;
    }
    let mut end = row + 1;
    while end < cat.len() && cat.system[end] == s {
        end += 1;
    }
    start..end
}

/// Longitude and latitude (degrees) of a vector; (0, 0) for the zero vector.
fn lb_deg(v: [f64; 3]) -> (f64, f64) {
    let r = (v[0] * v[0] + v[1] * v[1] + v[2] * v[2]).sqrt();
    if r == 0.0 || !r.is_finite() {
        return (0.0, 0.0);
    }
    let (l, b) = crate::coords::direction_to_lb(v);
    // rem_euclid of a tiny negative angle gives 360 − ε; keep l in [0, 360).
    (if l >= 360.0 - 1e-9 { 0.0 } else { l }, b)
}

/// Apparent magnitude with a uniform extinction; objects with no light stay
/// at [`NO_LIGHT_MAG`].
pub fn apparent_mag_with_extinction(
    abs_mag_v: f64,
    distance_ly: f64,
    extinction_mag_per_kly: f64,
) -> f64 {
    if !abs_mag_v.is_finite() || abs_mag_v >= NO_LIGHT_MAG {
        return NO_LIGHT_MAG;
    }
    let m = apparent_mag(abs_mag_v, distance_ly);
    (m + extinction_mag_per_kly * distance_ly.max(0.0) / 1000.0).min(NO_LIGHT_MAG)
}

/// The sky from row `observer_row` of `cat`: every other row with its
/// apparent magnitude, direction and distance, brightest first.
///
/// # Panics
/// If `observer_row` is not a row of `cat`.
///
/// # Cost
/// Parallel over rows (rayon); one `String` per row for the names.
pub fn sky_view(cat: &Catalogue, observer_row: usize, opts: &SkyOptions) -> SkyView {
    assert!(observer_row < cat.len(), "observer row out of range");
    let own = system_range(cat, observer_row);
    let base = cat.position_ly(observer_row);
    let obs_off_au = companion_offset_au(cat, observer_row);
    let obs_off_ly = obs_off_au.map(|c| c / AU_PER_LY);
    let limit = opts.limit_mag;
    let ext = opts.extinction_mag_per_kly;
    let mut stars: Vec<SkyStar> = (0..cat.len())
        .into_par_iter()
        .filter(|&j| j != observer_row)
        .map(|j| {
            let (rel, distance_ly, separation_au) = if own.contains(&j) {
                let off = companion_offset_au(cat, j);
                let rel = [
                    off[0] - obs_off_au[0],
                    off[1] - obs_off_au[1],
                    off[2] - obs_off_au[2],
                ];
                let au = (rel[0] * rel[0] + rel[1] * rel[1] + rel[2] * rel[2]).sqrt();
                (rel, au / AU_PER_LY, Some(au))
            } else {
                let rel = [
                    cat.x_ly[j] - base[0] - obs_off_ly[0],
                    cat.y_ly[j] - base[1] - obs_off_ly[1],
                    cat.z_ly[j] - base[2] - obs_off_ly[2],
                ];
                let d = (rel[0] * rel[0] + rel[1] * rel[1] + rel[2] * rel[2]).sqrt();
                (rel, d, None)
            };
            let (l_deg, b_deg) = lb_deg(rel);
            let m = apparent_mag_with_extinction(cat.abs_mag_v[j], distance_ly, ext);
            SkyStar {
                row: j,
                id: cat.id[j],
                system: cat.system[j],
                name: cat.name[j].to_string(),
                apparent_mag: m,
                l_deg,
                b_deg,
                distance_ly,
                separation_au,
                visible: m <= limit,
                teff_k: cat.teff_k[j],
                color_rgb: cat.color_rgb[j],
            }
        })
        .collect();
    stars.par_sort_unstable_by(|a, b| {
        a.apparent_mag
            .total_cmp(&b.apparent_mag)
            .then(a.row.cmp(&b.row))
    });
    let visible_count = stars.partition_point(|s| s.visible);
    SkyView {
        observer: SkyObserver {
            row: observer_row,
            id: cat.id[observer_row],
            system: cat.system[observer_row],
            name: cat.name[observer_row].to_string(),
            position_ly: base,
            offset_au: obs_off_au,
        },
        options: *opts,
        stars,
        visible_count,
    }
}

/// Finds the observer's row from a system id (its primary), a star id, or
/// a star name (case-insensitive). An unknown name gives
/// [`Error::UnknownName`] with up to three close names.
pub fn find_observer(cat: &Catalogue, text: &str) -> Result<usize> {
    let given = text.trim();
    if let Ok(v) = given.parse::<u64>() {
        if let Some(i) = cat.system.iter().position(|&s| s == v) {
            return Ok(i);
        }
        if let Some(i) = cat.id.iter().position(|&s| s == v) {
            return Ok(i);
        }
    }
    if let Some(i) = cat.name.iter().position(|n| n.eq_ignore_ascii_case(given)) {
        return Ok(i);
    }
    let lower = given.to_lowercase();
    if let Some(i) = cat.name.iter().position(|n| n.to_lowercase() == lower) {
        return Ok(i);
    }
    let close = close_names(cat, &lower);
    let suggestion = match close.len() {
        0 => String::new(),
        1 => format!("; did you mean '{}'?", close[0]),
        n => {
            let quoted: Vec<String> = close.iter().map(|c| format!("'{c}'")).collect();
            format!(
                "; did you mean {} or {}?",
                quoted[..n - 1].join(", "),
                quoted[n - 1]
            )
        }
    };
    Err(Error::UnknownName {
        what: "star or system".into(),
        given: given.to_string(),
        suggestion,
    })
}

/// Column names of the sky CSV, units in the names.
pub const CSV_HEADER: &str =
    "name,id,system,apparent_mag_v,l_deg,b_deg,distance_ly,separation_au,visible,teff_k";

/// The full list as CSV text (header, then one line per star, brightest first).
pub fn sky_csv(view: &SkyView) -> Vec<u8> {
    let mut buf = Vec::with_capacity(64 * (view.stars.len() + 1));
    buf.extend_from_slice(CSV_HEADER.as_bytes());
    buf.push(b'\n');
    for s in &view.stars {
        crate::catalogue::csv_format::push_text_field(&mut buf, &s.name);
        buf.push(b',');
        push_u64(&mut buf, s.id);
        buf.push(b',');
        push_u64(&mut buf, s.system);
        buf.push(b',');
        push_fixed(&mut buf, s.apparent_mag, 3);
        buf.push(b',');
        push_fixed(&mut buf, s.l_deg, 4);
        buf.push(b',');
        push_fixed(&mut buf, s.b_deg, 4);
        buf.push(b',');
        push_sig(&mut buf, s.distance_ly, 7);
        buf.push(b',');
        if let Some(au) = s.separation_au {
            push_sig(&mut buf, au, 6);
        }
        buf.push(b',');
        buf.extend_from_slice(if s.visible { b"true" } else { b"false" });
        buf.push(b',');
        push_fixed(&mut buf, s.teff_k, 0);
        buf.push(b'\n');
    }
    buf
}

/// Writes [`sky_csv`] to `path` atomically (an existing file is kept
/// unless `force`).
pub fn write_sky_csv(view: &SkyView, path: &Path, force: bool) -> Result<()> {
    crate::atomic_file::write_bytes(path, force, &sky_csv(view))
}

#[cfg(test)]
mod tests;
