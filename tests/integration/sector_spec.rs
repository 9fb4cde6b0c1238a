//! The spec sidecar: `populate` writes `PATH.toml`, and `--spec PATH.toml`
//! regenerates the same catalogue; flags override the file; a fresh seed
//! is printed and repeats the file.

use crate::util::{read_bytes, starloom_ok, stdout, work_dir};

#[test]
fn sector_sidecar_regenerates_the_same_file() {
    let dir = work_dir("sector-spec-sidecar");
    starloom_ok(
        &dir,
        &[
            "populate",
            "--cylinder",
            "40,30pc",
            "--centre",
            "-50,12.5,-3",
            "--seed",
            "777",
            "--disk",
            "--ages",
            "0.5,9",
            "--home",
            "--title",
            "Test Reach",
            "--out",
            "first.csv",
        ],
    );
    let side = String::from_utf8(read_bytes(&dir, "first.csv.toml")).unwrap();
    assert!(side.contains("777"), "seed in the sidecar:\n{side}");
    assert!(side.contains("cylinder"), "shape in the sidecar:\n{side}");
    starloom_ok(
        &dir,
        &[
            "populate",
            "--spec",
            "first.csv.toml",
            "--out",
            "second.csv",
        ],
    );
    let first = read_bytes(&dir, "first.csv");
    assert!(first.len() > 10_000, "{} bytes", first.len());
    assert!(
        first == read_bytes(&dir, "second.csv"),
        "regenerated file differs"
    );
    // The regenerated file's own sidecar holds the same resolved spec.
    assert_eq!(side.as_bytes(), &read_bytes(&dir, "second.csv.toml")[..]);
    // JSONL from the same spec file also works.
    starloom_ok(
        &dir,
        &[
            "populate",
            "--spec",
            "first.csv.toml",
            "--out",
            "third.jsonl",
        ],
    );
}

#[test]
fn sector_flags_override_the_spec_file() {
    let dir = work_dir("sector-spec-override");
    let base = ["--box", "60,60,60", "--centre", "10,0,0"];
    let run = |extra: &[&str], out: &str| {
        let mut args = vec!["populate"];
        args.extend_from_slice(extra);
        args.extend_from_slice(&["--out", out]);
        starloom_ok(&dir, &args);
        read_bytes(&dir, out)
    };
    let mut a = base.to_vec();
    a.extend_from_slice(&["--seed", "5"]);
    let five = run(&a, "five.csv");
    // --seed on the command line replaces the file's seed ...
    let six_from_file = run(&["--spec", "five.csv.toml", "--seed", "6"], "six-file.csv");
    let mut b = base.to_vec();
    b.extend_from_slice(&["--seed", "6"]);
    let six = run(&b, "six.csv");
    assert!(
        six_from_file == six,
        "--seed 6 over the file equals a plain seed-6 run"
    );
    assert!(six != five, "seed 6 differs from seed 5");
    // ... and a shape on the command line replaces the file's shape.
    let sphere_from_file = run(&["--spec", "five.csv.toml", "--sphere", "25"], "s-file.csv");
    let sphere = run(
        &["--sphere", "25", "--centre", "10,0,0", "--seed", "5"],
        "s.csv",
    );
    assert!(sphere_from_file == sphere, "--sphere over the file's box");
    // Density from the command line too.
    let dense_from_file = run(
        &["--spec", "five.csv.toml", "--density", "0.005"],
        "d-file.csv",
    );
    let mut c = a.clone();
    c.extend_from_slice(&["--density", "0.005"]);
    let dense = run(&c, "d.csv");
    assert!(dense_from_file == dense, "--density over the file");
    assert!(dense.len() > five.len(), "twice the density, more rows");
}

#[test]
fn sector_fresh_seed_is_printed_and_repeats_the_file() {
    let dir = work_dir("sector-spec-fresh-seed");
    let out = starloom_ok(&dir, &["populate", "--sphere", "30", "--out", "fresh.csv"]);
    let text = stdout(&out);
    // The line reads "seed N (drawn fresh; pass --seed N to repeat)".
    let line = text
        .lines()
        .find(|l| l.starts_with("seed "))
        .unwrap_or_else(|| panic!("no seed line in:\n{text}"));
    assert!(line.contains("fresh"), "{line}");
    let seed: u64 = line
        .split_whitespace()
        .nth(1)
        .and_then(|s| s.parse().ok())
        .unwrap_or_else(|| panic!("no seed number in {line:?}"));
    let side = String::from_utf8(read_bytes(&dir, "fresh.csv.toml")).unwrap();
    assert!(
        side.contains(&seed.to_string()),
        "sidecar records the drawn seed"
    );
    let s = seed.to_string();
    starloom_ok(
        &dir,
        &[
            "populate",
            "--sphere",
            "30",
            "--seed",
            s.as_str(),
            "--out",
            "again.csv",
        ],
    );
    assert!(read_bytes(&dir, "fresh.csv") == read_bytes(&dir, "again.csv"));
}
