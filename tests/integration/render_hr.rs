//! The Hertzsprung–Russell diagram: hot stars to the left, bright ones
//! higher up; `starloom summary --hr`.

use crate::util::{assert_user_error, starloom, work_dir};
use starloom::catalogue::read_catalogue;
use starloom::render::hr_diagram::{HrAxes, hr_scene};
use starloom::render::paper::Theme;
use starloom::render::scene::Item;

// Four stars: effective temperatures and luminosities chosen to be far
// apart; the sun's values (5772 K, 1 Lsun) from IAU 2015 Resolution B3.
const CSV: &str = "name,x_ly,y_ly,z_ly,teff_k,luminosity_lsun\n\
Hot,1,0,0,20000,1000\n\
Sunlike,2,0,0,5772,1\n\
Cool,3,0,0,3000,0.01\n\
Bright cool,4,0,0,3000,500\n";

#[test]
fn hot_left_of_cool_and_bright_above_faint() {
    let dir = work_dir("render_hr_positions");
    let path = dir.join("four.csv");
    std::fs::write(&path, CSV).unwrap();
    let cat = read_catalogue(&path).unwrap();
    let scene = hr_scene(&cat, Theme::Print);
    let stars = scene
        .items
        .iter()
        .find_map(|i| match i {
            Item::Stars { centres_mm, .. } => Some(centres_mm.clone()),
            _ => None,
        })
        .expect("a star layer");
    assert_eq!(stars.len(), 4);
    let (hot, sun, cool, bright_cool) = (stars[0], stars[1], stars[2], stars[3]);
    assert!(hot[0] < sun[0] && sun[0] < cool[0], "hot to the left");
    // Equal temperature, same column.
    assert!((cool[0] - bright_cool[0]).abs() < 1e-3);
    // Page y grows downwards: brighter is smaller y.
    assert!(bright_cool[1] < cool[1] && hot[1] < sun[1] && sun[1] < cool[1]);
    // Log axes: 1000 → 1 → 0.01 Lsun are 3 and 2 decades apart, so the
    // vertical gaps stand in the ratio 3:2.
    let ratio = (sun[1] - hot[1]) / (cool[1] - sun[1]);
    assert!((ratio - 1.5).abs() < 1e-3, "{ratio}");
    let axes = HrAxes::fit(&cat);
    assert!(axes.to_page(f64::NAN, 1.0).is_none());
    assert_eq!(axes.to_page(20000.0, 1000.0), Some(hot));
}

#[test]
fn summary_writes_the_diagram() {
    let dir = work_dir("render_hr_cli");
    std::fs::write(dir.join("four.csv"), CSV).unwrap();
    let out = starloom(
        &dir,
        &["summary", "four.csv", "--hr", "hr.png", "--dpi", "40"],
    );
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    // A4 landscape at 40 dpi: 297/25.4*40 = 467.7, 210/25.4*40 = 330.7.
    let (w, h, ..) = crate::render_output::decode_png(&dir.join("hr.png"));
    assert_eq!((w, h), (468, 331));
    // The summary text is still printed.
    assert!(String::from_utf8_lossy(&out.stdout).contains("objects"));
    // An existing file is kept without --force.
    let again = starloom(&dir, &["summary", "four.csv", "--hr", "hr.png"]);
    assert_user_error(&again, "--force");
    let svg = starloom(&dir, &["summary", "four.csv", "--hr", "hr.svg"]);
    assert!(svg.status.success());
    let bad = starloom(
        &dir,
        &["summary", "four.csv", "--hr", "x.png", "--dpi", "5000"],
    );
    assert_user_error(&bad, "--dpi");
    let bad = starloom(&dir, &["summary", "four.csv", "--hr", "x.gif"]);
    assert_user_error(
        &bad,
        "--hr got 'x.gif', but it must end in .png, .svg or .pdf",
    );
    assert!(!dir.join("x.png").exists() && !dir.join("x.gif").exists());
}

#[test]
fn the_coldest_brown_dwarfs_and_faint_neutron_stars_are_plotted() {
    // Y dwarfs reach about 250 K (Kirkpatrick et al. 2021, ApJS 253, 7: the
    // coldest in the 20 pc census; from memory for the exact figure) and
    // generated 13 Gyr old brown dwarfs of 0.013 Msun about 225 K; a cooled
    // neutron star of 10 484 K and 12.5 km shines 3.5e-9 Lsun (Stefan–
    // Boltzmann, L = (R / Rsun)² (T / 5772 K)⁴ with Rsun = 695 700 km, IAU
    // 2015 B3; both values as a generated sector has them). All must be on
    // the diagram, not silently dropped.
    let csv = "name,x_ly,y_ly,z_ly,teff_k,luminosity_lsun,kind\n\
Sunlike,1,0,0,5772,1,main-sequence\n\
Frost,2,0,0,225,3.1e-8,brown-dwarf\n\
Ember,3,0,0,10484,3.5e-9,neutron-star\n";
    let dir = work_dir("render_hr_extremes");
    let path = dir.join("extremes.csv");
    std::fs::write(&path, csv).unwrap();
    let cat = read_catalogue(&path).unwrap();
    let scene = hr_scene(&cat, Theme::Print);
    let plotted = scene
        .items
        .iter()
        .find_map(|i| match i {
            Item::Stars { centres_mm, .. } => Some(centres_mm.len()),
            _ => None,
        })
        .expect("a star layer");
    assert_eq!(plotted, 3);
    let axes = HrAxes::fit(&cat);
    assert!(axes.to_page(225.0, 3.1e-8).is_some());
    assert!(axes.to_page(10484.0, 3.5e-9).is_some());
}
