//! Tests of the sky view against worked examples.

use super::*;
use crate::catalogue::StarRow;
use crate::physics::photometry::abs_mag_v;
use crate::physics::{Fidelity, KindChoice, StarKind, StarProfile, StarRequest, star_profile};
use crate::units::{Gigayears, LY_PER_PC, SolarMasses};

fn sun_profile() -> StarProfile {
    star_profile(
        &StarRequest {
            mass: SolarMasses::new(1.0).unwrap(),
            age: Gigayears::new(4.6).unwrap(),
            kind: KindChoice::Auto,
        },
        Fidelity::Fitted,
    )
}

/// A profile with a chosen absolute magnitude (other fields from the Sun).
fn profile_with_mag(m: f64) -> StarProfile {
    let mut p = sun_profile();
    p.abs_mag_v = m;
    p
}

fn row(id: u64, system: u64, name: &str, pos: [f64; 3], p: StarProfile, sep_au: f64) -> StarRow {
    StarRow {
        id,
        system,
        name: name.into(),
        position_ly: pos,
        profile: p,
        separation_au: sep_au,
        period_days: 0.0,
        origin: Default::default(),
    }
}

fn find<'a>(view: &'a SkyView, name: &str) -> &'a SkyStar {
    view.stars.iter().find(|s| s.name == name).unwrap()
}

#[test]
fn sun_seen_from_one_au() {
    // M_V of the Sun from the physics core: M_bol = 4.74 (IAU 2015
    // Resolution B2) minus BC_V(5772 K) = −0.081 (Torres 2010, AJ 140,
    // 1158, Table 1) = 4.821. Seen from 1 au it must give V☉ = −26.76 ±
    // 0.03 (Torres 2010, abstract).
    let m_v = abs_mag_v(StarKind::MainSequence, 5772.0, 1.0);
    assert!((m_v - 4.821).abs() < 0.002, "{m_v}");
    let mut cat = Catalogue::default();
    // A dim primary with a Sun-like companion at exactly 1 au.
    cat.push(row(
        1,
        1,
        "Dim",
        [5.0, -3.0, 2.0],
        profile_with_mag(15.0),
        0.0,
    ));
    cat.push(row(
        2,
        1,
        "Dim B",
        [5.0, -3.0, 2.0],
        profile_with_mag(m_v),
        1.0,
    ));
    let view = sky_view(&cat, 0, &SkyOptions::default());
    let b = find(&view, "Dim B");
    assert!(
        (b.apparent_mag - (-26.76)).abs() < 0.03,
        "{}",
        b.apparent_mag
    );
    assert!((b.separation_au.unwrap() - 1.0).abs() < 1e-12);
    assert!((b.distance_ly * AU_PER_LY - 1.0).abs() < 1e-9);
}

#[test]
fn at_ten_parsecs_apparent_equals_absolute() {
    // Definition of absolute magnitude: m = M at 10 pc (m − M =
    // 5 log10(d / 10 pc)); and at 100 pc m = M + 5.
    let mut cat = Catalogue::default();
    cat.push(row(1, 1, "Here", [0.0; 3], profile_with_mag(5.0), 0.0));
    cat.push(row(
        2,
        2,
        "Ten",
        [0.0, 0.0, 10.0 * LY_PER_PC],
        profile_with_mag(1.3),
        0.0,
    ));
    cat.push(row(
        3,
        3,
        "Hundred",
        [100.0 * LY_PER_PC, 0.0, 0.0],
        profile_with_mag(1.3),
        0.0,
    ));
    let view = sky_view(&cat, 0, &SkyOptions::default());
    assert!((find(&view, "Ten").apparent_mag - 1.3).abs() < 1e-9);
    assert!((find(&view, "Hundred").apparent_mag - 6.3).abs() < 1e-9);
}

#[test]
fn an_a1_dwarf_at_two_point_six_parsecs() {
    // An A1V dwarf (Teff 9940 K, L = 25.4 L☉) at 2.64 pc (parallax 379.21
    // mas, van Leeuwen 2007): published V = −1.47 for this star, α CMa A
    // (shared light-and-maps sheet §3.5). Tolerance 0.1 mag, the accuracy
    // of the Teff/L inputs.
    let m_v = abs_mag_v(StarKind::MainSequence, 9940.0, 25.4);
    let mut cat = Catalogue::default();
    cat.push(row(1, 1, "Here", [0.0; 3], profile_with_mag(5.0), 0.0));
    cat.push(row(
        2,
        2,
        "Bright",
        [0.0, 2.64 * LY_PER_PC, 0.0],
        profile_with_mag(m_v),
        0.0,
    ));
    let view = sky_view(&cat, 0, &SkyOptions::default());
    let s = find(&view, "Bright");
    assert!((s.apparent_mag - (-1.47)).abs() < 0.1, "{}", s.apparent_mag);
    assert!(s.visible);
}

#[test]
fn directions_of_stars_on_the_axes() {
    // Galactic axes (IAU 1958 system as used by the catalogue): +x is
    // l = 0°, b = 0°; +y is l = 90°; +z is b = +90°. From an observer away
    // from the origin the same axes apply.
    let obs = [10.0, 20.0, -5.0];
    let mut cat = Catalogue::default();
    cat.push(row(1, 1, "Obs", obs, profile_with_mag(5.0), 0.0));
    let offsets = [
        ("px", [3.0, 0.0, 0.0], (0.0, 0.0)),
        ("py", [0.0, 3.0, 0.0], (90.0, 0.0)),
        ("mx", [-3.0, 0.0, 0.0], (180.0, 0.0)),
        ("my", [0.0, -3.0, 0.0], (270.0, 0.0)),
        ("pz", [0.0, 0.0, 3.0], (f64::NAN, 90.0)),
        ("mz", [0.0, 0.0, -3.0], (f64::NAN, -90.0)),
        ("diag", [1.0, 1.0, 2f64.sqrt()], (45.0, 45.0)),
    ];
    for (i, (name, d, _)) in offsets.iter().enumerate() {
        let p = [obs[0] + d[0], obs[1] + d[1], obs[2] + d[2]];
        cat.push(row(
            10 + i as u64,
            10 + i as u64,
            name,
            p,
            profile_with_mag(5.0),
            0.0,
        ));
    }
    let view = sky_view(&cat, 0, &SkyOptions::default());
    for (name, d, (l, b)) in offsets {
        let s = find(&view, name);
        assert!((s.b_deg - b).abs() < 1e-9, "{name} b {}", s.b_deg);
        if !l.is_nan() {
            assert!((s.l_deg - l).abs() < 1e-9, "{name} l {}", s.l_deg);
        }
        let r = (d[0] * d[0] + d[1] * d[1] + d[2] * d[2]).sqrt();
        assert!((s.distance_ly - r).abs() < 1e-9);
    }
}

#[test]
fn a_star_behind_the_companion_is_not_lost() {
    // The companion sits 5 au away in its fixed direction; a distant star
    // of another system lies exactly behind it. Both must be listed, in
    // the same direction, the companion far brighter.
    let dir = companion_direction(2);
    let far = [50.0 * dir[0], 50.0 * dir[1], 50.0 * dir[2]];
    let mut cat = Catalogue::default();
    cat.push(row(1, 1, "Home", [0.0; 3], profile_with_mag(5.0), 0.0));
    cat.push(row(2, 1, "Home B", [0.0; 3], profile_with_mag(8.0), 5.0));
    cat.push(row(3, 3, "Beyond", far, profile_with_mag(0.0), 0.0));
    let view = sky_view(&cat, 0, &SkyOptions::default());
    assert_eq!(view.stars.len(), 2);
    let b = find(&view, "Home B");
    let beyond = find(&view, "Beyond");
    assert!((b.l_deg - beyond.l_deg).abs() < 1e-9 && (b.b_deg - beyond.b_deg).abs() < 1e-9);
    assert!((beyond.distance_ly - 50.0).abs() < 1e-9);
    // 5 au = 2.424e-5 pc: m = 8 + 5 log10(2.424e-6) = −20.08.
    assert!(b.apparent_mag < beyond.apparent_mag);
    assert!(b.visible && beyond.visible);
    assert_eq!(view.visible_count, 2);
}

#[test]
fn a_companion_observer_sees_its_primary_at_the_separation() {
    let mut cat = Catalogue::default();
    cat.push(row(
        1,
        1,
        "Pri",
        [1.0, 2.0, 3.0],
        profile_with_mag(4.0),
        0.0,
    ));
    cat.push(row(
        2,
        1,
        "Pri B",
        [1.0, 2.0, 3.0],
        profile_with_mag(9.0),
        40.0,
    ));
    cat.push(row(
        3,
        1,
        "Pri C",
        [1.0, 2.0, 3.0],
        profile_with_mag(9.0),
        300.0,
    ));
    let view = sky_view(&cat, 1, &SkyOptions::default());
    let a = find(&view, "Pri");
    assert!((a.separation_au.unwrap() - 40.0).abs() < 1e-9);
    // The direction to the primary is opposite to B's offset.
    let d = companion_direction(2);
    let (l, b) = crate::coords::direction_to_lb([-d[0], -d[1], -d[2]]);
    assert!((a.l_deg - l).abs() < 1e-9 && (a.b_deg - b).abs() < 1e-9);
    // B to C: between |300 − 40| and 300 + 40 au (triangle inequality).
    let c = find(&view, "Pri C").separation_au.unwrap();
    assert!((260.0..=340.0).contains(&c), "{c}");
}

#[test]
fn companion_directions_are_unit_and_fixed() {
    for id in [0u64, 1, 2, 12345, u64::MAX] {
        let d = companion_direction(id);
        let n = (d[0] * d[0] + d[1] * d[1] + d[2] * d[2]).sqrt();
        assert!((n - 1.0).abs() < 1e-12);
        assert_eq!(d, companion_direction(id));
    }
}

#[test]
fn extinction_adds_its_rate_times_distance() {
    // A uniform 0.5 mag per 1000 ly (common practice in the plane) over
    // 2000 ly dims a star by 1.0 mag on top of the distance modulus.
    let m0 = apparent_mag_with_extinction(0.0, 2000.0, 0.0);
    let m1 = apparent_mag_with_extinction(0.0, 2000.0, 0.5);
    assert!((m1 - m0 - 1.0).abs() < 1e-12);
    assert_eq!(
        apparent_mag_with_extinction(NO_LIGHT_MAG, 10.0, 0.5),
        NO_LIGHT_MAG
    );
}

fn scattered(n: u64) -> Catalogue {
    let mut cat = Catalogue::default();
    for i in 0..n {
        let t = i as f64;
        let pos = [
            (t * 7.3) % 41.0 - 20.0,
            (t * 3.1) % 37.0 - 18.0,
            (t * 5.7) % 29.0 - 14.0,
        ];
        cat.push(row(
            i + 1,
            i + 1,
            &format!("S{i}"),
            pos,
            profile_with_mag((t * 0.37) % 12.0),
            0.0,
        ));
    }
    cat
}

#[test]
fn same_view_whatever_the_thread_count() {
    let cat = scattered(3000);
    let run = |threads| {
        rayon::ThreadPoolBuilder::new()
            .num_threads(threads)
            .build()
            .unwrap()
            .install(|| sky_view(&cat, 17, &SkyOptions::default()))
    };
    let a = run(1);
    let b = run(3);
    assert_eq!(a, b);
    assert_eq!(sky_csv(&a), sky_csv(&b));
    assert!(
        a.stars
            .windows(2)
            .all(|w| w[0].apparent_mag <= w[1].apparent_mag)
    );
    assert!(a.visible().iter().all(|s| s.apparent_mag <= 6.5));
    assert!(
        a.stars[a.visible_count..]
            .iter()
            .all(|s| s.apparent_mag > 6.5)
    );
}

#[test]
fn observers_by_id_name_and_suggestions() {
    let mut cat = Catalogue::default();
    cat.push(row(7, 7, "Velora", [0.0; 3], profile_with_mag(5.0), 0.0));
    cat.push(row(8, 7, "Velora B", [0.0; 3], profile_with_mag(9.0), 3.0));
    cat.push(row(
        9,
        9,
        "Tamsin",
        [1.0, 0.0, 0.0],
        profile_with_mag(5.0),
        0.0,
    ));
    assert_eq!(find_observer(&cat, "7").unwrap(), 0);
    assert_eq!(find_observer(&cat, "8").unwrap(), 1);
    assert_eq!(find_observer(&cat, "velora b").unwrap(), 1);
    assert_eq!(find_observer(&cat, " TAMSIN ").unwrap(), 2);
    let err = find_observer(&cat, "Velorra").unwrap_err().to_string();
    assert!(
        err.contains("'Velora'") && err.contains("did you mean"),
        "{err}"
    );
    let err = find_observer(&cat, "Zzzzzzzz").unwrap_err().to_string();
    assert!(!err.contains("did you mean"), "{err}");
    // Levenshtein (1966) distances: kitten → sitting is 3.
    let k: Vec<char> = "kitten".chars().collect();
    let s: Vec<char> = "sitting".chars().collect();
    assert_eq!(crate::routes::edit_distance(&k, &s), 3);
}

#[test]
fn csv_has_units_in_its_header_and_one_line_per_star() {
    let cat = scattered(50);
    let view = sky_view(&cat, 0, &SkyOptions::default());
    let text = String::from_utf8(sky_csv(&view)).unwrap();
    let mut lines = text.lines();
    assert_eq!(lines.next().unwrap(), CSV_HEADER);
    assert_eq!(lines.count(), 49);
}

#[test]
fn dot_sizes_fall_with_magnitude() {
    // Linear size classes (common practice for printed atlases, no
    // standard): r(limit) = r_min, r(bright) = r_max, monotone between.
    use chart::dot_radius_mm;
    assert_eq!(dot_radius_mm(6.5, 6.5, 0.15, 1.5), 0.15);
    assert_eq!(dot_radius_mm(chart::BRIGHT_KEY_MAG, 6.5, 0.15, 1.5), 1.5);
    assert_eq!(dot_radius_mm(-27.0, 6.5, 0.15, 1.5), 1.5);
    let mut last = f32::INFINITY;
    for i in -20..70 {
        let r = dot_radius_mm(f64::from(i) / 10.0, 6.5, 0.15, 1.5);
        assert!(r <= last);
        last = r;
    }
}

#[test]
fn chart_puts_increasing_longitude_to_the_left() {
    // Seen from inside the sphere, l increases to the left (common
    // practice for all-sky galactic charts).
    let mut cat = Catalogue::default();
    cat.push(row(1, 1, "Obs", [0.0; 3], profile_with_mag(5.0), 0.0));
    cat.push(row(
        2,
        2,
        "East",
        [0.0, 2.0, 0.0],
        profile_with_mag(1.0),
        0.0,
    ));
    cat.push(row(
        3,
        3,
        "West",
        [0.0, -2.0, 0.0],
        profile_with_mag(2.0),
        0.0,
    ));
    cat.push(row(
        4,
        4,
        "North",
        [0.1, 0.0, 2.0],
        profile_with_mag(3.0),
        0.0,
    ));
    let view = sky_view(&cat, 0, &SkyOptions::default());
    for projection in [
        Projection::HammerAitoff,
        Projection::Mollweide,
        Projection::Equirectangular,
        Projection::Stereographic {
            centre_lat_rad: 0.0,
        },
    ] {
        let opts = ChartOptions {
            projection,
            ..ChartOptions::default()
        };
        let scene = sky_chart(&view, &opts);
        let stars = scene
            .items
            .iter()
            .find_map(|i| match i {
                crate::render::scene::Item::Stars { centres_mm, .. } => Some(centres_mm.clone()),
                _ => None,
            })
            .unwrap();
        // Drawn faintest first: North, West, East.
        assert_eq!(stars.len(), 3, "{projection:?}");
        let (north, west, east) = (stars[0], stars[1], stars[2]);
        let cx = scene.width_mm / 2.0;
        assert!(east[0] < cx && west[0] > cx, "{projection:?}");
        assert!(north[1] < east[1], "{projection:?}");
        let labels: Vec<&str> = scene
            .items
            .iter()
            .filter_map(|i| match i {
                crate::render::scene::Item::Text { text, .. } => Some(text.as_str()),
                _ => None,
            })
            .collect();
        assert!(labels.contains(&"East") && labels.contains(&"The sky from Obs"));
    }
}
