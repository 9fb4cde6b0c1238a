//! Tiling: adjacent regions join seamlessly, a sphere is a subset of its
//! bounding box, and shards concatenate to the single-run file.

use crate::util::{read_bytes, starloom_ok, work_dir};
use std::collections::BTreeMap;
use std::path::Path;

/// Data rows of a CSV file keyed by their `id` (the first column).
fn rows_by_id(dir: &Path, name: &str) -> BTreeMap<u64, String> {
    let text = String::from_utf8(read_bytes(dir, name)).unwrap();
    let mut lines = text.lines();
    assert!(lines.next().unwrap().starts_with("id,system,"), "header");
    let mut out = BTreeMap::new();
    for line in lines {
        let id: u64 = line.split(',').next().unwrap().parse().unwrap();
        assert!(
            out.insert(id, line.to_string()).is_none(),
            "duplicate id {id}"
        );
    }
    out
}

fn populate(dir: &Path, shape: &[&str], centre: &str, out: &str) {
    let mut args = vec!["populate"];
    args.extend_from_slice(shape);
    args.extend_from_slice(&["--centre", centre, "--seed", "4242", "--out", out]);
    starloom_ok(dir, &args);
}

#[test]
fn sector_adjacent_boxes_hold_exactly_their_union() {
    let dir = work_dir("sector-tiling-boxes");
    // x ∈ [-40, 0) and [0, 40) against x ∈ [-40, 40); edges not on the
    // 10 ly cell grid in y and z (±20 is, so shift by 3 ly) to cover cells
    // cut by the shape.
    populate(&dir, &["--box", "40,40,40"], "-20,3,3", "west.csv");
    populate(&dir, &["--box", "40,40,40"], "20,3,3", "east.csv");
    populate(&dir, &["--box", "80,40,40"], "0,3,3", "union.csv");
    let west = rows_by_id(&dir, "west.csv");
    let east = rows_by_id(&dir, "east.csv");
    let union = rows_by_id(&dir, "union.csv");
    // 0.0025 × 80·40·40 = 320 stars expected in the union.
    assert!(union.len() > 200, "{} rows", union.len());
    assert!(!west.is_empty() && !east.is_empty());
    let mut joined = west.clone();
    for (id, row) in &east {
        assert!(
            joined.insert(*id, row.clone()).is_none(),
            "id {id} in both halves"
        );
    }
    assert_eq!(joined.len(), union.len(), "row counts");
    for (id, row) in &union {
        assert_eq!(joined.get(id), Some(row), "row of id {id}");
    }
}

#[test]
fn sector_sphere_is_a_subset_of_its_bounding_box() {
    let dir = work_dir("sector-tiling-sphere");
    let centre = "-12.5,7,31";
    let radius_ly = 45.0;
    populate(&dir, &["--sphere", "45"], centre, "sphere.csv");
    populate(&dir, &["--box", "90,90,90"], centre, "box.csv");
    let sphere = rows_by_id(&dir, "sphere.csv");
    let cube = rows_by_id(&dir, "box.csv");
    // 0.0025 × 4/3 π 45³ ≈ 950 stars expected in the sphere.
    assert!(sphere.len() > 600, "{} rows", sphere.len());
    for (id, row) in &sphere {
        assert_eq!(cube.get(id), Some(row), "sphere row {id} in the box");
    }
    // And every box row well inside the radius is in the sphere (positions
    // are written to 0.001 ly, so rows within 0.01 ly of the surface are
    // left out of this direction of the check).
    let c = [-12.5, 7.0, 31.0];
    for (id, row) in &cube {
        let f: Vec<&str> = row.split(',').collect();
        let p: Vec<f64> = f[4..7].iter().map(|v| v.parse().unwrap()).collect();
        let r = ((p[0] - c[0]).powi(2) + (p[1] - c[1]).powi(2) + (p[2] - c[2]).powi(2)).sqrt();
        if r < radius_ly - 0.01 {
            assert!(
                sphere.contains_key(id),
                "box row {id} at {r} ly missing from the sphere"
            );
        } else if r > radius_ly + 0.01 {
            assert!(
                !sphere.contains_key(id),
                "row {id} at {r} ly is outside the sphere"
            );
        }
    }
}

#[test]
fn sector_shards_concatenate_to_the_single_run() {
    let dir = work_dir("sector-tiling-shards");
    let shape = ["--box", "130,70,50"];
    populate(&dir, &shape, "5,-5,0", "whole.csv");
    let whole = read_bytes(&dir, "whole.csv");
    for n in [2u32, 3, 5] {
        let mut joined = Vec::new();
        for k in 1..=n {
            let name = format!("part-{k}-of-{n}.csv");
            let shard = format!("{k}/{n}");
            let mut args = vec!["populate"];
            args.extend_from_slice(&shape);
            args.extend_from_slice(&[
                "--centre",
                "5,-5,0",
                "--seed",
                "4242",
                "--shard",
                shard.as_str(),
                "--out",
                name.as_str(),
            ]);
            starloom_ok(&dir, &args);
            let part = read_bytes(&dir, &name);
            let header_lines = part.starts_with(b"id,system,") as u32;
            assert_eq!(
                header_lines,
                (k == 1) as u32,
                "header only in shard 1 ({shard})"
            );
            joined.extend_from_slice(&part);
        }
        assert!(
            joined == whole,
            "{n} shards concatenated differ from the single run"
        );
    }
    assert!(whole.len() > 50_000, "{} bytes", whole.len());
}
