//! `summary` on a shard's catalogue (density over the shard's part of the
//! volume) and on an empty sector (zeros, never NaN).

use crate::util::{assert_user_error, read_bytes, starloom, starloom_ok, stdout, work_dir};
use starloom::sampler::{Shard, shard_volume_ly3};
use starloom::spec::{SectorSpec, Shape};

fn json(dir: &std::path::Path, file: &str) -> serde_json::Value {
    let out = starloom_ok(dir, &["summary", file, "--json"]);
    serde_json::from_str(&stdout(&out)).expect("summary --json is JSON")
}

#[test]
fn a_shard_summary_uses_the_shards_share_of_the_volume() {
    let dir = work_dir("summary_shard");
    starloom_ok(
        &dir,
        &[
            "populate", "--sphere", "40", "--seed", "3", "--shard", "1/3", "--out", "s1.csv",
        ],
    );
    let spec = SectorSpec::new(3, Shape::Sphere { radius_ly: 40.0 }, [0.0; 3]);
    // Sphere volume 4/3·π·r³ (geometry).
    let whole = 4.0 / 3.0 * std::f64::consts::PI * 40f64.powi(3);
    assert!((shard_volume_ly3(&spec, None) - whole).abs() < 1e-6 * whole);
    let parts: Vec<f64> = (1..=3)
        .map(|k| shard_volume_ly3(&spec, Some(Shard { index: k, count: 3 })))
        .collect();
    // The three shards' parts cover the sphere once. The midpoint rule on
    // 1.25 ly sub-cubes errs by less than one sub-cube (1.95 ly³) per
    // sub-cube the surface crosses (about 4πr²/1.25² ≈ 1.3·10^4, i.e.
    // 2.5·10^4 ly³ at worst); the errors largely cancel, and 1 % of the
    // volume (2.7·10^3 ly³) is a loose bound: common practice, no source.
    let sum: f64 = parts.iter().sum();
    assert!((sum - whole).abs() < 0.01 * whole, "{parts:?} vs {whole}");
    for p in &parts {
        assert!(*p > 0.1 * whole && *p < 0.6 * whole, "{parts:?}");
    }
    let v = json(&dir, "s1.csv");
    let volume = v["volume_ly3"].as_f64().unwrap();
    assert!(
        (volume - parts[0]).abs() < 1e-6 * parts[0],
        "{volume} vs {}",
        parts[0]
    );
    let stars = v["stars"].as_u64().unwrap() as f64;
    let density = v["star_density_per_ly3"].as_f64().unwrap();
    assert!((density - stars / parts[0]).abs() < 1e-12);
}

#[test]
fn an_empty_sector_summarises_to_zeros_without_nan() {
    let dir = work_dir("summary_empty");
    // A 1 ly³ box holds 0.0025 stars on average; seed 2 draws none.
    starloom_ok(
        &dir,
        &[
            "populate", "--box", "1,1,1", "--seed", "2", "--out", "e.csv",
        ],
    );
    let v = json(&dir, "e.csv");
    assert_eq!(v["objects"].as_u64(), Some(0));
    assert_eq!(v["stars"].as_u64(), Some(0));
    assert_eq!(v["systems"].as_u64(), Some(0));
    for (key, value) in v.as_object().unwrap() {
        if !value.is_object() {
            let x = value
                .as_f64()
                .unwrap_or_else(|| panic!("{key} is {value}, not a number"));
            assert!(x.is_finite(), "{key} = {x}");
        }
    }
    assert_eq!(v["star_density_per_ly3"].as_f64(), Some(0.0));
    assert_eq!(v["nearest_neighbour_mean_ly"].as_f64(), Some(0.0));
    // A user's file with a header and no rows, without a sidecar.
    std::fs::write(dir.join("u.csv"), "x_ly,y_ly,z_ly\n").unwrap();
    for file in ["e.csv", "u.csv"] {
        let text = stdout(&starloom_ok(&dir, &["summary", file]));
        assert!(text.starts_with("0 objects: 0 stars"), "{text}");
        assert!(!text.to_lowercase().contains("nan"), "{text}");
        assert!(!text.contains("inf"), "{text}");
    }
}

#[test]
fn empty_results_read_back_as_empty_catalogues() {
    let dir = work_dir("summary_empty_results");
    // Shard 50 of 64 of a 5 ly sphere holds no cells: a 0-byte file.
    starloom_ok(
        &dir,
        &[
            "populate", "--sphere", "5", "--seed", "9", "--shard", "50/64", "--out", "e.csv",
        ],
    );
    assert!(read_bytes(&dir, "e.csv").is_empty());
    // A 0.5 pc sphere with seed 1 holds no stars: JSONL with no objects.
    starloom_ok(
        &dir,
        &[
            "populate", "--sphere", ".5pc", "--seed", "1", "--out", "u.jsonl",
        ],
    );
    for file in ["e.csv", "u.jsonl"] {
        assert_eq!(json(&dir, file)["objects"].as_u64(), Some(0), "{file}");
        let text = stdout(&starloom_ok(&dir, &["summary", file]));
        assert!(text.starts_with("0 objects: 0 stars"), "{file}: {text}");
        // A map of nothing is an empty sheet; routes find no systems.
        starloom_ok(&dir, &["map", file, "--out", &format!("{file}.png")]);
        let text = stdout(&starloom_ok(&dir, &["routes", file, "--jump", "5"]));
        assert!(text.contains("0 systems"), "{file}: {text}");
        let out = starloom(
            &dir,
            &["routes", file, "--jump", "5", "--from", "1", "--to", "2"],
        );
        assert_user_error(&out, "not in the catalogue");
    }
    // A 0-byte file that populate did not write (no sidecar) still needs a header.
    std::fs::write(dir.join("blank.csv"), "").unwrap();
    assert_user_error(&starloom(&dir, &["summary", "blank.csv"]), "empty");
}

#[test]
fn a_later_shard_without_its_header_gets_a_clear_message() {
    let dir = work_dir("summary_headerless_shard");
    for k in ["1/2", "2/2"] {
        let out = format!("s{}.csv", &k[..1]);
        starloom_ok(
            &dir,
            &[
                "populate", "--sphere", "30", "--seed", "9", "--shard", k, "--out", &out,
            ],
        );
    }
    let out = starloom(&dir, &["summary", "s2.csv"]);
    assert_user_error(&out, "s2.csv: the file has no header row");
    assert_user_error(&out, "prepend the first shard's header line");
    // Prepending shard 1's header line makes it readable.
    let first = read_bytes(&dir, "s1.csv");
    let header_end = first.iter().position(|&b| b == b'\n').unwrap() + 1;
    let mut whole = first[..header_end].to_vec();
    whole.extend_from_slice(&read_bytes(&dir, "s2.csv"));
    std::fs::write(dir.join("s2-whole.csv"), whole).unwrap();
    let text = stdout(&starloom_ok(&dir, &["summary", "s2-whole.csv"]));
    assert!(!text.starts_with("0 objects"), "{text}");
    // A user's file of bare numbers is told to add a header.
    std::fs::write(dir.join("n.csv"), "1,2,3\n").unwrap();
    assert_user_error(
        &starloom(&dir, &["summary", "n.csv"]),
        "no header row: its first line is data; add a header row",
    );
}

#[test]
fn populate_help_says_later_shards_have_no_header() {
    let dir = work_dir("populate_help_shard");
    let text = stdout(&starloom_ok(&dir, &["populate", "--help"]));
    // Help text wraps at the terminal's width: compare words only.
    let words = text.split_whitespace().collect::<Vec<_>>().join(" ");
    assert!(
        words.contains("only shard 1 has the CSV header row"),
        "{text}"
    );
}
