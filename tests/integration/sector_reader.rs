//! The catalogue reader: files starloom wrote, and a user's own CSV with
//! positions in ly, pc or on the sky; errors that name line and column.

use crate::util::{assert_user_error, starloom, starloom_ok, work_dir};
use starloom::catalogue::read_catalogue;
use starloom::physics::StarKind;

/// Two floats equal, NaN equal to NaN (missing values).
fn same(a: f64, b: f64) -> bool {
    a == b || (a.is_nan() && b.is_nan())
}

#[test]
fn sector_reads_back_csv_and_jsonl_it_wrote() {
    let dir = work_dir("sector-reader-roundtrip");
    for out in ["cat.csv", "cat.jsonl"] {
        starloom_ok(
            &dir,
            &[
                "populate", "--box", "70,70,70", "--seed", "99", "--home", "--out", out,
            ],
        );
    }
    let csv = read_catalogue(&dir.join("cat.csv")).unwrap();
    let json = read_catalogue(&dir.join("cat.jsonl")).unwrap();
    // 0.0025 × 70³ ≈ 860 stars plus brown dwarfs.
    assert!(csv.len() > 500, "{} rows", csv.len());
    assert_eq!(csv.len(), json.len());
    assert_eq!(csv.meta.seed, Some(99), "seed from the sidecar");
    let floats = |c: &starloom::Catalogue| {
        [
            c.x_ly.clone(),
            c.y_ly.clone(),
            c.z_ly.clone(),
            c.mass_msun.clone(),
            c.initial_mass_msun.clone(),
            c.radius_rsun.clone(),
            c.luminosity_lsun.clone(),
            c.teff_k.clone(),
            c.age_gyr.clone(),
            c.lifetime_gyr.clone(),
            c.hz_inner_au.clone(),
            c.hz_outer_au.clone(),
            c.abs_mag_v.clone(),
            c.separation_au.clone(),
            c.period_days.clone(),
        ]
    };
    let (fc, fj) = (floats(&csv), floats(&json));
    for i in 0..csv.len() {
        assert_eq!(csv.id[i], json.id[i], "row {i}");
        assert_eq!(csv.system[i], json.system[i], "row {i}");
        assert_eq!(&csv.name[i], &json.name[i], "row {i}");
        assert_eq!(csv.kind[i], json.kind[i], "row {i}");
        assert_eq!(csv.class[i].as_str(), json.class[i].as_str(), "row {i}");
        assert_eq!(csv.color_rgb[i], json.color_rgb[i], "row {i}");
        assert_eq!(csv.habitable_host[i], json.habitable_host[i], "row {i}");
        assert_eq!(csv.origin[i], json.origin[i], "row {i}");
        for (col, (a, b)) in fc.iter().zip(&fj).enumerate() {
            assert!(
                same(a[i], b[i]),
                "row {i} float column {col}: {} vs {}",
                a[i],
                b[i]
            );
        }
    }
    // The file holds what the library makes in memory: same ids, names,
    // kinds, in the same order; positions to the written 0.001 ly.
    let spec = starloom::spec::SectorSpec {
        home: true,
        ..starloom::spec::SectorSpec::new(
            99,
            starloom::spec::Shape::Box { size_ly: [70.0; 3] },
            [0.0; 3],
        )
    };
    let mem = starloom::sampler::generate(&spec, &|_, _| {}).unwrap();
    assert_eq!(mem.len(), csv.len());
    for i in 0..mem.len() {
        assert_eq!(
            (mem.id[i], mem.system[i]),
            (csv.id[i], csv.system[i]),
            "row {i}"
        );
        assert_eq!(&mem.name[i], &csv.name[i], "row {i}");
        assert_eq!(mem.kind[i], csv.kind[i], "row {i}");
        for (a, b) in mem.position_ly(i).iter().zip(csv.position_ly(i)) {
            assert!((a - b).abs() <= 0.0005 + 1e-9, "row {i}: {a} vs {b}");
        }
        // Five significant digits are written.
        let (m, c) = (mem.mass_msun[i], csv.mass_msun[i]);
        assert!(
            (m - c).abs() <= 5e-5 * m.abs() + 1e-12,
            "row {i} mass {m} vs {c}"
        );
    }
}

#[test]
fn sector_reads_a_users_own_csv_in_ly_pc_and_sky_coordinates() {
    let dir = work_dir("sector-reader-user");
    std::fs::write(dir.join("ly.csv"), "x_ly,y_ly,z_ly\n1.5,-2,3\n-4,5.25,0\n").unwrap();
    let ly = read_catalogue(&dir.join("ly.csv")).unwrap();
    assert_eq!(ly.len(), 2);
    assert_eq!(ly.position_ly(0), [1.5, -2.0, 3.0]);
    assert_eq!(ly.position_ly(1), [-4.0, 5.25, 0.0]);
    // Each row its own system, distinct ids.
    assert_eq!(ly.system_ranges().len(), 2);
    assert_ne!(ly.id[0], ly.id[1]);

    // 1 pc = 3.261 563 777 ly (IAU 2015 Resolution B2: pc = 648000/π au;
    // IAU 2012 B2 au; ly = c × Julian year).
    std::fs::write(
        dir.join("pc.csv"),
        "name,x_pc,y_pc,z_pc,mass_msun\nOne,1,0,-2,1.0\nTwo,0,10,0,0.5\n",
    )
    .unwrap();
    let pc = read_catalogue(&dir.join("pc.csv")).unwrap();
    let ly_per_pc = 3.261_563_777;
    let p0 = pc.position_ly(0);
    assert!((p0[0] - ly_per_pc).abs() < 1e-8 && (p0[2] + 2.0 * ly_per_pc).abs() < 1e-8);
    assert!((pc.position_ly(1)[1] - 10.0 * ly_per_pc).abs() < 1e-7);
    assert_eq!(&pc.name[0], "One");
    // A mass alone gives the whole profile (a 1 Msun star is a G dwarf).
    assert!(
        pc.teff_k[0] > 5000.0 && pc.teff_k[0] < 6500.0,
        "{}",
        pc.teff_k[0]
    );

    // The galactic frame in ICRS (defined in the Hipparcos Catalogue 1997,
    // ESA SP-1200, Vol. 1, §1.5.3): the directions l = b = 0, the north
    // galactic pole and l = 90°, b = 0 computed with astropy 8.0.2
    // (`SkyCoord(l, b, frame="galactic").icrs`): RA 266.404988°, Dec
    // −28.936178°; RA 192.859478°, Dec 27.128252°; RA 318.004382°, Dec
    // 48.329637°. They must map to +x, +z and +y.
    std::fs::write(
        dir.join("sky.csv"),
        "name,ra_deg,dec_deg,distance_pc\n\
         centre,266.404988,-28.936178,10\n\
         pole,192.859478,27.128252,2\n\
         l90,318.004382,48.329637,1\n",
    )
    .unwrap();
    let sky = read_catalogue(&dir.join("sky.csv")).unwrap();
    let check = |i: usize, axis: usize, d_ly: f64| {
        let p = sky.position_ly(i);
        let r = (p[0] * p[0] + p[1] * p[1] + p[2] * p[2]).sqrt();
        assert!((r - d_ly).abs() < 1e-6 * d_ly, "row {i}: distance {r}");
        // Inputs are given to 1e-6°, ~2e-8 rad: the direction must agree
        // to 1.4e-6 rad (angle ≈ sqrt(2(1 − cos)), 1 − cos < 1e-12).
        let cos = p[axis] / r;
        assert!(
            (1.0 - cos) < 1e-12,
            "row {i}: {p:?} is not along axis {axis}"
        );
    };
    check(0, 0, 10.0 * ly_per_pc);
    check(1, 2, 2.0 * ly_per_pc);
    check(2, 1, ly_per_pc);
    // In light years as well.
    std::fs::write(
        dir.join("sky_ly.csv"),
        "ra_deg,dec_deg,distance_ly\n266.404988,-28.936178,4.0\n",
    )
    .unwrap();
    let p = read_catalogue(&dir.join("sky_ly.csv"))
        .unwrap()
        .position_ly(0);
    assert!(
        (p[0] - 4.0).abs() < 1e-6 && p[1].abs() < 1e-4 && p[2].abs() < 1e-4,
        "{p:?}"
    );
}

#[test]
fn sector_reader_errors_name_the_line_and_the_column() {
    let dir = work_dir("sector-reader-errors");
    // The header is line 1, so the second data row is line 3.
    std::fs::write(
        dir.join("bad.csv"),
        "name,x_ly,y_ly,z_ly\nA,1,2,3\nB,1,two,3\n",
    )
    .unwrap();
    let err = read_catalogue(&dir.join("bad.csv"))
        .unwrap_err()
        .to_string();
    assert!(
        err.contains("bad.csv") && err.contains("line 3") && err.contains("y_ly"),
        "{err}"
    );
    // The same through the binary: one sentence, exit code 2.
    let out = starloom(&dir, &["summary", "bad.csv"]);
    assert_user_error(&out, "line 3");
    assert_user_error(&out, "y_ly");
    // A missing field at the end of line 2.
    std::fs::write(dir.join("short.csv"), "x_pc,y_pc,z_pc\n1,2\n").unwrap();
    let err = read_catalogue(&dir.join("short.csv"))
        .unwrap_err()
        .to_string();
    assert!(err.contains("line 2") && err.contains("z_pc"), "{err}");
    // A bad distance on line 4 of a sky file.
    std::fs::write(
        dir.join("sky.csv"),
        "ra_deg,dec_deg,distance_ly\n10,20,5\n11,21,6\n12,22,far\n",
    )
    .unwrap();
    let err = read_catalogue(&dir.join("sky.csv"))
        .unwrap_err()
        .to_string();
    assert!(
        err.contains("line 4") && err.contains("distance_ly"),
        "{err}"
    );
    // A bad JSONL line names its line and key.
    std::fs::write(
        dir.join("bad.jsonl"),
        "{\"x_ly\":1,\"y_ly\":2,\"z_ly\":3}\n{\"x_ly\":\"west\",\"y_ly\":2,\"z_ly\":3}\n",
    )
    .unwrap();
    let err = read_catalogue(&dir.join("bad.jsonl"))
        .unwrap_err()
        .to_string();
    assert!(err.contains("line 2") && err.contains("x_ly"), "{err}");
    // No position columns: the file is named, and the columns it needs.
    std::fs::write(dir.join("nopos.csv"), "name,mass_msun\nA,1\n").unwrap();
    let out = starloom(&dir, &["summary", "nopos.csv"]);
    assert_user_error(&out, "nopos.csv");
    assert_user_error(&out, "x_ly");
}

/// Writes `text` as `file` in `dir` and asserts that the reader refuses
/// it with `expected`, the whole message after the file's path.
fn check_refused(dir: &std::path::Path, file: &str, text: &str, expected: &str) {
    let path = dir.join(file);
    std::fs::write(&path, text).unwrap();
    let err = read_catalogue(&path).unwrap_err().to_string();
    assert_eq!(err, format!("{}, {expected}", path.display()));
}

#[test]
fn sector_reader_refuses_values_no_star_can_have() {
    let dir = work_dir("sector-reader-ranges");
    // The header is line 1; a blank line still counts as a line.
    let cases = [
        (
            "x_ly,y_ly,z_ly,mass_msun\n0,0,0,1\n\n1,1,1,-0.5\n",
            "line 4, column 'mass_msun': '-0.5' must be a positive number of solar masses",
        ),
        (
            "x_ly,y_ly,z_ly,mass_msun\n0,0,0,0\n",
            "line 2, column 'mass_msun': '0' must be a positive number of solar masses",
        ),
        (
            "x_ly,y_ly,z_ly,initial_mass_msun\n0,0,0,1\n0,0,0,0\n",
            "line 3, column 'initial_mass_msun': '0' must be a positive number of solar masses",
        ),
        (
            "x_ly,y_ly,z_ly,radius_rsun\n0,0,0,-1e-3\n",
            "line 2, column 'radius_rsun': '-1e-3' must be a positive number of solar radii",
        ),
        (
            "x_ly,y_ly,z_ly,luminosity_lsun\n0,0,0,1\n0,0,0,-3\n",
            "line 3, column 'luminosity_lsun': '-3' must be a number of solar luminosities, 0 or more",
        ),
        (
            "name,x_ly,y_ly,z_ly,teff_k,luminosity_lsun,kind\nNeg,0,0,0,-5,-3,main-sequence\n",
            "line 2, column 'teff_k': '-5' must be a number of kelvin, 0 or more",
        ),
        (
            "x_ly,y_ly,z_ly,age_gyr\n0,0,0,-0.1\n",
            "line 2, column 'age_gyr': '-0.1' must be a number of gigayears, 0 or more",
        ),
        (
            "x_ly,y_ly,z_ly,lifetime_gyr\n0,0,0,-2\n",
            "line 2, column 'lifetime_gyr': '-2' must be a number of gigayears, 0 or more",
        ),
        (
            "x_ly,y_ly,z_ly,hz_inner_au,hz_outer_au\n0,0,0,-0.5,1\n",
            "line 2, column 'hz_inner_au': '-0.5' must be a number of au, 0 or more",
        ),
        (
            "x_ly,y_ly,z_ly,hz_inner_au,hz_outer_au\n0,0,0,0.5,-1\n",
            "line 2, column 'hz_outer_au': '-1' must be a number of au, 0 or more",
        ),
        (
            "x_ly,y_ly,z_ly,separation_au\n0,0,0,-10\n",
            "line 2, column 'separation_au': '-10' must be a number of au, 0 or more",
        ),
        (
            "x_ly,y_ly,z_ly,period_days\n0,0,0,-365.25\n",
            "line 2, column 'period_days': '-365.25' must be a number of days, 0 or more",
        ),
        (
            "ra_deg,dec_deg,distance_ly\n10,20,5\n10,20,-4\n",
            "line 3, column 'distance_ly': '-4' must be a number of light years, 0 or more",
        ),
        (
            "ra_deg,dec_deg,distance_pc\n10,20,-1\n",
            "line 2, column 'distance_pc': '-1' must be a number of parsecs, 0 or more",
        ),
        // Not a finite number, in any numeric column.
        (
            "x_ly,y_ly,z_ly,teff_k\n0,0,0,nan\n",
            "line 2, column 'teff_k': 'nan' is not a finite number",
        ),
        (
            "x_ly,y_ly,z_ly\ninf,0,0\n",
            "line 2, column 'x_ly': 'inf' is not a finite number",
        ),
        (
            "x_ly,y_ly,z_ly,luminosity_lsun\n0,0,0,1e400\n",
            "line 2, column 'luminosity_lsun': '1e400' is not a finite number",
        ),
        (
            "x_ly,y_ly,z_ly,abs_mag_v\n0,0,0,-inf\n",
            "line 2, column 'abs_mag_v': '-inf' is not a finite number",
        ),
        (
            "ra_deg,dec_deg,distance_pc\nNaN,20,1\n",
            "line 2, column 'ra_deg': 'NaN' is not a finite number",
        ),
        // Quoted fields go through the csv crate: the same check.
        (
            "name,x_ly,y_ly,z_ly,mass_msun\n\"Rest, the\",0,0,0,1\n\"Far, the\",0,0,0,-1\n",
            "line 3, column 'mass_msun': '-1' must be a positive number of solar masses",
        ),
    ];
    for (k, (text, expected)) in cases.iter().enumerate() {
        check_refused(&dir, &format!("case{k}.csv"), text, expected);
    }
    // JSON Lines: the same check, the first object on line 1.
    check_refused(
        &dir,
        "neg.jsonl",
        "{\"x_ly\":0,\"y_ly\":0,\"z_ly\":0,\"teff_k\":5000}\n{\"x_ly\":0,\"y_ly\":0,\"z_ly\":0,\"teff_k\":-5}\n",
        "line 2, column 'teff_k': '-5' must be a number of kelvin, 0 or more",
    );
    // What the values may be at their lowest: 0 where starloom writes 0
    // (a black hole's light, a brown dwarf's lifetime, a single star's
    // orbit), an empty field (left out), a negative magnitude.
    std::fs::write(
        dir.join("zeros.csv"),
        "x_ly,y_ly,z_ly,mass_msun,luminosity_lsun,teff_k,age_gyr,lifetime_gyr,hz_inner_au,hz_outer_au,abs_mag_v,separation_au,period_days\n\
         0,0,0,5,0,0,0,0,0,0,99,0,0\n\
         1,0,0,1,,,,,,,-1.5,,\n",
    )
    .unwrap();
    let cat = read_catalogue(&dir.join("zeros.csv")).unwrap();
    assert_eq!((cat.luminosity_lsun[0], cat.teff_k[0]), (0.0, 0.0));
    assert_eq!(cat.abs_mag_v[1], -1.5);
    std::fs::write(dir.join("here.csv"), "ra_deg,dec_deg,distance_ly\n0,0,0\n").unwrap();
    assert_eq!(
        read_catalogue(&dir.join("here.csv"))
            .unwrap()
            .position_ly(0),
        [0.0; 3]
    );
}

#[test]
fn sector_map_and_summary_refuse_a_negative_temperature() {
    let dir = work_dir("sector-reader-negative-cli");
    std::fs::write(
        dir.join("neg.csv"),
        "name,x_ly,y_ly,z_ly,teff_k,luminosity_lsun,kind\nNeg,0,0,0,-5,-3,main-sequence\n",
    )
    .unwrap();
    let want = "neg.csv, line 2, column 'teff_k': '-5' must be a number of kelvin, 0 or more";
    assert_user_error(
        &starloom(&dir, &["map", "neg.csv", "--out", "neg.png"]),
        want,
    );
    assert!(!dir.join("neg.png").exists());
    assert_user_error(&starloom(&dir, &["summary", "neg.csv"]), want);
    // A file in starloom's own layout goes through its fast decoder, and
    // `map` reads only some columns: a bad value it reads is refused too.
    starloom_ok(
        &dir,
        &[
            "populate", "--sphere", "20", "--seed", "7", "--out", "own.csv",
        ],
    );
    let text = std::fs::read_to_string(dir.join("own.csv")).unwrap();
    let mut lines: Vec<String> = text.lines().map(str::to_string).collect();
    let at = lines[0]
        .split(',')
        .position(|h| h == "luminosity_lsun")
        .unwrap();
    let mut fields: Vec<String> = lines[5].split(',').map(str::to_string).collect();
    assert!(fields[at].parse::<f64>().unwrap() > 0.0, "{}", lines[5]);
    fields[at] = format!("-{}", fields[at]);
    let value = fields[at].clone();
    lines[5] = fields.join(",");
    std::fs::write(dir.join("own.csv"), lines.join("\n") + "\n").unwrap();
    let want = format!(
        "own.csv, line 6, column 'luminosity_lsun': '{value}' must be a number of solar luminosities, 0 or more"
    );
    assert_user_error(
        &starloom(&dir, &["map", "own.csv", "--out", "own.png"]),
        &want,
    );
    assert_user_error(&starloom(&dir, &["summary", "own.csv"]), &want);
}

#[test]
fn sector_reads_every_kind_it_writes_with_its_zeros() {
    let dir = work_dir("sector-reader-remnants");
    // Seed 2 with real stars and every remnant kept holds black holes
    // (luminosity, Teff and habitable zone 0), brown dwarfs (lifetime 0)
    // and single stars (separation and period 0).
    for out in ["all.csv", "all.jsonl"] {
        starloom_ok(
            &dir,
            &[
                "populate",
                "--sphere",
                "50",
                "--real",
                "--keep-remnants",
                "--seed",
                "2",
                "--out",
                out,
            ],
        );
        let path = dir.join(out);
        let cat = read_catalogue(&path).unwrap();
        let kind_zero = |kind: StarKind, col: &[f64]| {
            (0..cat.len()).any(|i| cat.kind[i] == kind && col[i] == 0.0)
        };
        assert!(
            kind_zero(StarKind::BlackHole, &cat.luminosity_lsun),
            "{out}"
        );
        assert!(kind_zero(StarKind::BlackHole, &cat.teff_k), "{out}");
        assert!(kind_zero(StarKind::BlackHole, &cat.hz_inner_au), "{out}");
        assert!(kind_zero(StarKind::BrownDwarf, &cat.lifetime_gyr), "{out}");
        assert!(cat.separation_au.contains(&0.0) && cat.period_days.contains(&0.0));
        for columns in [
            starloom::map::CATALOGUE_COLUMNS,
            starloom::routes::CATALOGUE_COLUMNS,
        ] {
            let part = starloom::catalogue::reader::read_catalogue_columns(&path, columns).unwrap();
            assert_eq!(part.len(), cat.len(), "{out}");
        }
        starloom_ok(&dir, &["summary", out]);
    }
}

#[test]
fn jsonl_ids_survive_readers_that_hold_numbers_as_doubles() {
    // Ids are 64-bit and mostly above 2^53 = 9 007 199 254 740 992 (IEEE
    // 754 binary64 holds every integer only up to there), so JavaScript or
    // jq would round them as numbers and merge stars; as strings they
    // stay exact. Old files with numeric ids still read.
    let dir = work_dir("sector_jsonl_ids");
    starloom_ok(
        &dir,
        &[
            "populate", "--sphere", "80", "--seed", "9", "--out", "s.jsonl",
        ],
    );
    let text = std::fs::read_to_string(dir.join("s.jsonl")).unwrap();
    let mut ids = std::collections::HashSet::new();
    let mut as_doubles = std::collections::HashSet::new();
    for line in text.lines() {
        let v: serde_json::Value = serde_json::from_str(line).unwrap();
        let id = v["id"].as_str().expect("the id is a JSON string");
        assert!(v["system"].is_string());
        let n: u64 = id.parse().unwrap();
        ids.insert(n);
        as_doubles.insert(n as f64 as u64);
    }
    assert!(ids.len() > 1000);
    assert!(
        as_doubles.len() < ids.len(),
        "the ids need more than 53 bits"
    );
    let cat = read_catalogue(&dir.join("s.jsonl")).unwrap();
    assert_eq!(
        cat.id
            .iter()
            .copied()
            .collect::<std::collections::HashSet<_>>(),
        ids
    );
    // A file with numeric ids (as written before) reads the same.
    let numeric = text
        .lines()
        .map(|l| {
            let mut v: serde_json::Value = serde_json::from_str(l).unwrap();
            for key in ["id", "system"] {
                let n: u64 = v[key].as_str().unwrap().parse().unwrap();
                v[key] = serde_json::Value::from(n);
            }
            v.to_string()
        })
        .collect::<Vec<_>>()
        .join("\n");
    std::fs::write(dir.join("old.jsonl"), numeric).unwrap();
    let old = read_catalogue(&dir.join("old.jsonl")).unwrap();
    assert_eq!(old.id, cat.id);
    assert_eq!(old.system, cat.system);
}
