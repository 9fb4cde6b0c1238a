//! The `map` command as a user runs it: bad input gives one sentence,
//! exit code 2 and no file.

use crate::util::{assert_user_error, starloom, starloom_ok, stderr, stdout, work_dir};
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

/// Decodes a PNG into (width, height, RGBA bytes) and its pHYs pixels per metre.
fn decode(path: &Path) -> (u32, u32, Vec<u8>, usize, Option<u32>) {
    let file = std::io::BufReader::new(std::fs::File::open(path).unwrap());
    let mut reader = png::Decoder::new(file).read_info().unwrap();
    let ppm = reader.info().pixel_dims.map(|d| d.xppu);
    let mut buf = vec![0; reader.output_buffer_size().unwrap()];
    let info = reader.next_frame(&mut buf).unwrap();
    buf.truncate(info.buffer_size());
    (info.width, info.height, buf, info.color_type.samples(), ppm)
}

/// Centroid of the inked (not white) pixels within `half` px of `around`.
fn ink_centroid(
    png: &(u32, u32, Vec<u8>, usize, Option<u32>),
    around: [f64; 2],
    half: i64,
) -> [f64; 2] {
    let (w, h, buf, ch, _) = png;
    let (mut sx, mut sy, mut n) = (0.0, 0.0, 0.0);
    for y in (around[1] as i64 - half).max(0)..(around[1] as i64 + half).min(*h as i64) {
        for x in (around[0] as i64 - half).max(0)..(around[0] as i64 + half).min(*w as i64) {
            let i = (y as usize * *w as usize + x as usize) * ch;
            let ink = 765.0 - (buf[i] as f64 + buf[i + 1] as f64 + buf[i + 2] as f64);
            sx += ink * (x as f64 + 0.5);
            sy += ink * (y as f64 + 0.5);
            n += ink;
        }
    }
    assert!(n > 0.0, "nothing drawn near {around:?}");
    [sx / n, sy / n]
}

#[test]
fn a_star_lands_on_the_pixel_the_scale_says() {
    let dir = work_dir("map-pixels");
    std::fs::write(
        dir.join("probe.csv"),
        "name,x_ly,y_ly,z_ly,teff_k\nEast,10,0,0,3500\nNorthwest,-10,5,0,3500\n",
    )
    .unwrap();
    let out = starloom(
        &dir,
        &[
            "map",
            "probe.csv",
            "--out",
            "probe.png",
            "--centre",
            "0,0,0",
            "--scale",
            "5ly/cm",
            "--dpi",
            "100",
            "--hide",
            "grid,labels,legend,scalebar,title,stalks,frame",
        ],
    );
    assert_eq!(out.status.code(), Some(0), "{}", crate::util::stderr(&out));
    let png = decode(&dir.join("probe.png"));
    // A4 landscape at 100 dpi: 297 mm → 1169 px, 210 mm → 827 px.
    assert_eq!((png.0, png.1), (1169, 827));
    // pHYs: 100 dpi = round(100 / 0.0254) = 3937 px/m.
    assert_eq!(png.4, Some(3937));
    // No panel: the map fills 10–287 × 10–200 mm, centred at (148.5, 105) mm.
    // 5 ly/cm = 2 mm/ly; +x right, +y up the sheet.
    let px = |mm: f64| mm / 25.4 * 100.0;
    for (x_mm, y_mm) in [(148.5 + 20.0, 105.0), (148.5 - 20.0, 105.0 - 10.0)] {
        let c = ink_centroid(&png, [px(x_mm), px(y_mm)], 14);
        assert!(
            (c[0] - px(x_mm)).abs() < 1.0 && (c[1] - px(y_mm)).abs() < 1.0,
            "star at {c:?}, expected ({}, {})",
            px(x_mm),
            px(y_mm)
        );
    }
}

#[test]
fn maps_are_written_in_every_view_and_tiled_when_large() {
    let dir = setup("map-views");
    for args in [
        &["--view", "top"][..],
        &["--view", "oblique", "--tilt", "50"],
        &["--view", "perspective", "--eye", "-300,-200,150"],
        &[
            "--view",
            "perspective",
            "--look",
            "-1,-1,0",
            "--theme",
            "screen",
        ],
    ] {
        let mut a = vec![
            "map",
            "stars.csv",
            "--out",
            "v.svg",
            "--force",
            "--dpi",
            "50",
        ];
        a.extend_from_slice(args);
        let out = starloom(&dir, &a);
        assert_eq!(
            out.status.code(),
            Some(0),
            "{args:?}: {}",
            crate::util::stderr(&out)
        );
    }
    // 10 ly across (plus 4 %) at 2 cm per ly is 208 mm each way: it fits
    // the width of a tile (273 mm) but is taller than one A4 map area (190 mm), so 2 rows × 1 column of
    // tiles (186 mm map height each, 176 mm steps) plus an index.
    let out = starloom(
        &dir,
        &[
            "map",
            "stars.csv",
            "--out",
            "big.png",
            "--scale",
            "1ly/2cm",
            "--dpi",
            "30",
        ],
    );
    assert_eq!(out.status.code(), Some(0), "{}", crate::util::stderr(&out));
    for name in ["big.index.png", "big.r1c1.png", "big.r2c1.png"] {
        assert!(dir.join(name).exists(), "{name} missing");
    }
    assert!(!dir.join("big.r1c2.png").exists());
    assert!(!dir.join("big.png").exists());
    // The message counts one column in the singular and, with only three
    // files, names them all.
    let said = crate::util::stdout(&out);
    assert!(
        said.contains("an index sheet and 2 tiles (2 rows × 1 column) at ")
            && said.contains(": big.index.png, big.r1c1.png and big.r2c1.png"),
        "{said}"
    );
    // Existing files are kept without --force, and nothing new appears.
    let out = starloom(
        &dir,
        &[
            "map",
            "stars.csv",
            "--out",
            "big.png",
            "--scale",
            "1ly/2cm",
            "--dpi",
            "30",
        ],
    );
    assert_user_error(&out, "--force");
}

#[test]
fn a_generated_sector_is_mapped_about_its_own_centre() {
    // The sidecar records the sector's centre; the map centres on it and
    // measures heights from its plane, not from the middle of the stars'
    // bounding box (which never falls exactly on it).
    let dir = work_dir("cli_map_sidecar_centre");
    crate::util::starloom_ok(
        &dir,
        &[
            "populate", "--sphere", "25", "--centre", "-50,0,10", "--seed", "5", "--out", "s.csv",
        ],
    );
    crate::util::starloom_ok(&dir, &["map", "s.csv", "--out", "s.svg"]);
    let svg = std::fs::read_to_string(dir.join("s.svg")).unwrap();
    assert!(svg.contains("centre -50, 0, 10 ly"), "title block centre");
    assert!(
        svg.contains("heights from the plane z = 10 ly"),
        "height plane"
    );
    // --centre still wins.
    crate::util::starloom_ok(
        &dir,
        &["map", "s.csv", "--out", "t.svg", "--centre", "-50,0,0"],
    );
    let svg = std::fs::read_to_string(dir.join("t.svg")).unwrap();
    assert!(svg.contains("heights from the plane z = 0 ly"));
}

/// Width and height from a PNG's IHDR and its pixels per metre from
/// pHYs, without decoding the pixels.
fn png_header(path: &Path) -> (u32, u32, Option<u32>) {
    let file = std::io::BufReader::new(std::fs::File::open(path).unwrap());
    let reader = png::Decoder::new(file).read_info().unwrap();
    let info = reader.info();
    (info.width, info.height, info.pixel_dims.map(|d| d.xppu))
}

#[test]
fn the_highest_resolution_draws_the_smallest_paper() {
    // The top of the --dpi range on A4, the smallest paper: it was refused
    // as too many pixels, and 2000 dpi as too many bytes; the PNG is
    // drawn and written band by band, so both work. A4 landscape at
    // 2400 dpi: 297/25.4*2400 = 28062.99 → 28063 px, 210/25.4*2400 =
    // 19842.52 → 19843 px; round(2400/0.0254) = 94488 px per metre.
    let dir = setup("map-top-dpi");
    let out = starloom_ok(
        &dir,
        &["map", "stars.csv", "--out", "map.png", "--dpi", "2400"],
    );
    assert!(stderr(&out).is_empty(), "{}", stderr(&out));
    assert_eq!(
        png_header(&dir.join("map.png")),
        (28063, 19843, Some(94488))
    );
    // The Hertzsprung–Russell diagram of summary too (an A4 landscape
    // page).
    starloom_ok(
        &dir,
        &["summary", "stars.csv", "--hr", "hr.png", "--dpi", "2400"],
    );
    assert_eq!(png_header(&dir.join("hr.png")), (28063, 19843, Some(94488)));
}

#[test]
fn vector_title_blocks_name_no_resolution() {
    let dir = setup("map-vector-title");
    starloom_ok(&dir, &["map", "stars.csv", "--out", "map.svg"]);
    let svg = String::from_utf8(std::fs::read(dir.join("map.svg")).unwrap()).unwrap();
    assert!(svg.contains(">A4 landscape<"), "title block of map.svg");
    assert!(!svg.contains("dpi"), "map.svg names a resolution");
    // Also when one is given (it sets nothing in a vector file).
    starloom_ok(
        &dir,
        &[
            "map",
            "stars.csv",
            "--out",
            "dpi.svg",
            "--dpi",
            "600",
            "--portrait",
        ],
    );
    let svg = String::from_utf8(std::fs::read(dir.join("dpi.svg")).unwrap()).unwrap();
    assert!(svg.contains(">A4 portrait<") && !svg.contains("dpi"));
}

#[test]
fn filters_that_leave_nothing_are_named_in_a_note() {
    let dir = work_dir("map-empty-filters");
    // East is the only white dwarf and the only system above z = 0.
    std::fs::write(
        dir.join("stars.csv"),
        "name,x_ly,y_ly,z_ly,kind\nHome,0,0,0,main-sequence\n\
         East,10,0,2,white-dwarf\nNorth,0,10,-3,main-sequence\n",
    )
    .unwrap();
    let cases: &[(&[&str], &str)] = &[
        (
            &["--z-range", "1000,2000"],
            "no systems match --z-range 1000,2000 ly; the sheet shows none",
        ),
        (
            &["--only", "neutron-star"],
            "no systems match --only neutron-star; the sheet shows none",
        ),
        // Each leaves none alone: both are named.
        (
            &[
                "--only",
                "neutron-star,black-hole",
                "--z-range",
                "1000,2000",
            ],
            "no systems match --only neutron-star,black-hole with --z-range 1000,2000 ly;",
        ),
        // Only one of them leaves none alone: only that one is named.
        (
            &["--only", "white-dwarf", "--z-range", "-1000,-500"],
            "no systems match --z-range -1000,-500 ly;",
        ),
        // Each leaves a system, but not the same one: both are named.
        (
            &["--only", "white-dwarf", "--z-range", "-5,0"],
            "no systems match --only white-dwarf with --z-range -5,0 ly;",
        ),
    ];
    for (k, (extra, note)) in cases.iter().enumerate() {
        let name = format!("empty{k}.svg");
        let mut args = vec!["map", "stars.csv", "--out", name.as_str()];
        args.extend_from_slice(extra);
        let out = starloom_ok(&dir, &args);
        let err = stderr(&out);
        assert_eq!(err.lines().count(), 1, "{extra:?}: {err}");
        assert!(
            err.starts_with(&format!("starloom: note: {note}")),
            "{extra:?}: {err}"
        );
        assert!(stdout(&out).contains("(0 systems, "), "{}", stdout(&out));
        let svg = String::from_utf8(std::fs::read(dir.join(&name)).unwrap()).unwrap();
        assert!(svg.contains(">0 systems shown<"), "{extra:?}");
    }
    // A filter that leaves something says nothing.
    let out = starloom_ok(
        &dir,
        &[
            "map",
            "stars.csv",
            "--out",
            "some.svg",
            "--only",
            "white-dwarf",
        ],
    );
    assert!(stderr(&out).is_empty(), "{}", stderr(&out));
    assert!(stdout(&out).contains("(1 system, "), "{}", stdout(&out));
}
