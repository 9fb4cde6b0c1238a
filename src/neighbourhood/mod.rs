//! The real neighbourhood: Hipparcos stars near the Sun, completed by a
//! generated fill where the catalogue is incomplete.
//!
//! - [`extract`]: the committed extract of the Hipparcos new reduction
//!   (van Leeuwen 2007, A&A 474, 653; CDS I/311), stars within 100 ly with
//!   parallaxes better than 10 %.
//! - [`convert`]: catalogue values → a physical profile.
//! - [`systems`]: resolved components grouped into systems.
//! - This module: the real catalogue of a volume ([`real_catalogue`]), the
//!   fill ([`fill_catalogue`]) and both together
//!   ([`real_neighbourhood_sector`]).
//!
//! # Rows
//! Real stars keep their HIP number as id; a system's id is its primary's
//! (the brightest member in V); members share the primary's position and
//! carry their projected separation and a period from Kepler's third law
//! with that separation as semi-major axis (an estimate). Names are the
//! catalogue designations, `HIP 71683`; no proper names are added. The Sun
//! is the home system at the origin (id 0, named `Sun`), drawn by the
//! population's physics at 1 M☉ and 4.57 Gyr. Real rows, the Sun included, carry
//! origin `hipparcos`; fill rows `generated`.
//!
//! # The fill
//! The usual population is generated for the same spec with
//! [`crate::sampler::generate`] (same seed, cells, ids and names), then:
//! 1. systems within `spec.pin_clear_ly` of the Sun are dropped (the real
//!    census of the nearest few light years is complete);
//! 2. within the extract's reach (100 ly), systems with any member at or
//!    brighter than the completeness limit ([`completeness_limit_v`]) at
//!    its distance and direction are dropped: the catalogue holds those;
//! 3. the remaining (faint) systems are thinned shell by shell
//!    ([`FILL_SHELL_LY`] from the Sun) so that the real faint stars plus
//!    the fill match the model's count of faint stars: in each shell the
//!    target is every generated star fainter than the limit, counting the
//!    faint companions of the dropped bright systems (Hipparcos seldom
//!    resolves them), and a share (target − N_real,faint) / N_candidates of
//!    the candidate faint systems' stars is kept, each system by a draw
//!    fixed by the seed and its id; brown-dwarf-only systems are all kept
//!    (Hipparcos has none);
//! 4. beyond 100 ly all generated systems are kept (the extract has no
//!    stars there).

pub mod convert;
pub mod extract;
pub mod systems;

use crate::catalogue::{Catalogue, CatalogueMeta, Origin, StarRow};
use crate::coords::direction_to_lb;
use crate::error::Result;
use crate::physics::photometry::apparent_mag;
use crate::population::Population;
use crate::spec::SectorSpec;
use crate::units::LY_PER_PC;
use convert::real_star_light;
use extract::{EXTRACT_REACH_LY, HipparcosStar, extract as hipparcos_extract};
use systems::{AU_PER_PC, angle_rad, group_systems};

/// Width of the distance shells in which the fill is thinned, light years.
pub const FILL_SHELL_LY: f64 = 10.0;

/// Teff of a G5V star, kelvin (Pecaut & Mamajek 2013 dwarf sequence, 5660 K):
/// the split between the two completeness limits.
pub const G5V_TEFF_K: f64 = 5660.0;

/// Age of the Sun, Gyr (Bonanno et al. 2002, A&A 390, 1115).
pub const SUN_AGE_GYR: f64 = 4.57;

/// The Hipparcos Catalogue's completeness limit in V at galactic latitude
/// `b_deg` for a star of `teff_k`: the Hipparcos Survey is complete to
/// V = 7.9 + 1.1 |sin b| for spectral types earlier than G5 and to
/// V = 7.3 + 1.1 |sin b| for G5 and later (ESA 1997, The Hipparcos and
/// Tycho Catalogues, SP-1200, Vol. 1 §1.2; from memory, unverified).
pub fn completeness_limit_v(b_deg: f64, teff_k: f64) -> f64 {
    let s = b_deg.to_radians().sin().abs();
    if teff_k > G5V_TEFF_K {
        7.9 + 1.1 * s
    } else {
        7.3 + 1.1 * s
    }
}

/// Length of a vector.
fn norm(p: [f64; 3]) -> f64 {
    (p[0] * p[0] + p[1] * p[1] + p[2] * p[2]).sqrt()
}

/// True when an object at `p` (light years from the Sun) with absolute
/// magnitude `abs_mag_v` and `teff_k` is brighter than (or at) the
/// completeness limit there: the real catalogue would hold it.
pub fn brighter_than_limit(p: [f64; 3], abs_mag_v: f64, teff_k: f64) -> bool {
    let d = norm(p);
    if d <= 0.0 {
        return true;
    }
    let (_, b) = direction_to_lb(p);
    apparent_mag(abs_mag_v, d) <= completeness_limit_v(b, teff_k)
}

fn in_volume(spec: &SectorSpec, p: [f64; 3]) -> bool {
    let c = spec.centre_ly;
    spec.shape.contains([p[0] - c[0], p[1] - c[1], p[2] - c[2]])
}

/// The real part of a sector: the Sun (when the volume holds the origin)
/// and every Hipparcos system of the extract whose primary lies inside the
/// volume of `spec`, systems in order of their primary's HIP number.
pub fn real_catalogue(spec: &SectorSpec) -> Catalogue {
    let stars = hipparcos_extract();
    let lights: Vec<_> = stars
        .iter()
        .map(|s| real_star_light(s.hp_mag, s.b_v_mag, s.v_i_mag, s.distance_pc()))
        .collect();
    let v: Vec<f64> = lights.iter().map(|l| l.v_mag).collect();
    let mut cat = Catalogue::default();
    if in_volume(spec, [0.0; 3]) {
        cat.push(sun_row(spec));
    }
    for group in group_systems(stars, &v) {
        let primary: &HipparcosStar = &stars[group[0]];
        let p = primary.position_ly();
        if !in_volume(spec, p) {
            continue;
        }
        let m1 = lights[group[0]].profile.mass_msun;
        for (k, &i) in group.iter().enumerate() {
            let s = &stars[i];
            let (separation_au, period_days) = if k == 0 {
                (0.0, 0.0)
            } else {
                let a_au = angle_rad(primary, s) * primary.distance_pc() * AU_PER_PC;
                let m = m1 + lights[i].profile.mass_msun;
                (a_au, (a_au.powi(3) / m).sqrt() * 365.25)
            };
            cat.push(StarRow {
                id: s.hip as u64,
                system: primary.hip as u64,
                name: format!("HIP {}", s.hip),
                position_ly: p,
                profile: lights[i].profile,
                separation_au,
                period_days,
                origin: Origin::Hipparcos,
            });
        }
    }
    cat.meta = CatalogueMeta {
        title: spec.title.clone(),
        seed: Some(spec.seed),
        centre_ly: Some(spec.centre_ly),
    };
    cat
}

/// The Sun's row: id 0, at the origin, drawn by the population's physics
/// (as the usual home system).
fn sun_row(spec: &SectorSpec) -> StarRow {
    let profile = Population::new(&spec.population).evolve(1.0, SUN_AGE_GYR);
    StarRow {
        id: 0,
        system: 0,
        name: "Sun".into(),
        position_ly: [0.0; 3],
        profile,
        separation_au: 0.0,
        period_days: 0.0,
        origin: Origin::Hipparcos,
    }
}

fn shell_of(d_ly: f64) -> usize {
    (d_ly / FILL_SHELL_LY).floor() as usize
}

/// A uniform number in [0, 1) fixed by the seed and a system id.
fn keep_draw(seed: u64, system: u64) -> f64 {
    let z = crate::seed::mix64(crate::seed::mix64(seed ^ 0x6e65_6967_6862_6f75) ^ system);
    (z >> 11) as f64 / (1u64 << 53) as f64
}

/// The generated fill of `spec` given its real part `real` (see the module
/// documentation for the rule). Rows keep the sampler's ids, names and
/// order.
pub fn fill_catalogue(spec: &SectorSpec, real: &Catalogue) -> Result<Catalogue> {
    let mut gspec = spec.clone();
    gspec.home = false;
    gspec.pins.clear();
    gspec.pin_file = None;
    gspec.pin_file_fnv1a = None;
    let generated = crate::sampler::generate(&gspec, &|_, _| {})?;
    let shells = shell_of(EXTRACT_REACH_LY) + 1;
    // Real faint stars per shell.
    let mut real_faint = vec![0usize; shells];
    for i in 0..real.len() {
        let p = real.position_ly(i);
        let d = norm(p);
        if real.id[i] == 0 || d > EXTRACT_REACH_LY || !real.kind[i].is_star() {
            continue;
        }
        if !brighter_than_limit(p, real.abs_mag_v[i], real.teff_k[i]) {
            real_faint[shell_of(d)] += 1;
        }
    }
    // Classify generated systems: drop, keep, or faint candidate.
    enum Fate {
        Drop,
        Keep,
        Faint(usize),
    }
    let ranges = generated.system_ranges();
    let mut gen_faint = vec![0usize; shells];
    let mut target_faint = vec![0usize; shells];
    let fates: Vec<Fate> = ranges
        .iter()
        .map(|r| {
            let p = generated.position_ly(r.start);
            let d = norm(p);
            if d < spec.pin_clear_ly {
                return Fate::Drop;
            }
            if d > EXTRACT_REACH_LY {
                return Fate::Keep;
            }
            let shell = shell_of(d);
            let (mut bright, mut faint) = (0usize, 0usize);
            for i in r.clone() {
                if !generated.kind[i].is_star() {
                    continue;
                }
                if brighter_than_limit(p, generated.abs_mag_v[i], generated.teff_k[i]) {
                    bright += 1;
                } else {
                    faint += 1;
                }
            }
            // Every generated faint star counts toward the target, faint
            // companions of bright systems too: Hipparcos seldom resolves them.
            target_faint[shell] += faint;
            if bright > 0 {
                return Fate::Drop;
            }
            if faint == 0 {
                return Fate::Keep;
            }
            gen_faint[shell] += faint;
            Fate::Faint(shell)
        })
        .collect();
    let keep_share: Vec<f64> = (0..shells)
        .map(|s| {
            if gen_faint[s] == 0 {
                0.0
            } else {
                let wanted = target_faint[s] as f64 - real_faint[s] as f64;
                (wanted / gen_faint[s] as f64).clamp(0.0, 1.0)
            }
        })
        .collect();
    let mut out = Catalogue::default();
    for (r, fate) in ranges.iter().zip(&fates) {
        let keep = match *fate {
            Fate::Drop => false,
            Fate::Keep => true,
            Fate::Faint(s) => keep_draw(spec.seed, generated.system[r.start]) < keep_share[s],
        };
        if keep {
            for i in r.clone() {
                push_row_of(&mut out, &generated, i);
            }
        }
    }
    out.meta = generated.meta.clone();
    Ok(out)
}

fn push_row_of(out: &mut Catalogue, cat: &Catalogue, i: usize) {
    out.push(StarRow {
        id: cat.id[i],
        system: cat.system[i],
        name: cat.name[i].to_string(),
        position_ly: cat.position_ly(i),
        profile: cat.profile(i),
        separation_au: cat.separation_au[i],
        period_days: cat.period_days[i],
        origin: cat.origin[i],
    });
}

/// The real neighbourhood of `spec`: the real systems inside its volume
/// (the Sun at the origin as home system) followed by the generated fill.
/// `spec.home` and pins are ignored (the Sun is the home system).
///
/// ```
/// use starloom::neighbourhood::real_neighbourhood_sector;
/// use starloom::spec::{SectorSpec, Shape};
///
/// let spec = SectorSpec::new(7, Shape::Sphere { radius_ly: 20.0 }, [0.0; 3]);
/// let cat = real_neighbourhood_sector(&spec).unwrap();
/// assert_eq!(&cat.name[0], "Sun");
/// ```
pub fn real_neighbourhood_sector(spec: &SectorSpec) -> Result<Catalogue> {
    spec.validate()?;
    let mut real = real_catalogue(spec);
    let mut fill = fill_catalogue(spec, &real)?;
    real.append(&mut fill);
    Ok(real)
}

/// Distance from the Sun of row `i`, light years.
pub fn distance_from_sun_ly(cat: &Catalogue, i: usize) -> f64 {
    norm(cat.position_ly(i))
}

/// Light years in 10 parsecs (the census radius).
pub const TEN_PC_LY: f64 = 10.0 * LY_PER_PC;

#[cfg(test)]
mod tests;
