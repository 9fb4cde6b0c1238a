//! `populate` and `summary` as a user runs them: home system, pins, the
//! disk model, ages, mass functions, remnants, the summary's JSON, and
//! one-sentence errors with exit code 2 that leave no file behind.

use crate::util::{assert_user_error, read_bytes, starloom, starloom_ok, stdout, work_dir};
use starloom::Catalogue;
use starloom::catalogue::read_catalogue;
use starloom::physics::StarKind;
use std::path::Path;

fn populate(dir: &Path, args: &[&str], out: &str) -> Catalogue {
    let mut all = vec!["populate"];
    all.extend_from_slice(args);
    all.extend_from_slice(&["--out", out]);
    starloom_ok(dir, &all);
    read_catalogue(&dir.join(out)).unwrap()
}

fn dist(a: [f64; 3], b: [f64; 3]) -> f64 {
    ((a[0] - b[0]).powi(2) + (a[1] - b[1]).powi(2) + (a[2] - b[2]).powi(2)).sqrt()
}

/// Rows that start a system (the primary carries the system's id).
fn primaries(c: &Catalogue) -> impl Iterator<Item = usize> + '_ {
    (0..c.len()).filter(|&i| c.id[i] == c.system[i])
}

#[test]
fn sector_home_system_sits_at_a_negative_centre() {
    let dir = work_dir("sector-cli-home");
    let c = populate(
        &dir,
        &[
            "--sphere", "40", "--centre", "-50,0,0", "--home", "--seed", "8",
        ],
        "home.csv",
    );
    let centre = [-50.0, 0.0, 0.0];
    let home: Vec<usize> = (0..c.len())
        .filter(|&i| dist(c.position_ly(i), centre) < 1e-3)
        .collect();
    assert_eq!(home.len(), 1, "one single star at the centre");
    let h = home[0];
    assert_eq!(c.kind[h], StarKind::MainSequence);
    assert_eq!(
        c.class[h].letter(),
        'G',
        "sun-like: {}",
        c.class[h].as_str()
    );
    assert!((c.mass_msun[h] - 1.0).abs() < 1e-3);
    // The Sun: Teff 5772 K (IAU 2015 Resolution B3); the fitted physics at
    // 4.57 Gyr is within a few per cent of it.
    assert!((c.teff_k[h] / 5772.0 - 1.0).abs() < 0.05, "{}", c.teff_k[h]);
    // Generated systems are cleared within the default 3 ly.
    for i in primaries(&c) {
        if i != h {
            assert!(
                dist(c.position_ly(i), centre) >= 3.0,
                "row {i} crowds the home system"
            );
        }
    }
    // Every position lies inside the requested sphere around -50,0,0.
    for i in 0..c.len() {
        assert!(dist(c.position_ly(i), centre) <= 40.0 + 1e-3, "row {i}");
    }
}

#[test]
fn sector_pins_place_the_users_systems_and_clear_around_them() {
    let dir = work_dir("sector-cli-pins");
    std::fs::write(
        dir.join("pins.csv"),
        "name,x_ly,y_ly,z_ly,mass_msun\n\
         Harbour Light,10.5,-3.25,4.4,0.9\n\
         Cinder Gate,-20,15,-7,\n",
    )
    .unwrap();
    let pins = [
        ("Harbour Light", [10.5, -3.25, 4.4]),
        ("Cinder Gate", [-20.0, 15.0, -7.0]),
    ];
    // A dense sector (0.02 stars/ly³, ~0.015 systems/ly³) puts about four
    // systems within 4 ly of each pin, so clearing has work to do.
    let common = ["--box", "60,60,60", "--density", "0.02", "--seed", "3"];
    let plain = populate(&dir, &common, "plain.csv");
    let mut with = common.to_vec();
    with.extend_from_slice(&["--pin", "pins.csv", "--pin-clear", "4"]);
    let pinned = populate(&dir, &with, "pinned.csv");
    let near = |c: &Catalogue, p: [f64; 3]| {
        primaries(c)
            .filter(|&i| dist(c.position_ly(i), p) < 4.0)
            .collect::<Vec<_>>()
    };
    for (name, p) in pins {
        assert!(!near(&plain, p).is_empty(), "{name}: something to clear");
        let rows: Vec<usize> = (0..pinned.len())
            .filter(|&i| &pinned.name[i] == name)
            .collect();
        assert_eq!(rows.len(), 1, "{name} appears once");
        let r = rows[0];
        assert!(
            dist(pinned.position_ly(r), p) < 1e-3,
            "{name} where it was put"
        );
        assert_eq!(
            near(&pinned, p),
            vec![r],
            "{name}: only the pin within 4 ly"
        );
    }
    assert!(
        (pinned.mass_msun[(0..pinned.len())
            .find(|&i| &pinned.name[i] == "Harbour Light")
            .unwrap()]
            - 0.9)
            .abs()
            < 1e-3
    );
    // Everything outside the cleared spheres is untouched by the pins.
    let outside =
        |c: &Catalogue, i: usize| pins.iter().all(|(_, p)| dist(c.position_ly(i), *p) >= 4.0);
    let keep_plain: Vec<u64> = (0..plain.len())
        .filter(|&i| outside(&plain, i))
        .map(|i| plain.id[i])
        .collect();
    let keep_pinned: Vec<u64> = (0..pinned.len())
        .filter(|&i| outside(&pinned, i))
        .map(|i| pinned.id[i])
        .collect();
    assert_eq!(keep_plain, keep_pinned);
}

/// Jurić et al. 2008 (ApJ 673, 864) density relative to the thin-disk
/// mid-plane value at R⊙, along the axis through the home point (R = R⊙):
/// thin H1 = 300 pc, thick H2 = 900 pc with f = 0.12, halo f_H = 0.0051,
/// q_H = 0.64, n_H = 2.77, R⊙ = 8 kpc (Jurić et al. 2008, abstract; f_H
/// and n_H = 2.77 from their fit, from memory);
/// z is height above the mid-plane in pc. Written out independently of the
/// library's version.
fn juric_on_axis(z_pc: f64) -> f64 {
    let r = 8000.0f64;
    (-z_pc.abs() / 300.0).exp()
        + 0.12 * (-z_pc.abs() / 900.0).exp()
        + 0.0051 * (r * r / (r * r + (z_pc / 0.64).powi(2))).powf(2.77 / 2.0)
}

/// Mean of the profile over heights [z0, z1] light years from the home
/// point, which sits Z⊙ = 20.8 pc above the plane (Bennett & Bovy 2019,
/// MNRAS 482, 1417), by the midpoint rule on 2000 steps.
fn mean_profile(z0_ly: f64, z1_ly: f64) -> f64 {
    let ly_per_pc = 3.261_563_777;
    let n = 2000;
    (0..n)
        .map(|k| {
            let z = z0_ly + (k as f64 + 0.5) * (z1_ly - z0_ly) / n as f64;
            juric_on_axis(z / ly_per_pc + 20.8)
        })
        .sum::<f64>()
        / n as f64
}

#[test]
fn sector_disk_thins_out_with_height() {
    let dir = work_dir("sector-cli-disk");
    // Cylinders of radius 80 ly and height 200 ly on the home axis: near the
    // plane and about 1100 ly and 1 kpc higher. The radius changes R by at
    // most 25 pc, a second-order effect (< 1e-4) on the counts.
    let systems = |args: &[&str], out: &str| primaries(&populate(&dir, args, out)).count() as f64;
    let shape = ["--cylinder", "80,200", "--seed", "12"];
    let at = |z: &str, disk: bool, out: &str| {
        let centre = format!("0,0,{z}");
        let mut a = shape.to_vec();
        a.extend_from_slice(&["--centre", centre.as_str()]);
        if disk {
            a.push("--disk");
        }
        systems(&a, out)
    };
    let low = at("0", true, "low.csv");
    let mid = at("1100", true, "mid.csv");
    let high = at("3200", true, "high.csv");
    let flat = at("3200", false, "flat.csv");
    let base = mean_profile(-100.0, 100.0);
    for (n, z, name) in [(mid, 1100.0, "1100 ly"), (high, 3200.0, "3200 ly")] {
        let expect = mean_profile(z - 100.0, z + 100.0) / base;
        let ratio = n / low;
        // System counts are Poisson (the sampler draws Poisson systems per
        // cell), so σ(ratio)/ratio = sqrt(1/n + 1/low); 4σ.
        let tol = 4.0 * ratio * (1.0 / n + 1.0 / low).sqrt();
        eprintln!(
            "disk at {name}: {n} / {low} systems = {ratio:.4} (Jurić {expect:.4} ± {tol:.4})"
        );
        assert!(
            (ratio - expect).abs() < tol,
            "{name}: ratio {ratio:.4} vs Jurić {expect:.4} ± {tol:.4} ({n} vs {low} systems)"
        );
    }
    // The thin disk's 300 pc scale height makes 1 kpc up much emptier; the
    // uniform model does not thin out at all.
    assert!(high < 0.2 * low, "{high} vs {low}");
    let tol = 4.0 * (1.0 / flat + 1.0 / low).sqrt();
    assert!((flat / low - 1.0).abs() < tol, "uniform: {flat} vs {low}");
}

#[test]
fn sector_ages_imf_and_remnant_options() {
    let dir = work_dir("sector-cli-options");
    let young = populate(
        &dir,
        &["--box", "80,80,80", "--ages", "1,2", "--seed", "2"],
        "young.csv",
    );
    let ages: Vec<f64> = young
        .age_gyr
        .iter()
        .copied()
        .filter(|a| a.is_finite())
        .collect();
    assert_eq!(ages.len(), young.len(), "every row has an age");
    let lo = ages.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = ages.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    assert!(lo >= 1.0 && hi <= 2.0, "ages within 1..2 Gyr: {lo}..{hi}");
    // About 1000 systems drawn over the range: the extremes come close to
    // both ends (a gap of 0.1 Gyr at either end has probability ~e^-100).
    assert!(lo < 1.1 && hi > 1.9, "{lo}..{hi}");

    // Brown-dwarf shares of the three mass functions over 0.01–150 Msun:
    // Kirkpatrick 2024 0.216 of primaries (star:BD 3.63), Kroupa 2001 0.371,
    // Chabrier 2003 0.45 (integrals of each IMF over 0.01–150 Msun with a
    // 0.08 Msun split [derived]). In ~2500
    // stars σ ≈ 0.01, so the order with 0.05 steps is a 5σ statement.
    let bd_share = |imf: &str| {
        let out = format!("imf-{imf}.csv");
        let c = populate(
            &dir,
            &["--box", "100,100,100", "--imf", imf, "--seed", "2"],
            &out,
        );
        c.kind
            .iter()
            .filter(|k| **k == StarKind::BrownDwarf)
            .count() as f64
            / c.len() as f64
    };
    let kirk = bd_share("kirkpatrick");
    let kroupa = bd_share("kroupa");
    let chab = bd_share("chabrier");
    eprintln!(
        "brown-dwarf share of objects: kirkpatrick {kirk:.4}, kroupa {kroupa:.4}, chabrier {chab:.4}"
    );
    assert!(
        kroupa > kirk + 0.05 && chab > kroupa + 0.03,
        "{kirk} {kroupa} {chab}"
    );

    // Remnants: with every natal kick undone, neutron stars and black holes
    // from the ~0.5 % of stars born above 8 Msun stay; without, only the few
    // slow ones do (kicks of ~265 km/s per axis, Hobbs et al. 2005, MNRAS
    // 360, 974).
    let compact = |extra: &[&str], out: &str| {
        let mut a = vec!["--box", "150,150,150", "--seed", "2"];
        a.extend_from_slice(extra);
        let c = populate(&dir, &a, out);
        c.kind
            .iter()
            .filter(|k| matches!(k, StarKind::NeutronStar | StarKind::BlackHole))
            .count()
    };
    let kept = compact(&["--keep-remnants"], "kept.csv");
    let kicked = compact(&[], "kicked.csv");
    eprintln!("neutron stars and black holes: {kept} kept, {kicked} after kicks");
    assert!(
        kept >= 10 && kicked * 3 < kept,
        "kept {kept}, kicked {kicked}"
    );
}

#[test]
fn sector_summary_json_agrees_with_the_csv() {
    let dir = work_dir("sector-cli-summary");
    let c = populate(
        &dir,
        &["--box", "90,60,60", "--seed", "21", "--home"],
        "s.csv",
    );
    let out = starloom_ok(&dir, &["summary", "s.csv", "--json"]);
    let v: serde_json::Value = serde_json::from_str(&stdout(&out)).unwrap();
    let n = |k: &str| v[k].as_u64().unwrap_or_else(|| panic!("key {k}: {v}"));
    assert_eq!(n("objects"), c.len() as u64);
    let bds = c
        .kind
        .iter()
        .filter(|k| **k == StarKind::BrownDwarf)
        .count() as u64;
    assert_eq!(n("brown_dwarfs"), bds);
    assert_eq!(n("stars"), c.len() as u64 - bds);
    assert_eq!(n("systems"), primaries(&c).count() as u64);
    // Count the CSV text itself, independently of the reader.
    let text = String::from_utf8(read_bytes(&dir, "s.csv")).unwrap();
    let mut kinds = std::collections::BTreeMap::<String, u64>::new();
    let mut classes = std::collections::BTreeMap::<String, u64>::new();
    for line in text.lines().skip(1) {
        let f: Vec<&str> = line.split(',').collect();
        *kinds.entry(f[7].to_string()).or_default() += 1;
        if f[7] == "main-sequence" {
            *classes.entry(f[8][..1].to_string()).or_default() += 1;
        }
    }
    let as_map = |key: &str| -> std::collections::BTreeMap<String, u64> {
        v[key]
            .as_object()
            .unwrap_or_else(|| panic!("key {key}"))
            .iter()
            .map(|(k, x)| (k.clone(), x.as_u64().unwrap()))
            .collect()
    };
    assert_eq!(as_map("by_kind"), kinds);
    assert_eq!(as_map("main_sequence_by_class"), classes);
    assert_eq!(kinds.values().sum::<u64>(), n("objects"));
    // The density uses the sector's own volume from the sidecar, 90·60·60 ly³.
    let f = |k: &str| v[k].as_f64().unwrap_or_else(|| panic!("key {k}"));
    assert_eq!(f("volume_ly3"), 324_000.0);
    assert!((f("star_density_per_ly3") - n("stars") as f64 / 324_000.0).abs() < 1e-12);
}

/// Asserts a user error and that neither the output nor its sidecar exists.
fn refused(dir: &Path, args: &[&str], needle: &str) {
    let out = starloom(dir, args);
    assert_user_error(&out, needle);
    assert!(!dir.join("out.csv").exists(), "{args:?} left a file");
    assert!(
        !dir.join("out.csv.toml").exists(),
        "{args:?} left a sidecar"
    );
}

#[test]
fn sector_bad_input_gets_one_sentence_and_exit_code_two() {
    let dir = work_dir("sector-cli-bad");
    fn with<'a>(a: &[&'a str]) -> Vec<&'a str> {
        [&["populate"][..], a, &["--out", "out.csv"][..]].concat()
    }
    for (args, needle) in [
        (vec!["--box", "0,10,10"], "--box"),
        (vec!["--box", "-5,10,10"], "--box"),
        (vec!["--box", "inf,10,10"], "--box"),
        (vec!["--box", "NaN,10,10"], "--box"),
        (vec!["--box", "10,10"], "--box"),
        (vec!["--sphere", "0"], "--sphere"),
        (vec!["--sphere", "-3"], "--sphere"),
        (vec!["--cylinder", "10,0"], "--cylinder"),
        (vec!["--sphere", "5parsecs"], "5parsecs"),
        // Beyond the id scheme's ±320 000 ly: the shape's option is named.
        (vec!["--sphere", "1000000"], "--sphere"),
        (vec!["--box", "10,700000,10"], "--box"),
        (
            vec!["--sphere", "10", "--centre", "-400000,0,0"],
            "--centre",
        ),
        (vec!["--sphere", "10", "--density", "0"], "--density"),
        (vec!["--sphere", "10", "--density", "-0.1"], "--density"),
        (vec!["--sphere", "10", "--density", "inf"], "--density"),
        (vec!["--sphere", "10", "--density", "NaN"], "--density"),
        (
            vec!["--sphere", "10", "--box", "10,10,10"],
            "exactly one shape",
        ),
        (vec![], "--sphere"),
        (vec!["--sphere", "10", "--imf", "salpeter"], "--imf"),
        (vec!["--sphere", "10", "--ages", "5,2"], "--ages"),
        (vec!["--sphere", "10", "--centre", "1,2"], "--centre"),
    ] {
        refused(&dir, &with(&args), needle);
    }
    // Malformed spec file: the file and the line are named.
    std::fs::write(
        dir.join("bad.toml"),
        "seed = 4\n[shape]\nkind = \"box\nsize_ly = [1, 2, 3]\n",
    )
    .unwrap();
    refused(&dir, &with(&["--spec", "bad.toml"]), "bad.toml");
    refused(&dir, &with(&["--spec", "bad.toml"]), "line 3");
    std::fs::write(
        dir.join("neg.toml"),
        "seed = 4\n[shape]\nkind = \"sphere\"\nradius_ly = -2\n",
    )
    .unwrap();
    refused(
        &dir,
        &with(&["--spec", "neg.toml"]),
        "neg.toml, line 4: radius_ly got '-2'",
    );
    refused(&dir, &with(&["--spec", "missing.toml"]), "missing.toml");
    // Missing output folder.
    let out = starloom(
        &dir,
        &["populate", "--sphere", "10", "--out", "no/such/dir/x.csv"],
    );
    assert_user_error(&out, "no/such/dir");
    assert!(!dir.join("no").exists());
    // An existing file is kept without --force, replaced with it.
    std::fs::write(dir.join("keep.csv"), "precious\n").unwrap();
    let out = starloom(&dir, &["populate", "--sphere", "10", "--out", "keep.csv"]);
    assert_user_error(&out, "--force");
    assert_eq!(std::fs::read(dir.join("keep.csv")).unwrap(), b"precious\n");
    assert!(!dir.join("keep.csv.toml").exists());
    starloom_ok(
        &dir,
        &["populate", "--sphere", "10", "--out", "keep.csv", "--force"],
    );
    assert!(read_bytes(&dir, "keep.csv").starts_with(b"id,system,"));
    // An existing sidecar is kept too, and the catalogue not written.
    std::fs::write(dir.join("side.csv.toml"), "mine\n").unwrap();
    let out = starloom(&dir, &["populate", "--sphere", "10", "--out", "side.csv"]);
    assert_user_error(&out, "--force");
    assert!(!dir.join("side.csv").exists());
    assert_eq!(std::fs::read(dir.join("side.csv.toml")).unwrap(), b"mine\n");
}

#[test]
fn sector_absurd_size_is_refused_at_once_with_the_estimate() {
    let dir = work_dir("sector-cli-absurd");
    // A sphere of 100 000 ly at 0.0025 stars/ly³ would hold about
    // 0.0025 × 4/3 π 1e15 = 1.047e13 stars.
    let t = std::time::Instant::now();
    let out = starloom(
        &dir,
        &["populate", "--sphere", "100000", "--out", "out.csv"],
    );
    let elapsed = t.elapsed();
    assert_user_error(&out, "1.047e13");
    assert!(!dir.join("out.csv").exists() && !dir.join("out.csv.toml").exists());
    // The same with the disk model (its estimate is a quadrature).
    let out = starloom(
        &dir,
        &[
            "populate",
            "--box",
            "300000,300000,20000",
            "--disk",
            "--out",
            "out.csv",
        ],
    );
    assert_user_error(&out, "stars");
    assert!(!dir.join("out.csv").exists());
    // Timing is reported, not asserted (tests make no timing claims).
    eprintln!("absurd sphere refused in {elapsed:?}");
}

#[test]
fn sector_messages_count_in_the_singular_for_one() {
    let dir = work_dir("sector_singular");
    // A 5 ly sphere around (-50, 0, 0) holds one single star for seed 3;
    // the count below is checked against the file itself.
    let out = starloom_ok(
        &dir,
        &[
            "populate", "--centre", "-50,0,0", "--sphere", "5", "--seed", "3", "--out", "one.csv",
        ],
    );
    let cat = read_catalogue(&dir.join("one.csv")).unwrap();
    assert_eq!(cat.len(), 1, "the scene this test needs: one object");
    assert!(
        stdout(&out).starts_with("wrote 1 star (1 object counting brown dwarfs, 1 system) to "),
        "{}",
        stdout(&out)
    );
    let out = starloom_ok(&dir, &["summary", "one.csv"]);
    assert!(
        stdout(&out).starts_with("1 object: 1 star, 0 brown dwarfs, in 1 system"),
        "{}",
        stdout(&out)
    );
    let out = starloom_ok(&dir, &["map", "one.csv", "--out", "one.png"]);
    assert!(stdout(&out).contains("(1 system, "), "{}", stdout(&out));
    // The sheet's title block says the same.
    starloom_ok(&dir, &["map", "one.csv", "--out", "one.svg"]);
    let svg = String::from_utf8(read_bytes(&dir, "one.svg")).unwrap();
    assert!(svg.contains(">1 system shown<"), "title block of one.svg");
}

#[test]
fn sector_too_far_shows_the_converted_length_in_ly() {
    let dir = work_dir("sector_too_far");
    let out = starloom(
        &dir,
        &["populate", "--sphere", "200kpc", "--out", "far.csv"],
    );
    assert_user_error(&out, "--sphere got '652312.8 ly'");
    assert!(!dir.join("far.csv").exists());
}

/// Regression: a request far larger than the free disk space used to run
/// for minutes and fail with "No space left on device"; it is refused up
/// front, writing nothing. The sphere is sized to about four times the
/// free space of the test's own folder, so the check is cheap; on a disk
/// so large that such a sphere passes the star limit, the test says so and
/// stops.
#[test]
fn populate_larger_than_the_free_space_is_refused_up_front() {
    let dir = work_dir("populate_no_space");
    let free = starloom::atomic_file::free_space(&dir.join("big.csv"))
        .expect("the test folder's free space is known");
    // About 273 CSV bytes per star at the default density of 0.0025 per ly³.
    let stars = 4.0 * free as f64 / 273.0;
    if stars > 0.5 * starloom::sampler::MAX_FILE_STARS {
        eprintln!("skipped: {free} bytes free is more than the star limit can exceed");
        return;
    }
    let radius = (stars / (0.0025 * 4.0 / 3.0 * std::f64::consts::PI)).cbrt();
    let out = starloom(
        &dir,
        &[
            "populate",
            "--sphere",
            &format!("{radius:.0}"),
            "--seed",
            "1",
            "--out",
            "big.csv",
        ],
    );
    assert_user_error(
        &out,
        "free, too little with a 5 % margin; split it with --shard K/N",
    );
    assert_eq!(
        std::fs::read_dir(&dir).unwrap().count(),
        0,
        "nothing written"
    );
}
