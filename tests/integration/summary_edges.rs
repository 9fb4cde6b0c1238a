//! `summary` on a shard's catalogue (density over the shard's part of the
//! volume) and on an empty sector (zeros, never NaN).

use crate::util::{starloom_ok, stdout, work_dir};
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
