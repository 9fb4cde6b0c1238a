//! The `map` command as a user runs it: bad input gives one sentence,
//! exit code 2 and no file.

use crate::util::{assert_user_error, starloom, work_dir};
use std::path::Path;

const HAND_MADE: &str = "name,x_ly,y_ly,z_ly\nHome,0,0,0\nEast,10,0,2\nNorth,0,10,-3\n";

fn setup(name: &str) -> std::path::PathBuf {
    let dir = work_dir(name);
    std::fs::write(dir.join("stars.csv"), HAND_MADE).unwrap();
    dir
}

fn no_output(dir: &Path) {
    let files: Vec<_> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .filter(|n| n != "stars.csv" && n != "bad.csv")
        .collect();
    assert!(files.is_empty(), "no file may be written: {files:?}");
}

#[test]
fn bad_options_are_one_sentence_and_write_nothing() {
    let dir = setup("map-bad-options");
    let cases: &[(&[&str], &str)] = &[
        (&["--paper", "b5"], "--paper"),
        (&["--view", "side"], "--view"),
        (&["--theme", "neon"], "--theme"),
        (&["--dpi", "5"], "--dpi"),
        (&["--dpi", "2401"], "--dpi"),
        (&["--scale", "-2ly/cm"], "--scale"),
        (&["--scale", "0ly/cm"], "--scale"),
        (&["--scale", "5furlongs/cm"], "--scale"),
        (&["--label", "some"], "--label"),
        (&["--hide", "grid,sky"], "--hide"),
        (&["--only", "dwarf"], "--only"),
        (&["--z-range", "10,-10"], "--z-range"),
        (&["--centre", "1,2"], "--centre"),
        (&["--view", "perspective", "--eye", "-300,-200"], "--eye"),
        (&["--view", "oblique", "--tilt", "120"], "--tilt"),
        (&["--tilt", "20"], "--tilt"),
        (&["--lanes"], "--jump"),
        (&["--jump", "-5"], "--jump"),
        (&["--jump", "8", "--route", "Home"], "--route"),
        (&["--paper", "a0", "--portrait", "--dpi", "2400"], "--dpi"),
        (
            &["--view", "perspective", "--eye", "1,1,1", "--look", "1,1,1"],
            "--eye",
        ),
    ];
    for (extra, needle) in cases {
        let mut args = vec!["map", "stars.csv", "--out", "map.png"];
        args.extend_from_slice(extra);
        let out = starloom(&dir, &args);
        assert_user_error(&out, needle);
        no_output(&dir);
    }
    let out = starloom(&dir, &["map", "stars.csv", "--out", "map.gif"]);
    assert_user_error(&out, "--out");
}

#[test]
fn bad_catalogues_are_one_sentence_and_write_nothing() {
    let dir = setup("map-bad-catalogue");
    let out = starloom(&dir, &["map", "missing.csv", "--out", "map.png"]);
    assert_user_error(&out, "missing.csv");
    std::fs::write(
        dir.join("bad.csv"),
        "name,x_ly,y_ly,z_ly\nA,1,2,3\nB,4,five,6\n",
    )
    .unwrap();
    let out = starloom(&dir, &["map", "bad.csv", "--out", "map.png"]);
    assert_user_error(&out, "line 3");
    assert_user_error(&out, "y_ly");
    no_output(&dir);
}
