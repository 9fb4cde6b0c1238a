//! The spec sidecar: `populate` writes `PATH.toml`, and `--spec PATH.toml`
//! regenerates the same catalogue; flags override the file; a fresh seed
//! is printed and repeats the file.

use crate::util::{assert_user_error, read_bytes, starloom, starloom_ok, stderr, stdout, work_dir};

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

/// Writes a sidecar for a small cylinder with home, pins off, and returns
/// its text.
fn good_sidecar(dir: &std::path::Path) -> String {
    starloom_ok(
        dir,
        &[
            "populate",
            "--cylinder",
            "40,20",
            "--seed",
            "3",
            "--out",
            "good.csv",
        ],
    );
    String::from_utf8(read_bytes(dir, "good.csv.toml")).unwrap()
}

/// The 1-based line of `text` that starts with `key =`.
fn line_of(text: &str, key: &str) -> usize {
    text.lines()
        .position(|l| l.starts_with(&format!("{key} =")))
        .unwrap_or_else(|| panic!("no {key} in:\n{text}"))
        + 1
}

/// Runs `populate --spec bad.toml` on `text` with `line` replaced by
/// `with`, and asserts one sentence, exit code 2, nothing written, naming
/// the file, the line and `key` but not `flag`.
fn check_file_value_is_blamed_on_the_file(
    dir: &std::path::Path,
    text: &str,
    line: &str,
    with: &str,
    key: &str,
    flag: &str,
) {
    assert!(text.contains(line), "no {line:?} in:\n{text}");
    let bad = text.replacen(line, with, 1);
    std::fs::write(dir.join("bad.toml"), &bad).unwrap();
    let out = starloom(dir, &["populate", "--spec", "bad.toml", "--out", "x.csv"]);
    let needle = format!("bad.toml, line {}: {key} got ", line_of(&bad, key));
    assert_user_error(&out, &needle);
    let err = stderr(&out);
    assert!(!err.contains(flag), "{flag} was not typed: {err}");
    assert!(!dir.join("x.csv").exists(), "{with:?} left a catalogue");
    assert!(!dir.join("x.csv.toml").exists(), "{with:?} left a sidecar");
}

#[test]
fn sector_bad_values_in_a_spec_file_name_the_file_line_and_key() {
    let dir = work_dir("sector-spec-bad-values");
    let text = good_sidecar(&dir);
    for (line, with, key, flag) in [
        (
            "radius_ly = 40.0",
            "radius_ly = -40.0",
            "radius_ly",
            "--cylinder",
        ),
        (
            "height_ly = 20.0",
            "height_ly = \"5 furlongs\"",
            "height_ly",
            "--cylinder",
        ),
        (
            "radius_ly = 40.0",
            "radius_ly = 1e7",
            "radius_ly",
            "--cylinder",
        ),
        (
            "imf = \"kirkpatrick\"",
            "imf = \"salpeter\"",
            "imf",
            "--imf",
        ),
        ("density = 0.0025", "density = 0.0", "density", "--density"),
        (
            "ages_gyr = [0.0, 11.2]",
            "ages_gyr = [5.0, 1.0]",
            "ages_gyr",
            "--ages",
        ),
        (
            "ages_gyr = [0.0, 11.2]",
            "ages_gyr = [5.0]",
            "ages_gyr",
            "--ages",
        ),
        (
            "centre_ly = [0.0, 0.0, 0.0]",
            "centre_ly = [1.0, 2.0]",
            "centre_ly",
            "--centre",
        ),
        (
            "centre_ly = [0.0, 0.0, 0.0]",
            "centre_ly = [1e7, 0.0, 0.0]",
            "centre_ly",
            "--centre",
        ),
        (
            "density_model = \"uniform\"",
            "density_model = \"disk\"\nthick_share = 2.0",
            "thick_share",
            "--thick-share",
        ),
        (
            "physics = \"fitted\"",
            "physics = \"exact\"",
            "physics",
            "--physics",
        ),
        (
            "pin_clear_ly = 3.0",
            "pin_clear_ly = -1.0",
            "pin_clear_ly",
            "--pin-clear",
        ),
        (
            "pin_clear_ly = 3.0",
            "pin_clear_ly = 3.0\nshard = \"9/4\"",
            "shard",
            "--shard",
        ),
        (
            "pin_clear_ly = 3.0",
            "pin_clear_ly = 3.0\npin = \"nowhere.csv\"",
            "pin",
            "--pin",
        ),
        (
            "kind = \"cylinder\"",
            "kind = \"cone\"",
            "kind",
            "--cylinder",
        ),
    ] {
        check_file_value_is_blamed_on_the_file(&dir, &text, line, with, key, flag);
    }
    // A box's edge lengths, in a file of its own.
    starloom_ok(
        &dir,
        &[
            "populate", "--box", "10,10,10", "--seed", "3", "--out", "box.csv",
        ],
    );
    let text = String::from_utf8(read_bytes(&dir, "box.csv.toml")).unwrap();
    check_file_value_is_blamed_on_the_file(
        &dir,
        &text,
        "size_ly = [10.0, 10.0, 10.0]",
        "size_ly = [10.0, 0.0, 10.0]",
        "size_ly",
        "--box",
    );
}

#[test]
fn sector_bad_flag_over_a_spec_file_still_names_the_flag() {
    let dir = work_dir("sector-spec-bad-flag");
    let text = good_sidecar(&dir);
    // The file's bad value is replaced by the flag, so only the flag is named.
    let bad = text.replacen("imf = \"kirkpatrick\"", "imf = \"salpeter\"", 1);
    std::fs::write(dir.join("bad.toml"), bad).unwrap();
    for (flag, value) in [
        ("--imf", "woosley"),
        ("--cylinder", "-4,3"),
        ("--ages", "5,1"),
        ("--centre", "1,2"),
        ("--density", "0"),
        ("--physics", "exact"),
    ] {
        let out = starloom(
            &dir,
            &[
                "populate",
                "--spec",
                "good.csv.toml",
                flag,
                value,
                "--out",
                "x.csv",
            ],
        );
        assert_user_error(&out, &format!("{flag} got "));
        assert!(!stderr(&out).contains("line"), "{}", stderr(&out));
    }
    let out = starloom(
        &dir,
        &[
            "populate", "--spec", "bad.toml", "--imf", "woosley", "--out", "x.csv",
        ],
    );
    assert_user_error(&out, "--imf got 'woosley'");
    assert!(!stderr(&out).contains("bad.toml"), "{}", stderr(&out));
    // A good flag over the file's bad value is used.
    starloom_ok(
        &dir,
        &[
            "populate", "--spec", "bad.toml", "--imf", "kroupa", "--out", "x.csv",
        ],
    );
}
