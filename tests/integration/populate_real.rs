//! `starloom populate --real` as a user runs it.

use crate::util::{starloom, stderr, stdout, work_dir};

#[test]
fn real_neighbourhood_file_marks_every_row() {
    let dir = work_dir("populate-real");
    let out = starloom(
        &dir,
        &[
            "populate", "--real", "--sphere", "20", "--seed", "5", "--out", "near.csv",
        ],
    );
    assert_eq!(out.status.code(), Some(0), "{}", stderr(&out));
    assert!(stdout(&out).contains("real"), "{}", stdout(&out));
    let side = std::fs::read_to_string(dir.join("near.csv.toml")).unwrap();
    assert!(side.contains("--real"), "{side}");
    let cat = starloom::catalogue::read_catalogue(&dir.join("near.csv")).unwrap();
    assert_eq!(&cat.name[0], "Sun");
    assert_eq!(cat.position_ly(0), [0.0; 3]);
    // α Centauri A (HIP 71683) is present, under its HIP number.
    let a = cat.id.iter().position(|&id| id == 71683).expect("α Cen A");
    assert_eq!(cat.origin[a], starloom::catalogue::Origin::Hipparcos);
    let text = std::fs::read_to_string(dir.join("near.csv")).unwrap();
    let rows: Vec<&str> = text.lines().skip(1).collect();
    assert!(rows.iter().any(|r| r.ends_with(",generated")));
    assert!(
        rows.iter()
            .all(|r| r.ends_with(",hipparcos") || r.ends_with(",generated"))
    );
    // Same input, same bytes.
    let again = starloom(
        &dir,
        &[
            "populate",
            "--real",
            "--sphere",
            "20",
            "--seed",
            "5",
            "--out",
            "again.csv",
        ],
    );
    assert_eq!(again.status.code(), Some(0));
    assert_eq!(
        text,
        std::fs::read_to_string(dir.join("again.csv")).unwrap()
    );
}

#[test]
fn real_refuses_shards() {
    let dir = work_dir("populate-real-shard");
    let out = starloom(
        &dir,
        &[
            "populate", "--real", "--sphere", "20", "--seed", "5", "--shard", "1/2", "--out",
            "x.csv",
        ],
    );
    assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
    assert!(stderr(&out).contains("--shard"));
    assert!(!dir.join("x.csv").exists());
}
