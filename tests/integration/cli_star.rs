//! The `star` command as a user runs it: golden JSON profiles, readable
//! output, and one-sentence errors with exit code 2.

use crate::util::{assert_user_error, starloom, stdout, work_dir};
use std::path::PathBuf;

fn golden_path(name: &str) -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("tests/golden/star")
        .join(format!("{name}.json"))
}

/// Compares `--json` output with its reference file; `STARLOOM_BLESS=1`
/// rewrites the reference instead.
fn check_golden(name: &str, args: &[&str]) {
    let dir = work_dir(&format!("star-golden-{name}"));
    let out = starloom(&dir, args);
    assert_eq!(out.status.code(), Some(0), "{}", crate::util::stderr(&out));
    let got = stdout(&out);
    let path = golden_path(name);
    if std::env::var_os("STARLOOM_BLESS").is_some() {
        std::fs::create_dir_all(path.parent().unwrap()).unwrap();
        std::fs::write(&path, &got).unwrap();
        return;
    }
    let expected = std::fs::read_to_string(&path)
        .unwrap_or_else(|_| panic!("missing reference {path:?}; run with STARLOOM_BLESS=1"));
    assert_eq!(got, expected, "golden mismatch for {name}");
}

#[test]
fn golden_json_profiles() {
    check_golden(
        "sun_4_6_gyr",
        &["star", "--mass", "1", "--age", "4.6", "--json"],
    );
    check_golden(
        "red_dwarf",
        &["star", "--mass", "0.3", "--age", "5", "--json"],
    );
    check_golden(
        "white_dwarf_from_1_5",
        &["star", "--mass", "1.5", "--age", "12", "--json"],
    );
    check_golden(
        "black_hole_10",
        &["star", "--mass", "10", "--kind", "black-hole", "--json"],
    );
    check_golden(
        "neutron_star_1_4",
        &["star", "--mass", "1.4", "--kind", "neutron-star", "--json"],
    );
    check_golden(
        "rules_sun",
        &[
            "star",
            "--mass",
            "1",
            "--age",
            "4.6",
            "--physics",
            "rules",
            "--json",
        ],
    );
}

#[test]
fn json_has_the_documented_fields() {
    let dir = work_dir("star-fields");
    let out = starloom(&dir, &["star", "--mass", "1.5", "--age", "12", "--json"]);
    let v: serde_json::Value = serde_json::from_str(&stdout(&out)).unwrap();
    for key in [
        "kind",
        "class",
        "mass_msun",
        "initial_mass_msun",
        "radius_rsun",
        "luminosity_lsun",
        "teff_k",
        "age_gyr",
        "lifetime_gyr",
        "hz_inner_au",
        "hz_outer_au",
        "hz_optimistic_inner_au",
        "hz_optimistic_outer_au",
        "colour_hex",
        "abs_mag_v",
        "radius_earth",
    ] {
        assert!(v.get(key).is_some(), "missing {key}");
    }
    // Worked example: 1.5 Msun at 12 Gyr is a white dwarf of
    // about 0.6 Msun (Cummings et al. 2018 IFMR, MIST: 0.080*1.5+0.489 = 0.609).
    assert_eq!(v["kind"], "white-dwarf");
    assert!((v["mass_msun"].as_f64().unwrap() - 0.609).abs() < 0.01);
    assert_eq!(v["initial_mass_msun"], 1.5);
    let bh: serde_json::Value = serde_json::from_str(&stdout(&starloom(
        &dir,
        &["star", "--mass", "10", "--kind", "black-hole", "--json"],
    )))
    .unwrap();
    // r_s = 2953.250 m per Msun from the IAU 2015 B3 nominal GM_sun
    // (derived): 10 Msun -> 29.5325 km.
    assert!((bh["schwarzschild_km"].as_f64().unwrap() - 29.5325).abs() < 1e-3);
    assert!((bh["isco_km"].as_f64().unwrap() - 3.0 * 29.5325).abs() < 3e-3);
    assert!(bh["note"].as_str().unwrap().contains("non-rotating"));
}

#[test]
fn readable_profile_has_units() {
    let dir = work_dir("star-text");
    let text = stdout(&starloom(&dir, &["star", "--mass", "1", "--age", "4.6"]));
    for needle in [
        "Msun",
        "Rsun",
        "Lsun",
        " K",
        "Gyr",
        " au",
        "G2V",
        "simplified models",
    ] {
        assert!(text.contains(needle), "missing {needle:?} in\n{text}");
    }
}

#[test]
fn bad_input_is_one_sentence_and_exit_2() {
    let dir = work_dir("star-errors");
    let cases: &[(&[&str], &str)] = &[
        (&["star", "--mass", "-1"], "--mass"),
        (&["star", "--mass", "nan"], "--mass"),
        (&["star", "--mass", "0"], "--mass"),
        (&["star", "--mass", "151"], "0.013 and 150"),
        (&["star", "--mass", "1", "--age", "-3"], "--age"),
        (&["star", "--mass", "1", "--age", "13.9"], "13.8"),
        (&["star", "--mass", "1", "--kind", "pulsar"], "--kind"),
        (&["star", "--mass", "1.5", "--kind", "white-dwarf"], "1.44"),
        (&["star", "--mass", "3", "--kind", "neutron-star"], "2.3"),
        (&["star", "--mass", "1", "--kind", "black-hole"], "--mass"),
        (&["star", "--mass", "1", "--physics", "exact"], "--physics"),
    ];
    for (args, needle) in cases {
        assert_user_error(&starloom(&dir, args), needle);
    }
}
