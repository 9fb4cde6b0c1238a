//! Pinned systems (`populate --pin FILE.csv`): every column the import
//! reader understands is honoured, bad rows get the reader's line and
//! column, and a spec that uses pins regenerates after its folder moves
//! but refuses a pin file that has changed.

use crate::util::{assert_user_error, read_bytes, starloom, starloom_ok, work_dir};
use starloom::Catalogue;
use starloom::catalogue::read_catalogue;
use starloom::physics::StarKind;
use std::path::Path;

/// The row of `cat` named `name` (exactly one).
fn row_named(cat: &Catalogue, name: &str) -> usize {
    let rows: Vec<usize> = (0..cat.len()).filter(|&i| &cat.name[i] == name).collect();
    assert_eq!(rows.len(), 1, "one row named {name}");
    rows[0]
}

/// `got` equals `want` to the five significant digits the writer keeps.
fn close(got: f64, want: f64, what: &str) {
    assert!(
        (got - want).abs() <= 1e-4 * want.abs(),
        "{what}: got {got}, want {want}"
    );
}

fn populate_with_pins(dir: &Path, pins: &str) -> Catalogue {
    std::fs::write(dir.join("pins.csv"), pins).unwrap();
    starloom_ok(
        dir,
        &[
            "populate",
            "--sphere",
            "20",
            "--centre",
            "-50,0,0",
            "--pin",
            "pins.csv",
            "--seed",
            "3",
            "--out",
            "pinned.csv",
        ],
    );
    read_catalogue(&dir.join("pinned.csv")).unwrap()
}

#[test]
fn sector_pin_columns_are_honoured_like_an_imported_catalogue() {
    let dir = work_dir("sector-pins-columns");
    let pins = "name,x_ly,y_ly,z_ly,kind,class,mass_msun,teff_k,luminosity_lsun,radius_rsun\n\
                WD,-55,5,0,white-dwarf,DA,0.6,10000,0.003,0.013\n\
                MyG,-45,0,0,,G5V,,,,\n\
                MyM,-45,5,0,,,,3200,0.005,\n\
                Husk,-50,-8,0,neutron-star,,,,,\n";
    let cat = populate_with_pins(&dir, pins);
    // What `summary` reads from the same file.
    let read = read_catalogue(&dir.join("pins.csv")).unwrap();

    let wd = row_named(&cat, "WD");
    assert_eq!(cat.kind[wd], StarKind::WhiteDwarf);
    assert_eq!(cat.class[wd].as_str(), "DA");
    close(cat.mass_msun[wd], 0.6, "white dwarf mass");
    close(cat.teff_k[wd], 10000.0, "white dwarf Teff");
    close(cat.luminosity_lsun[wd], 0.003, "white dwarf L");
    close(cat.radius_rsun[wd], 0.013, "white dwarf R");
    assert!(
        !cat.habitable_host[wd],
        "a white dwarf is no habitable host"
    );

    // A class alone: the mean dwarf sequence's G5V (Teff 5660 K).
    let g = row_named(&cat, "MyG");
    assert_eq!(cat.kind[g], StarKind::MainSequence);
    assert_eq!(cat.class[g].as_str(), "G5V");
    close(cat.teff_k[g], read.teff_k[1], "G5V Teff");
    close(cat.teff_k[g], 5660.0, "G5V Teff");

    // Teff and L give R by Stefan–Boltzmann: R = √L / (T / 5772 K)².
    let m = row_named(&cat, "MyM");
    close(cat.teff_k[m], 3200.0, "M star Teff");
    close(cat.luminosity_lsun[m], 0.005, "M star L");
    close(
        cat.radius_rsun[m],
        0.005f64.sqrt() / (3200.0f64 / 5772.0).powi(2),
        "M star R",
    );
    assert_eq!(cat.class[m].letter(), 'M', "{}", cat.class[m].as_str());
    assert_eq!(cat.class[m].as_str(), read.class[2].as_str());

    // A kind alone builds that kind of object.
    let ns = row_named(&cat, "Husk");
    assert_eq!(cat.kind[ns], StarKind::NeutronStar);
    assert!(cat.radius_rsun[ns] < 1e-4, "{}", cat.radius_rsun[ns]);

    for name in ["WD", "MyG", "MyM", "Husk"] {
        let i = row_named(&cat, name);
        assert_eq!(cat.id[i], cat.system[i], "{name} is its own system");
        assert_eq!(
            cat.origin[i],
            starloom::catalogue::Origin::Imported,
            "{name}"
        );
    }
}

#[test]
fn sector_bad_pin_row_names_the_line_and_column() {
    let dir = work_dir("sector-pins-bad-row");
    std::fs::write(
        dir.join("pins.csv"),
        "name,x_ly,y_ly,z_ly,teff_k\nA,-50,0,0,5000\nB,-45,0,0,hot\n",
    )
    .unwrap();
    let out = starloom(
        &dir,
        &[
            "populate", "--sphere", "20", "--centre", "-50,0,0", "--pin", "pins.csv", "--seed",
            "3", "--out", "p.csv",
        ],
    );
    assert_user_error(&out, "line 3, column 'teff_k'");
    // The same words as the reader gives every other command.
    let summary = starloom(&dir, &["summary", "pins.csv"]);
    assert_user_error(&summary, "line 3, column 'teff_k'");
    assert_eq!(
        crate::util::stderr(&out),
        crate::util::stderr(&summary),
        "populate --pin and summary report the row alike"
    );
    assert!(!dir.join("p.csv").exists(), "no catalogue left behind");
}

#[test]
fn sector_spec_with_pins_regenerates_after_the_folder_moves() {
    let dir = work_dir("sector-pins-moved");
    let first = dir.join("first");
    std::fs::create_dir_all(&first).unwrap();
    std::fs::write(
        first.join("pins.csv"),
        "name,x_ly,y_ly,z_ly,kind,mass_msun\nKeep,3,2,1,white-dwarf,0.7\nHold,-6,4,0,,1.2\n",
    )
    .unwrap();
    starloom_ok(
        &first,
        &[
            "populate",
            "--sphere",
            "25",
            "--pin",
            "pins.csv",
            "--seed",
            "11",
            "--out",
            "sector.csv",
        ],
    );
    let original = read_bytes(&first, "sector.csv");
    std::fs::rename(&first, dir.join("moved")).unwrap();
    // From the parent folder: the pin path is taken from the spec file's folder.
    starloom_ok(
        &dir,
        &[
            "populate",
            "--spec",
            "moved/sector.csv.toml",
            "--out",
            "moved/again.csv",
        ],
    );
    assert!(
        original == read_bytes(&dir, "moved/again.csv"),
        "regenerated file differs"
    );
    assert_eq!(
        read_bytes(&dir, "moved/sector.csv.toml"),
        read_bytes(&dir, "moved/again.csv.toml"),
        "the same sidecar"
    );

    // An edited pin file would silently change the sector: refused.
    let moved = dir.join("moved");
    std::fs::write(
        moved.join("pins.csv"),
        "name,x_ly,y_ly,z_ly,kind,mass_msun\nKeep,3,2,1,white-dwarf,0.8\nHold,-6,4,0,,1.2\n",
    )
    .unwrap();
    let out = starloom(
        &moved,
        &[
            "populate",
            "--spec",
            "sector.csv.toml",
            "--out",
            "edited.csv",
        ],
    );
    assert_user_error(&out, "pin file has changed");
    // Giving the pin file again makes a new sector from it.
    starloom_ok(
        &moved,
        &[
            "populate",
            "--spec",
            "sector.csv.toml",
            "--pin",
            "pins.csv",
            "--out",
            "edited.csv",
        ],
    );
}
