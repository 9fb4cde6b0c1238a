//! The demo command: writes the whole scenario into `output/` under the
//! current folder, and a second run replaces its own files.

use crate::util::{starloom, stderr, work_dir};

const FILES: &[&str] = &[
    "amberline.csv",
    "amberline.csv.toml",
    "amberline_pins.csv",
    "amberline_summary.txt",
    "amberline_summary.json",
    "amberline_links.csv",
    "amberline_lanes.csv",
    "amberline_network.json",
    "amberline_route.txt",
    "amberline_hr.png",
    "amberline_map.png",
    "amberline_map.pdf",
    "sun_20ly.csv",
    "sun_20ly_map.png",
    "quillon_sky.csv",
    "quillon_sky.png",
    "profiles/quillon.txt",
    "profiles/quillon.json",
    "profiles/the_tollgate.json",
];

#[test]
fn demo_writes_the_scenario_and_replaces_its_own_files() {
    let dir = work_dir("cli_demo");
    for run in 0..2 {
        let out = starloom(&dir, &["demo"]);
        assert!(out.status.success(), "run {run}: {}", stderr(&out));
    }
    for f in FILES {
        let path = dir.join("output").join(f);
        let len = std::fs::metadata(&path)
            .unwrap_or_else(|_| panic!("{f} missing"))
            .len();
        assert!(len > 0, "{f} is empty");
    }
    // The key stars are what the scenario says they are.
    let read = |f: &str| std::fs::read_to_string(dir.join("output").join(f)).unwrap();
    let giant: serde_json::Value =
        serde_json::from_str(&read("profiles/the_tollgate.json")).unwrap();
    assert_eq!(giant["kind"], "giant");
    let sable: serde_json::Value =
        serde_json::from_str(&read("profiles/sable_cradle.json")).unwrap();
    assert_eq!(sable["kind"], "white-dwarf");
    // The real-neighbourhood table holds both real and generated rows.
    let real = read("sun_20ly.csv");
    assert!(real.contains(",hipparcos"), "real stars present");
    assert!(real.contains(",generated"), "generated fill present");
    // PNG sheets carry their DPI.
    let png = std::fs::read(dir.join("output/amberline_map.png")).unwrap();
    let decoder = png::Decoder::new(std::io::Cursor::new(png));
    let reader = decoder.read_info().unwrap();
    let dims = reader.info().pixel_dims.expect("pHYs chunk");
    // 150 dpi = 5905.5 px/m, rounded.
    assert_eq!(dims.xppu, 5906);
    // The same seed gives the same catalogue on every run.
    let first = std::fs::read(dir.join("output/amberline.csv")).unwrap();
    assert!(starloom(&dir, &["demo"]).status.success());
    assert_eq!(
        first,
        std::fs::read(dir.join("output/amberline.csv")).unwrap()
    );
}
