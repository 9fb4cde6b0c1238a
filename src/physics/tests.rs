//! Whole-profile tests: sweeps of the allowed domain and jumps at the
//! break points between formulae.

use super::*;

fn profile(mass: f64, age: f64, kind: KindChoice, fidelity: Fidelity) -> StarProfile {
    star_profile(
        &StarRequest {
            mass: SolarMasses::new(mass).unwrap(),
            age: Gigayears::new(age).unwrap(),
            kind,
        },
        fidelity,
    )
}

fn assert_finite(p: &StarProfile) {
    let values = [
        p.mass_msun,
        p.initial_mass_msun,
        p.radius_rsun,
        p.luminosity_lsun,
        p.teff_k,
        p.age_gyr,
        p.lifetime_gyr,
        p.hz.inner_au,
        p.hz.outer_au,
        p.hz.optimistic_inner_au,
        p.hz.optimistic_outer_au,
        p.abs_mag_v,
        p.radius_km(),
        p.mean_density_kg_m3(),
        p.surface_gravity_sun(),
    ];
    for v in values {
        assert!(v.is_finite(), "{p:?}");
    }
    assert!(
        p.mass_msun > 0.0 && p.radius_rsun > 0.0 && p.luminosity_lsun >= 0.0,
        "{p:?}"
    );
    assert!(
        p.mass_msun <= p.initial_mass_msun * (1.0 + 1e-12) || p.kind.is_remnant(),
        "{p:?}"
    );
}

#[test]
fn no_nan_anywhere_in_the_auto_domain() {
    // Masses 0.013–150 Msun (log-spaced) × ages 0–13.8 Gyr, both fidelities.
    for fidelity in [Fidelity::Fitted, Fidelity::Rules] {
        for i in 0..=400 {
            let mass = 0.013 * (150.0f64 / 0.013).powf(i as f64 / 400.0);
            for j in 0..=138 {
                let p = profile(mass, j as f64 * 0.1, KindChoice::Auto, fidelity);
                assert_finite(&p);
                if p.kind != StarKind::BlackHole {
                    assert!(p.teff_k > 0.0, "{p:?}");
                }
                assert!(p.hz.inner_au <= p.hz.outer_au);
            }
        }
    }
}

#[test]
fn every_stage_is_reached_in_a_fine_time_sweep() {
    // A 1 Msun and a 15 Msun star pass through every stage the model has.
    let th = RemnantThresholds::default();
    let mut seen = std::collections::BTreeSet::new();
    for m in [1.0, 5.0, 15.0, 40.0] {
        let track = evolution::Track::new(m, &th);
        for i in 0..=20_000 {
            let t = track.t_end_gyr * 1.01 * i as f64 / 20_000.0;
            seen.insert(evolution::evolve(m, t, &th).kind);
        }
    }
    for kind in StarKind::ALL {
        if kind != StarKind::BrownDwarf {
            assert!(seen.contains(&kind), "{kind} never reached");
        }
    }
}

/// log10 of the ratio of L and of R across time `t` on the track of `m`.
fn jump_dex(m: f64, t: f64) -> (f64, f64) {
    let th = RemnantThresholds::default();
    let eps = 1e-9 * t;
    let (a, b) = (
        evolution::evolve_direct(m, t - eps, &th),
        evolution::evolve_direct(m, t + eps, &th),
    );
    (
        (b.luminosity_lsun / a.luminosity_lsun).log10(),
        (b.radius_rsun / a.radius_rsun).log10(),
    )
}

#[test]
fn jumps_between_phases() {
    // End of the main sequence, base of the giant branch and end of core helium
    // burning: continuous in L and R (< 0.005 dex). Helium ignition: the documented
    // jumps — the helium flash for degenerate cores (tip → 50 Lsun red clump), a drop
    // to 0.8 L (−0.097 dex) for non-degenerate ignition (above M_FGB at the end of the
    // gap, where there is no giant branch).
    let th = RemnantThresholds::default();
    for m in [
        0.9, 1.0, 1.5, 2.0, 2.3, 3.0, 6.0, 9.0, 12.0, 30.0, 90.0, 150.0,
    ] {
        let track = evolution::Track::new(m, &th);
        let no_giant_branch = track.t_hei_gyr == track.t_bgb_gyr;
        for t in [track.t_ms_gyr, track.t_bgb_gyr, track.t_che_end_gyr] {
            if no_giant_branch && t == track.t_bgb_gyr {
                continue;
            }
            let (dl, dr) = jump_dex(m, t);
            assert!(dl.abs() < 5e-3 && dr.abs() < 5e-3, "M {m} t {t}: {dl} {dr}");
        }
        let (dl, dr) = jump_dex(m, track.t_hei_gyr);
        if m <= evolution::M_HEF_MSUN {
            let before =
                evolution::evolve_direct(m, track.t_hei_gyr * (1.0 - 1e-9), &th).luminosity_lsun;
            let after =
                evolution::evolve_direct(m, track.t_hei_gyr * (1.0 + 1e-9), &th).luminosity_lsun;
            assert!(
                after == 50.0 && before > 1000.0,
                "M {m}: {before} → {after}"
            );
        } else if m >= 3.0 {
            assert!((dl - 0.8f64.log10()).abs() < 5e-3, "M {m}: {dl}");
            assert!(dr <= 1e-5 && dr > -0.3, "M {m}: {dr}");
        }
    }
}

#[test]
fn jumps_across_mass_break_points() {
    // Track quantities across the mass break points of the prescription (M_HeF,
    // 1.25 M_HeF, the 2.0/2.5 Msun change of the core-mass–luminosity exponents, the
    // 8–12 Msun radius ramp): changes below 2 % for a 1e-6 change in mass. At the
    // white-dwarf/neutron-star threshold (7.91 Msun) only the last phase changes
    // (AGB growth vs 1 % of t_MS): t_end changes by less than 5 %.
    let th = RemnantThresholds::default();
    for edge in [
        evolution::M_HEF_MSUN,
        1.25 * evolution::M_HEF_MSUN,
        2.0,
        2.5,
        8.0,
        10.0,
        12.0,
    ] {
        let (a, b) = (
            evolution::Track::new(edge * (1.0 - 1e-6), &th),
            evolution::Track::new(edge * (1.0 + 1e-6), &th),
        );
        for (x, y) in [
            (a.t_hei_gyr, b.t_hei_gyr),
            (a.t_che_end_gyr, b.t_che_end_gyr),
            (a.t_end_gyr, b.t_end_gyr),
        ] {
            assert!((x / y - 1.0).abs() < 0.02, "edge {edge}: {x} vs {y}");
        }
        let mid = |t: &evolution::Track| t.state_at(0.5 * (t.t_hei_gyr + t.t_che_end_gyr), &th);
        let (sa, sb) = (mid(&a), mid(&b));
        assert!(
            (sa.luminosity_lsun / sb.luminosity_lsun - 1.0).abs() < 0.02,
            "edge {edge}"
        );
        assert!(
            (sa.radius_rsun / sb.radius_rsun - 1.0).abs() < 0.02,
            "edge {edge}"
        );
    }
    let e = th.white_dwarf_max_initial_msun;
    let (a, b) = (
        evolution::Track::new(e, &th),
        evolution::Track::new(e * (1.0 + 1e-6), &th),
    );
    assert!(
        (a.t_end_gyr / b.t_end_gyr - 1.0).abs() < 0.05,
        "{} {}",
        a.t_end_gyr,
        b.t_end_gyr
    );
}

#[test]
fn jumps_at_the_fit_edges() {
    // 0.1 and 100 Msun: zero jump in L and R (tangent extrapolation, main_sequence.rs).
    for edge in [0.1, 100.0] {
        let below = profile(edge * (1.0 - 1e-9), 0.0, KindChoice::Auto, Fidelity::Fitted);
        let above = profile(edge * (1.0 + 1e-9), 0.0, KindChoice::Auto, Fidelity::Fitted);
        assert!((below.luminosity_lsun / above.luminosity_lsun - 1.0).abs() < 1e-6);
        assert!((below.radius_rsun / above.radius_rsun - 1.0).abs() < 1e-6);
    }
    // Hydrogen-burning limit 0.075 Msun at 4.6 Gyr: brown dwarf fainter by 1–2 dex
    // (documented in brown_dwarf.rs).
    let bd = profile(0.0749, 4.6, KindChoice::Auto, Fidelity::Fitted);
    let star = profile(0.0751, 4.6, KindChoice::Auto, Fidelity::Fitted);
    assert_eq!(
        (bd.kind, star.kind),
        (StarKind::BrownDwarf, StarKind::MainSequence)
    );
    let jump = (star.luminosity_lsun / bd.luminosity_lsun).log10();
    assert!((1.0..2.0).contains(&jump), "{jump}");
}

#[test]
fn black_holes_have_no_light_but_finite_numbers() {
    let p = profile(
        10.0,
        4.6,
        KindChoice::Explicit(StarKind::BlackHole),
        Fidelity::Fitted,
    );
    assert_eq!((p.luminosity_lsun, p.teff_k), (0.0, 0.0));
    assert_eq!(p.color_rgb, [0, 0, 0]);
    // r_s = 2GM/c² = 29.5325 km for 10 Msun from the IAU 2015 B3 nominal (GM)☉ (derived).
    assert!((p.schwarzschild_km() - 29.5325).abs() < 1e-3);
    assert!((p.radius_km() - 29.5325).abs() < 1e-3);
    assert!((p.isco_km() / p.photon_sphere_km() - 2.0).abs() < 1e-12);
    assert_finite(&p);
}

#[test]
fn derived_quantities_of_the_sun() {
    // Nominal Sun (IAU 2015 B3, CODATA 2018 G): mean density 3M/(4πR³) = 1409.8 kg/m³
    // (derived; the often quoted 1408 uses older M and R), surface gravity 274.2 m/s²
    // (derived), circumference 2π·695 700 km = 4.3712e6 km.
    let sun = StarProfile {
        radius_rsun: 1.0,
        mass_msun: 1.0,
        ..profile(1.0, 4.6, KindChoice::Auto, Fidelity::Fitted)
    };
    assert!(
        (sun.mean_density_kg_m3() - 1409.8).abs() < 0.5,
        "{}",
        sun.mean_density_kg_m3()
    );
    assert!((sun.surface_gravity_m_s2() - 274.2).abs() < 0.1);
    assert!((sun.circumference_km() - 4.3712e6).abs() < 1e3);
    // 1 Rsun = 109.08 Earth radii (IAU 2015 B3 nominal values).
    assert!((sun.radius_earth() - 109.076).abs() < 1e-2);
}

#[test]
fn habitable_host_flag_on_profiles() {
    assert!(profile(1.0, 4.6, KindChoice::Auto, Fidelity::Fitted).habitable_host);
    assert!(!profile(1.0, 0.2, KindChoice::Auto, Fidelity::Fitted).habitable_host);
    assert!(!profile(2.0, 1.0, KindChoice::Auto, Fidelity::Fitted).habitable_host);
}

#[test]
fn main_sequence_against_the_mamajek_dwarf_sequence() {
    // Pecaut & Mamajek 2013 (ApJS 208, 9) / Mamajek table version 2024.05.15 (verified
    // against the author's public data repository): rows of
    // (M, log L, R). The table describes field dwarfs of mixed age; we compare with our
    // star at min(4.6 Gyr, 0.4 t_MS). Tolerance: 0.12 dex in L and 16 % in R, the
    // documented accuracy of a ZAMS fit plus our main-sequence prescription (Tout 1996
    // fits are good to ~5 %; mid-life brightening adds 0.1 dex).
    for (m, log_l, r) in [
        (0.155, -2.520, 0.196), // M5V
        (0.585, -1.164, 0.588), // M0V
        (0.70, -0.780, 0.701),  // K5V
        (0.86, -0.324, 0.813),  // K0V
        (1.0, 0.010, 1.012),    // G2V
        (1.07, 0.130, 1.100),   // G0V
        (1.32, 0.556, 1.473),   // F5V
        (1.60, 0.864, 1.728),   // F0V
        (2.33, 1.584, 2.193),   // A0V
        (4.7, 2.772, 3.36),     // B5V
        (17.7, 4.652, 7.16),    // B0V
        (20.2, 4.820, 7.72),    // O9V
    ] {
        let age = (0.4 * main_sequence::t_ms_gyr(m)).min(4.6);
        let p = profile(m, age, KindChoice::Auto, Fidelity::Fitted);
        assert_eq!(p.kind, StarKind::MainSequence);
        let d_log_l = p.luminosity_lsun.log10() - log_l;
        assert!(d_log_l.abs() < 0.12, "M {m}: {d_log_l}");
        assert!(
            (p.radius_rsun / r - 1.0).abs() < 0.16,
            "M {m}: {}",
            p.radius_rsun / r
        );
    }
}

#[test]
fn masses_beyond_the_allowed_range_stay_finite() {
    // The CLI refuses them, but library callers might not: no NaN or infinity.
    for mass in [0.001, 0.01, 151.0, 300.0, 1e3, 1e4] {
        for age in [0.0, 0.001, 1.0, 13.8] {
            for fidelity in [Fidelity::Fitted, Fidelity::Rules] {
                let p = profile(mass, age, KindChoice::Auto, fidelity);
                assert!(
                    p.luminosity_lsun.is_finite() && p.radius_rsun.is_finite(),
                    "{p:?}"
                );
                assert!(p.teff_k.is_finite() && p.abs_mag_v.is_finite(), "{p:?}");
            }
        }
    }
}

#[test]
fn rules_fidelity_profiles() {
    // Textbook rules (common practice, no source): L = M^3.5, R = M^0.8 / M^0.5,
    // t_MS = 10 Gyr M/L, Teff by Stefan–Boltzmann (5772 K at L = R = 1, IAU 2015 B3),
    // HZ sqrt(L/1.1)..sqrt(L/0.53) au.
    let sun = profile(1.0, 4.6, KindChoice::Auto, Fidelity::Rules);
    assert_eq!(
        (sun.luminosity_lsun, sun.radius_rsun, sun.teff_k),
        (1.0, 1.0, 5772.0)
    );
    assert!((sun.hz.inner_au - (1.0f64 / 1.1).sqrt()).abs() < 1e-12);
    assert!((sun.hz.outer_au - (1.0f64 / 0.53).sqrt()).abs() < 1e-12);
    let a_star = profile(2.0, 0.5, KindChoice::Auto, Fidelity::Rules);
    assert!((a_star.luminosity_lsun - 2f64.powf(3.5)).abs() < 1e-9);
    assert!((a_star.radius_rsun - 2f64.sqrt()).abs() < 1e-12);
    assert!((a_star.lifetime_gyr - 10.0 * 2.0 / 2f64.powf(3.5)).abs() < 1e-12);
    let expected_teff = 5772.0 * 2f64.powf(3.5 / 4.0) / 2f64.powf(0.25);
    assert!((a_star.teff_k - expected_teff).abs() < 1e-6);
    // White dwarf of 0.6 Msun: 1 Earth radius × 0.6^(-1/3) (rule of thumb: common
    // practice, no source).
    let wd = profile(
        0.6,
        5.0,
        KindChoice::Explicit(StarKind::WhiteDwarf),
        Fidelity::Rules,
    );
    assert!((wd.radius_earth() - 0.6f64.powf(-1.0 / 3.0)).abs() < 1e-9);
}

#[test]
fn a_1_5_msun_star_at_12_gyr_as_a_profile() {
    // Worked example: a 1.5 Msun star at 12 Gyr is a white dwarf of about 0.6 Msun,
    // initial 1.5 (Cummings et al. 2018, ApJ 866, 21, MIST fit: 0.609; derived).
    let p = profile(1.5, 12.0, KindChoice::Auto, Fidelity::Fitted);
    assert_eq!(p.kind, StarKind::WhiteDwarf);
    assert!((p.mass_msun - 0.6).abs() < 0.02);
    assert_eq!(p.initial_mass_msun, 1.5);
    // Nauenberg radius of 0.609 Msun ≈ 0.0124 Rsun ≈ 1.35 Earth radii (white_dwarf.rs).
    assert!(
        (p.radius_earth() - 1.35).abs() < 0.05,
        "{}",
        p.radius_earth()
    );
    assert!(!p.habitable_host);
}

#[test]
fn main_sequence_against_the_eker_2018_relations() {
    // Eker et al. 2018, MNRAS 479, 5491: empirical MLR from detached eclipsing binaries
    // (Tables 4/5, coefficients from a public code transcription; check values
    // computed from them, derived):
    // L(0.5) = 0.033242, L(1.0) = 0.98401, L(1.5) = 5.9197, L(5) = 734.2,
    // L(10) = 9332.5; MRR R(0.5) = 0.424, R(1.0) = 0.992, R(1.5) = 1.779.
    // Field binaries of mixed age against our star at min(4.6 Gyr, 0.4 t_MS):
    // 0.15 dex in L and 20 % in R (the documented accuracy of our main sequence,
    // ~0.1 dex, plus the MLR's own scatter).
    let at = |m: f64| {
        let age = (0.4 * main_sequence::t_ms_gyr(m)).min(4.6);
        profile(m, age, KindChoice::Auto, Fidelity::Fitted)
    };
    for (m, l) in [
        (0.5, 0.033242),
        (1.0, 0.98401),
        (1.5, 5.9197),
        (5.0, 734.2),
        (10.0, 9332.5),
    ] {
        let d = (at(m).luminosity_lsun / l).log10();
        assert!(d.abs() < 0.15, "M {m}: {d}");
    }
    for (m, r) in [(0.5, 0.424), (1.0, 0.992), (1.5, 1.779)] {
        let ratio = at(m).radius_rsun / r;
        assert!((ratio - 1.0).abs() < 0.20, "M {m}: {ratio}");
    }
}
