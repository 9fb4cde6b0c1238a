//! The `routes` and `neighbours` commands as a user runs them, on a
//! hand-made catalogue whose network is worked out by hand (see the
//! comments): JSON keys and values, CSV files, exit codes 1 and 2.

use crate::util::{assert_user_error, starloom, stderr, stdout, work_dir};
use std::path::Path;

/// Single stars (no `system` column: each row is its own system, id =
/// row number from 1). Ash(0,0,0) Birch(4/3,0) Bramble(8/3,0) Cedar(4,0)
/// Elm(2,1.2) Fern(2,−1) — a white dwarf — and Zelkova(20,0).
const CATALOGUE: &str = "name,x_ly,y_ly,z_ly,kind,mass_msun,age_gyr
Ash,0,0,0,main-sequence,1.0,4.6
Birch,1.3333333333333333,0,0,main-sequence,0.8,4.6
Bramble,2.6666666666666665,0,0,main-sequence,0.5,4.6
Cedar,4,0,0,main-sequence,1.1,4.6
Elm,2,1.2,0,main-sequence,0.3,4.6
Fern,2,-1,0,white-dwarf,0.6,4.6
Zelkova,20,0,0,main-sequence,0.9,4.6
";

fn setup(name: &str) -> std::path::PathBuf {
    let dir = work_dir(name);
    std::fs::write(dir.join("hand.csv"), CATALOGUE).unwrap();
    dir
}

fn json_of(dir: &Path, args: &[&str]) -> serde_json::Value {
    let out = starloom(dir, args);
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    serde_json::from_str(&stdout(&out)).expect("JSON on stdout")
}

#[test]
fn network_summary_json() {
    let dir = setup("routes-summary");
    let v = json_of(&dir, &["routes", "hand.csv", "--jump", "2.4", "--json"]);
    // 12 links, 2 regions (Zelkova alone), lanes by hand (routes.rs test).
    assert_eq!(v["systems"], 7);
    assert_eq!(v["links"], 12);
    assert_eq!(v["regions"], 2);
    assert_eq!(v["isolated_systems"], 1);
    assert_eq!(v["largest_region"], 6);
    let lanes = 2.0 * (4.0f64 / 9.0 + 1.0).sqrt() + 2.0 * 4.0 / 3.0 + (4.0f64 / 9.0 + 1.44).sqrt();
    assert!((v["lanes_ly"].as_f64().unwrap() - lanes).abs() < 1e-6);
}

#[test]
fn links_and_lanes_files() {
    let dir = setup("routes-files");
    let out = starloom(
        &dir,
        &[
            "routes",
            "hand.csv",
            "--jump",
            "2.4",
            "--out",
            "links.csv",
            "--lanes-out",
            "lanes.csv",
        ],
    );
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    let links = std::fs::read_to_string(dir.join("links.csv")).unwrap();
    let lines: Vec<&str> = links.lines().collect();
    assert_eq!(lines[0], "from_system,to_system,distance_ly");
    assert_eq!(lines.len(), 13);
    // Ash (1) – Birch (2), 4/3 ly; rows sorted by (from, to).
    assert_eq!(lines[1], "1,2,1.333333");
    let pairs: Vec<(u64, u64)> = lines[1..]
        .iter()
        .map(|l| {
            let f: Vec<&str> = l.split(',').collect();
            (f[0].parse().unwrap(), f[1].parse().unwrap())
        })
        .collect();
    assert!(pairs.windows(2).all(|w| w[0] < w[1]));
    assert!(pairs.iter().all(|p| p.0 < p.1));
    let lanes = std::fs::read_to_string(dir.join("lanes.csv")).unwrap();
    assert_eq!(lanes.lines().count(), 6);
    // Without --force an existing file is kept and the run refused.
    let again = starloom(
        &dir,
        &["routes", "hand.csv", "--jump", "2.4", "--out", "links.csv"],
    );
    assert_user_error(&again, "already exists");
}

#[test]
fn route_json_by_distance_and_jumps() {
    let dir = setup("routes-route");
    let v = json_of(
        &dir,
        &[
            "routes", "hand.csv", "--jump", "2.4", "--from", "ash", "--to", "Cedar", "--json",
        ],
    );
    assert_eq!(v["path"], serde_json::json!([1, 2, 3, 4]));
    assert_eq!(v["jumps"], 3);
    assert!((v["distance_ly"].as_f64().unwrap() - 4.0).abs() < 1e-9);
    let v = json_of(
        &dir,
        &[
            "routes", "hand.csv", "--jump", "2.4", "--from", "1", "--to", "4", "--by", "jumps",
            "--speed", "0.5", "--json",
        ],
    );
    // Fern (6) is the shorter of the two 2-jump routes: 2√5 ly.
    assert_eq!(v["path"], serde_json::json!([1, 6, 4]));
    assert_eq!(v["jumps"], 2);
    let d = 2.0 * 5f64.sqrt();
    assert!((v["distance_ly"].as_f64().unwrap() - d).abs() < 1e-9);
    assert!((v["travel_days"].as_f64().unwrap() - d / 0.5).abs() < 1e-9);
    // Avoiding white dwarfs leaves Elm (5).
    let v = json_of(
        &dir,
        &[
            "routes",
            "hand.csv",
            "--jump",
            "2.4",
            "--from",
            "Ash",
            "--to",
            "Cedar",
            "--by",
            "jumps",
            "--avoid",
            "white-dwarf",
            "--jump-time",
            "3",
            "--json",
        ],
    );
    assert_eq!(v["path"], serde_json::json!([1, 5, 4]));
    assert!((v["travel_days"].as_f64().unwrap() - 6.0).abs() < 1e-12);
}

#[test]
fn plain_itinerary_names_every_stop() {
    let dir = setup("routes-plain");
    let out = starloom(
        &dir,
        &[
            "routes", "hand.csv", "--jump", "2.4", "--from", "Ash", "--to", "Cedar",
        ],
    );
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    let text = stdout(&out);
    for name in ["Ash", "Birch", "Bramble", "Cedar"] {
        assert!(text.contains(name), "{text}");
    }
    assert!(text.contains("1.33 ly"), "{text}");
}

#[test]
fn unreachable_exits_1_and_names_the_range() {
    let dir = setup("routes-unreachable");
    let out = starloom(
        &dir,
        &[
            "routes", "hand.csv", "--jump", "2.4", "--from", "Ash", "--to", "Zelkova",
        ],
    );
    assert_eq!(out.status.code(), Some(1), "{}", stderr(&out));
    let err = stderr(&out);
    // Zelkova is 16 ly from Cedar, its nearest system.
    assert!(err.contains("cannot be reached"), "{err}");
    assert!(err.contains("16.000 ly"), "{err}");
    assert_eq!(err.trim_end().lines().count(), 1, "{err}");
}

#[test]
fn bad_input_exits_2_with_one_sentence() {
    let dir = setup("routes-bad");
    for jump in ["-1", "0", "nan", "inf", "abc"] {
        assert_user_error(
            &starloom(&dir, &["routes", "hand.csv", "--jump", jump]),
            "--jump",
        );
    }
    assert_user_error(
        &starloom(&dir, &["routes", "missing.csv", "--jump", "5"]),
        "missing.csv",
    );
    assert_user_error(
        &starloom(
            &dir,
            &[
                "routes", "hand.csv", "--jump", "5", "--from", "Ahs", "--to", "Cedar",
            ],
        ),
        "did you mean Ash",
    );
    assert_user_error(
        &starloom(
            &dir,
            &[
                "routes", "hand.csv", "--jump", "5", "--from", "Ash", "--to", "Cedar", "--avoid",
                "pulsar",
            ],
        ),
        "--avoid",
    );
    assert_user_error(
        &starloom(
            &dir,
            &[
                "routes", "hand.csv", "--jump", "5", "--from", "Ash", "--to", "Cedar", "--by",
                "time",
            ],
        ),
        "--by",
    );
    assert_user_error(
        &starloom(
            &dir,
            &["routes", "hand.csv", "--jump", "5", "--from", "Ash"],
        ),
        "--to",
    );
    for k in ["0", "-3", "2.5"] {
        assert_user_error(
            &starloom(&dir, &["neighbours", "hand.csv", "--k", k]),
            "--k",
        );
    }
    assert_user_error(
        &starloom(&dir, &["neighbours", "hand.csv", "--within", "-2"]),
        "--within",
    );
    assert_user_error(
        &starloom(&dir, &["neighbors", "nowhere.csv"]),
        "nowhere.csv",
    );
}

#[test]
fn neighbours_csv() {
    let dir = setup("neighbours-csv");
    let out = starloom(
        &dir,
        &["neighbors", "hand.csv", "--k", "2", "--out", "n.csv"],
    );
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    let text = std::fs::read_to_string(dir.join("n.csv")).unwrap();
    let lines: Vec<&str> = text.lines().collect();
    assert_eq!(lines[0], "system,neighbour,rank,distance_ly");
    assert_eq!(lines.len(), 1 + 7 * 2);
    // Zelkova (7): Cedar at 16 ly, then Bramble at 52/3 ly.
    assert!(lines.contains(&"7,4,1,16.000000"), "{text}");
    assert!(lines.contains(&"7,3,2,17.333333"), "{text}");
    // Within 1.25 ly: only Birch and Bramble have one (Fern, 1.2019 ly).
    let out = starloom(&dir, &["neighbours", "hand.csv", "--within", "1.25"]);
    let text = stdout(&out);
    assert_eq!(text.lines().count(), 1 + 4, "{text}");
    assert!(text.contains("2,6,1,1.201850"), "{text}");
}
