//! From catalogue values to a physical profile: Hp → V, distance modulus,
//! Teff from colour, place in the HR diagram, luminosity through the
//! physics core's bolometric corrections, then the other columns.
//!
//! # Sources and rules
//! - **Hp → V.** For stars bluer than V−I = 1.6, V − Hp is the cubic in
//!   B−V −0.2964 (B−V) + 0.1110 (B−V)² + 0.0157 (B−V)³ (of the form given by
//!   Harmanec 1998, A&A 335, 173; coefficients from memory, unverified).
//!   Against V magnitudes of 14 bright and nearby F–K stars (from memory)
//!   it is good to 0.03 mag. For M dwarfs Hp runs ahead of V (the Hp band
//!   reaches 900 nm) and B−V saturates, so for V−I ≥ 1.6 V − Hp follows our
//!   own piecewise-linear fit in V−I ([`RED_V_MINUS_HP`]) to V magnitudes of
//!   18 nearby M dwarfs (from memory); scatter about 0.05 mag.
//! - **Teff.** The Flower (1996) B−V relation with the corrected
//!   coefficients of Torres (2010, AJ 140, 1158, Table 2)
//!   ([`teff_from_b_minus_v`]). It saturates at B−V 1.7 (3460 K), so for
//!   main-sequence stars redder than B−V [`RED_DWARF_B_V`] Teff comes from
//!   the absolute magnitude along the Pecaut & Mamajek (2013, ApJS 208, 9)
//!   mean dwarf sequence ([`DWARF_SEQUENCE`]).
//! - **HR diagram.** White dwarf when B−V < 1.2 and M_V > 10 + 3 (B−V),
//!   well below the main sequence (our rule; van Maanen 2 at M_V 14.2 and
//!   B−V 0.55 is one, the faintest M dwarfs lie above it). Otherwise the star
//!   is compared with the dwarf sequence at its Teff: more than
//!   [`EVOLVED_ABOVE_MS_MAG`] brighter is evolved — a giant when cooler than
//!   5500 K and brighter than M_V 3, else a subgiant; a supergiant above
//!   10⁴ L☉ (our rule, common practice).
//! - **Luminosity.** M_bol = M_V + BC_V with [`bolometric_correction_v`],
//!   L = 10^((4.74 − M_bol)/2.5).
//! - **No colour** (25 stars of the extract): V is taken equal to Hp (their
//!   V − Hp is unknown, typically within ±0.15 mag), the star is taken to be
//!   a dwarf and its Teff comes from M_V along the dwarf sequence.
//! - Sirius (HIP 32349) has Hp −1.09 where its V is −1.46 (from memory):
//!   the brightest stars' Hp is not a good guide to V, and Sirius comes out
//!   0.37 mag too faint.
//! - **Radius** from L and Teff (Stefan–Boltzmann). **Mass**: dwarfs and
//!   subgiants from L along the dwarf sequence; giants 1.5 M☉ and white
//!   dwarfs 0.6 M☉ (typical values, from memory). Ages are unknown (NaN).

use crate::physics::blackbody_color::color_rgb;
use crate::physics::habitable_host::is_habitable_host;
use crate::physics::habitable_zone::habitable_zone;
use crate::physics::main_sequence::t_ms_gyr;
use crate::physics::photometry::{M_BOL_SUN, bolometric_correction_v, teff_from_b_minus_v};
use crate::physics::spectral_class::{DWARF_SEQUENCE, classify};
use crate::physics::{StarKind, StarProfile};

/// V − Hp against V−I for red stars (V−I ≥ 1.6): our fit, see the module
/// documentation. Linear between nodes, held beyond the last.
pub const RED_V_MINUS_HP: [(f64, f64); 6] = [
    (1.6, -0.14),
    (2.1, -0.01),
    (2.7, 0.04),
    (3.15, 0.11),
    (3.62, 0.37),
    (4.5, 0.37),
];

/// Main-sequence stars redder than this B−V take Teff from their absolute
/// magnitude (M0V has B−V ≈ 1.4 in the Pecaut & Mamajek sequence, from
/// memory).
pub const RED_DWARF_B_V: f64 = 1.40;

/// A star this many magnitudes brighter than the dwarf sequence at its Teff
/// counts as evolved (unresolved equal binaries are 0.75 mag brighter; our
/// choice).
pub const EVOLVED_ABOVE_MS_MAG: f64 = 1.0;

/// Mass given to giants, solar masses (typical of local red-clump giants;
/// from memory).
pub const GIANT_MASS_MSUN: f64 = 1.5;

/// Mass given to white dwarfs, solar masses (the mean DA white-dwarf mass,
/// about 0.6; from memory).
pub const WHITE_DWARF_MASS_MSUN: f64 = 0.6;

/// Age assumed by the habitable-host flag for real stars, whose ages are
/// unknown: older than its 1 Gyr threshold (our choice).
pub const ASSUMED_HOST_AGE_GYR: f64 = 5.0;

/// Johnson V from the Hipparcos magnitude and the catalogue colours (Hp
/// itself when B−V is NaN).
pub fn v_from_hp(hp_mag: f64, b_v_mag: f64, v_i_mag: f64) -> f64 {
    if v_i_mag >= RED_V_MINUS_HP[0].0 {
        return hp_mag + interpolate(&RED_V_MINUS_HP, v_i_mag);
    }
    if !b_v_mag.is_finite() {
        return hp_mag;
    }
    let b = b_v_mag;
    hp_mag - 0.2964 * b + 0.1110 * b * b + 0.0157 * b * b * b
}

/// Linear interpolation in a table of (x, y) sorted by x, held at the ends.
fn interpolate(table: &[(f64, f64)], x: f64) -> f64 {
    let first = table[0];
    let last = table[table.len() - 1];
    if x <= first.0 {
        return first.1;
    }
    if x >= last.0 {
        return last.1;
    }
    let i = table.partition_point(|p| p.0 <= x);
    let (a, b) = (table[i - 1], table[i]);
    a.1 + (x - a.0) / (b.0 - a.0) * (b.1 - a.1)
}

/// Rows of the dwarf sequence with finite M_V, log L and mass, coolest last.
fn dwarf_rows() -> impl Iterator<Item = &'static crate::physics::spectral_class::DwarfRow> {
    DWARF_SEQUENCE.iter().filter(|r| {
        r.abs_mag_v.is_finite() && r.log_luminosity_lsun.is_finite() && r.mass_msun.is_finite()
    })
}

/// M_V of the mean dwarf sequence at `teff_k`, linear in Teff between rows.
pub fn dwarf_abs_mag_v(teff_k: f64) -> f64 {
    let mut t: Vec<(f64, f64)> = dwarf_rows().map(|r| (r.teff_k, r.abs_mag_v)).collect();
    t.reverse();
    interpolate(&t, teff_k)
}

/// Teff of the mean dwarf sequence at absolute magnitude `abs_mag_v`.
pub fn dwarf_teff_at_abs_mag_v(abs_mag_v: f64) -> f64 {
    let t: Vec<(f64, f64)> = dwarf_rows().map(|r| (r.abs_mag_v, r.teff_k)).collect();
    interpolate(&t, abs_mag_v)
}

/// Mass of the mean dwarf sequence at luminosity `luminosity_lsun`, linear
/// in log L between rows.
pub fn dwarf_mass_at_luminosity(luminosity_lsun: f64) -> f64 {
    let mut t: Vec<(f64, f64)> = dwarf_rows()
        .map(|r| (r.log_luminosity_lsun, r.mass_msun))
        .collect();
    t.reverse();
    // The sequence's log L is not strictly monotone among the coolest rows.
    t.dedup_by(|b, a| b.0 <= a.0);
    interpolate(&t, luminosity_lsun.log10())
}

/// Everything derived from one star's catalogue values.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RealStarLight {
    /// Johnson V, apparent.
    pub v_mag: f64,
    /// Absolute visual magnitude.
    pub abs_mag_v: f64,
    /// The physical profile.
    pub profile: StarProfile,
}

/// The profile of a star from its Hipparcos magnitude, colours and
/// distance (see the module documentation for every step).
pub fn real_star_light(hp_mag: f64, b_v_mag: f64, v_i_mag: f64, distance_pc: f64) -> RealStarLight {
    let v_mag = v_from_hp(hp_mag, b_v_mag, v_i_mag);
    let abs_mag_v = v_mag - 5.0 * (distance_pc / 10.0).log10();
    let has_colour = b_v_mag.is_finite();
    let b_v = if has_colour { b_v_mag } else { f64::INFINITY };
    let colour_teff = if has_colour {
        teff_from_b_minus_v(b_v, false)
    } else {
        dwarf_teff_at_abs_mag_v(abs_mag_v)
    };
    let white_dwarf = has_colour && b_v < 1.2 && abs_mag_v > 10.0 + 3.0 * b_v;
    let mut kind = if !has_colour {
        StarKind::MainSequence
    } else if white_dwarf {
        StarKind::WhiteDwarf
    } else {
        let above = dwarf_abs_mag_v(colour_teff) - abs_mag_v;
        if above > EVOLVED_ABOVE_MS_MAG {
            if colour_teff < 5500.0 && abs_mag_v < 3.0 {
                StarKind::Giant
            } else {
                StarKind::Subgiant
            }
        } else {
            StarKind::MainSequence
        }
    };
    let teff_k = if kind == StarKind::MainSequence && b_v > RED_DWARF_B_V {
        dwarf_teff_at_abs_mag_v(abs_mag_v)
    } else {
        colour_teff
    };
    let m_bol = abs_mag_v + bolometric_correction_v(kind, teff_k);
    let luminosity_lsun = 10f64.powf((M_BOL_SUN - m_bol) / 2.5);
    if kind == StarKind::Giant && luminosity_lsun >= 1e4 {
        kind = StarKind::Supergiant;
    }
    let radius_rsun = luminosity_lsun.sqrt() * (5772.0 / teff_k).powi(2);
    let mass_msun = match kind {
        StarKind::MainSequence | StarKind::Subgiant => dwarf_mass_at_luminosity(luminosity_lsun),
        StarKind::WhiteDwarf => WHITE_DWARF_MASS_MSUN,
        _ => GIANT_MASS_MSUN,
    };
    let lifetime_gyr = if kind == StarKind::WhiteDwarf {
        0.0
    } else {
        t_ms_gyr(mass_msun)
    };
    let profile = StarProfile {
        kind,
        class: classify(kind, teff_k, luminosity_lsun, mass_msun),
        mass_msun,
        initial_mass_msun: if kind == StarKind::WhiteDwarf {
            f64::NAN
        } else {
            mass_msun
        },
        radius_rsun,
        luminosity_lsun,
        teff_k,
        age_gyr: f64::NAN,
        lifetime_gyr,
        hz: habitable_zone(teff_k, luminosity_lsun),
        color_rgb: color_rgb(teff_k),
        abs_mag_v,
        habitable_host: is_habitable_host(kind, mass_msun, ASSUMED_HOST_AGE_GYR),
    };
    RealStarLight {
        v_mag,
        abs_mag_v,
        profile,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::neighbourhood::extract::find;

    fn light(hip: u32) -> RealStarLight {
        let s = find(hip).expect("in the extract");
        real_star_light(s.hp_mag, s.b_v_mag, s.v_i_mag, s.distance_pc())
    }

    #[test]
    fn v_from_hp_matches_quoted_v() {
        // Quoted Johnson V (from memory, as commonly listed): Procyon 0.34,
        // Tau Ceti 3.50, Epsilon Eridani 3.73, Arcturus −0.05, 61 Cyg A 5.21,
        // Barnard's star 9.51, Proxima 11.13, Ross 128 11.13, Luyten's star
        // 9.86. Hp, B−V, V−I from the extract (van Leeuwen 2007).
        for (hip, v) in [
            (37279, 0.34),
            (8102, 3.50),
            (16537, 3.73),
            (69673, -0.05),
            (104214, 5.21),
            (87937, 9.51),
            (70890, 11.13),
            (57548, 11.13),
            (36208, 9.86),
        ] {
            let got = light(hip).v_mag;
            assert!((got - v).abs() < 0.08, "HIP {hip}: V {got:.3} vs {v}");
        }
    }

    #[test]
    fn known_stars_land_in_the_right_place_of_the_hr_diagram() {
        // Spectral types as commonly listed (from memory): Sirius A1V,
        // Procyon F5IV–V, α Cen A G2V, Arcturus K1.5III, Aldebaran K5III,
        // Barnard's star M4V, Proxima M5.5V, van Maanen 2 DZ8 (a white dwarf).
        let kind = |hip| light(hip).profile.kind;
        assert_eq!(kind(32349), StarKind::MainSequence);
        assert!(matches!(
            kind(37279),
            StarKind::MainSequence | StarKind::Subgiant
        ));
        assert_eq!(kind(71683), StarKind::MainSequence);
        assert_eq!(kind(69673), StarKind::Giant);
        assert_eq!(kind(21421), StarKind::Giant);
        assert_eq!(kind(87937), StarKind::MainSequence);
        assert_eq!(kind(70890), StarKind::MainSequence);
        assert_eq!(kind(3829), StarKind::WhiteDwarf);
        // Class letters.
        let letter = |hip| light(hip).profile.class.letter();
        assert_eq!(letter(32349), 'A');
        assert_eq!(letter(71683), 'G');
        assert_eq!(letter(69673), 'K');
        assert_eq!(letter(87937), 'M');
        assert_eq!(letter(70890), 'M');
    }

    #[test]
    fn luminosities_and_temperatures_near_published() {
        // Published values (from memory): Procyon A L ≈ 6.93 L☉, Teff ≈ 6530 K;
        // α Cen A L ≈ 1.52 L☉, Teff ≈ 5790 K; α Cen B L ≈ 0.50 L☉,
        // Teff ≈ 5260 K; Proxima Teff ≈ 3050 K, L ≈ 0.0016 L☉. Tolerances:
        // 25 % in L (0.1 mag in BC_V, 0.05 mag in V, unresolved light),
        // 8 % in Teff (scatter of colour–temperature relations).
        for (hip, l, t) in [
            (37279, 6.93, 6530.0),
            (71683, 1.52, 5790.0),
            (71681, 0.50, 5260.0),
            (70890, 0.0016, 3050.0),
        ] {
            let p = light(hip).profile;
            assert!(
                (p.luminosity_lsun / l - 1.0).abs() < 0.25,
                "HIP {hip}: L {}",
                p.luminosity_lsun
            );
            assert!(
                (p.teff_k / t - 1.0).abs() < 0.08,
                "HIP {hip}: Teff {}",
                p.teff_k
            );
        }
        // Barnard's star, Teff ≈ 3200 K (from memory). Its L comes out 0.0050
        // against a published ≈ 0.0035 L☉: an old, metal-poor star below the
        // mean dwarf sequence whose bolometric correction we take from it.
        let p = light(87937).profile;
        assert!((p.teff_k / 3200.0 - 1.0).abs() < 0.08, "{}", p.teff_k);
        // A star without colours is a dwarf with V = Hp.
        let s = find(31293).unwrap();
        assert!(s.b_v_mag.is_nan());
        let l = real_star_light(s.hp_mag, s.b_v_mag, s.v_i_mag, s.distance_pc());
        assert_eq!(l.v_mag, s.hp_mag);
        assert_eq!(l.profile.kind, StarKind::MainSequence);
        assert_eq!(l.profile.class.letter(), 'M');
    }

    #[test]
    fn masses_follow_the_dwarf_sequence() {
        // Dwarf-sequence masses (Pecaut & Mamajek table as embedded):
        // G2V 1.0 M☉ at log L 0.01, M4V 0.23 M☉ at log L −2.144.
        assert!((dwarf_mass_at_luminosity(10f64.powf(0.01)) - 1.0).abs() < 1e-9);
        assert!((dwarf_mass_at_luminosity(10f64.powf(-2.144)) - 0.23).abs() < 1e-9);
        // Published masses (from memory): α Cen A 1.1 M☉, α Cen B 0.91 M☉,
        // 61 Cyg A 0.70 M☉, Proxima 0.12 M☉; 25 % (mass–luminosity scatter).
        for (hip, m) in [(71683, 1.1), (71681, 0.91), (104214, 0.70), (70890, 0.12)] {
            let got = light(hip).profile.mass_msun;
            assert!((got / m - 1.0).abs() < 0.25, "HIP {hip}: {got}");
        }
    }
}
