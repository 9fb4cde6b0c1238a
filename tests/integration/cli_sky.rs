//! The `sky` command as a user runs it: JSON keys, the CSV list, and
//! one-sentence errors with exit code 2.

use crate::util::{assert_user_error, starloom, stderr, stdout, work_dir};
use starloom::catalogue::{Catalogue, StarRow, write_catalogue};
use starloom::physics::{Fidelity, KindChoice, StarRequest, star_profile};
use starloom::units::{Gigayears, LY_PER_PC, SolarMasses};
use std::path::Path;

fn profile(mass: f64) -> starloom::physics::StarProfile {
    star_profile(
        &StarRequest {
            mass: SolarMasses::new(mass).unwrap(),
            age: Gigayears::new(4.6).unwrap(),
            kind: KindChoice::Auto,
        },
        Fidelity::Fitted,
    )
}

/// A small catalogue: a binary home system, a Sun-like star 10 pc away on
/// +x, a bright star on +y and a faint dwarf far off.
fn write_small(dir: &Path) -> std::path::PathBuf {
    let mut cat = Catalogue::default();
    let rows = [
        (1, 1, "Home", [0.0, 0.0, 0.0], 1.0, 0.0),
        (2, 1, "Home B", [0.0, 0.0, 0.0], 0.5, 20.0),
        (3, 3, "Tenpc", [10.0 * LY_PER_PC, 0.0, 0.0], 1.0, 0.0),
        (4, 4, "Brightside", [0.0, 12.0, 0.0], 2.0, 0.0),
        (5, 5, "Faintling", [0.0, 0.0, -300.0], 0.2, 0.0),
    ];
    for (id, system, name, pos, mass, sep) in rows {
        cat.push(StarRow {
            id,
            system,
            name: name.into(),
            position_ly: pos,
            profile: profile(mass),
            separation_au: sep,
            period_days: 0.0,
            origin: Default::default(),
        });
    }
    let path = dir.join("small.csv");
    write_catalogue(&cat, &path, true).unwrap();
    path
}

#[test]
fn json_lists_the_visible_stars_with_the_documented_keys() {
    let dir = work_dir("sky-json");
    write_small(&dir);
    let out = starloom(&dir, &["sky", "small.csv", "--from", "home", "--json"]);
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    let v: serde_json::Value = serde_json::from_str(&stdout(&out)).unwrap();
    assert_eq!(v["observer"]["name"], "Home");
    let stars = v["stars"].as_array().unwrap();
    for s in stars {
        for key in [
            "name",
            "system",
            "apparent_mag",
            "l_deg",
            "b_deg",
            "distance_ly",
            "visible",
        ] {
            assert!(s.get(key).is_some(), "missing {key} in {s}");
        }
        assert_eq!(s["visible"], true);
    }
    let names: Vec<&str> = stars.iter().map(|s| s["name"].as_str().unwrap()).collect();
    // The companion first (brightest), and the 0.2 Msun dwarf 300 ly away
    // (M_V about 12) is far below the naked-eye limit of 6.5.
    assert_eq!(names[0], "Home B");
    assert!(!names.contains(&"Faintling"));
    assert_eq!(
        v["fainter_count"].as_u64().unwrap() as usize + stars.len(),
        4
    );
    assert!(stars[0]["separation_au"].as_f64().unwrap() > 19.99);
    // The Sun-like star at 10 pc: apparent = absolute magnitude (definition).
    let ten = stars.iter().find(|s| s["name"] == "Tenpc").unwrap();
    assert!(ten["l_deg"].as_f64().unwrap().abs() < 1e-3);
    let brightside = stars.iter().find(|s| s["name"] == "Brightside").unwrap();
    assert!((brightside["l_deg"].as_f64().unwrap() - 90.0).abs() < 1e-3);
    // Seen from the companion, by system id: the primary is 20 au away.
    let out = starloom(
        &dir,
        &["sky", "small.csv", "--from", "2", "--json", "--limit", "20"],
    );
    let v: serde_json::Value = serde_json::from_str(&stdout(&out)).unwrap();
    assert_eq!(v["observer"]["name"], "Home B");
    assert_eq!(v["stars"].as_array().unwrap().len(), 4);
}

#[test]
fn csv_holds_every_other_star() {
    let dir = work_dir("sky-csv");
    write_small(&dir);
    let out = starloom(
        &dir,
        &["sky", "small.csv", "--from", "1", "--out", "sky.csv"],
    );
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    let text = std::fs::read_to_string(dir.join("sky.csv")).unwrap();
    let mut lines = text.lines();
    let header = lines.next().unwrap();
    assert!(header.contains("apparent_mag_v") && header.contains("distance_ly"));
    assert_eq!(lines.count(), 4);
    // An existing file is kept without --force.
    let again = starloom(
        &dir,
        &["sky", "small.csv", "--from", "1", "--out", "sky.csv"],
    );
    assert_user_error(&again, "--force");
}

#[test]
fn bad_input_is_one_sentence_and_exit_code_two() {
    let dir = work_dir("sky-errors");
    write_small(&dir);
    let out = starloom(&dir, &["sky", "small.csv", "--from", "Hone"]);
    assert_user_error(&out, "did you mean 'Home'");
    let out = starloom(
        &dir,
        &["sky", "small.csv", "--from", "Home", "--limit", "bright"],
    );
    assert_user_error(&out, "--limit");
    let out = starloom(
        &dir,
        &[
            "sky",
            "small.csv",
            "--from",
            "Home",
            "--projection",
            "conic",
        ],
    );
    assert_user_error(&out, "mollweide");
    let out = starloom(
        &dir,
        &["sky", "small.csv", "--from", "Home", "--toward", "120,-95"],
    );
    assert_user_error(&out, "--toward");
    let out = starloom(
        &dir,
        &["sky", "small.csv", "--from", "Home", "--out", "sky.txt"],
    );
    assert_user_error(&out, "--out");
    // A negative latitude typed after --toward is a value, not an option.
    let out = starloom(
        &dir,
        &[
            "sky",
            "small.csv",
            "--from",
            "Home",
            "--toward",
            "120,-30",
            "--projection",
            "stereographic",
            "--json",
        ],
    );
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
}
