//! Map sheets built through the library: stars land where the scale says,
//! views keep their orientation, filters drop what they should, posters
//! tile with overlaps, and labels never collide.

use starloom::catalogue::Catalogue;
use starloom::catalogue::table::{Origin, StarRow};
use starloom::map::labels::Rect;
use starloom::map::view::ViewSpec;
use starloom::map::{Layers, MapFilter, MapOptions, SheetRole, build_sheets};
use starloom::physics::{Fidelity, KindChoice, StarKind, StarRequest, star_profile};
use starloom::render::overlay::Overlay;
use starloom::render::scene::{Item, Scene};
use starloom::units::{Gigayears, SolarMasses};

fn row(id: u64, name: &str, p: [f64; 3], mass: f64, kind: KindChoice) -> StarRow {
    let profile = star_profile(
        &StarRequest {
            mass: SolarMasses::new(mass).unwrap(),
            age: Gigayears::new(4.0).unwrap(),
            kind,
        },
        Fidelity::Fitted,
    );
    StarRow {
        id,
        system: id,
        name: name.to_string(),
        position_ly: p,
        profile,
        separation_au: 0.0,
        period_days: 0.0,
        origin: Origin::Imported,
    }
}

/// Five main-sequence stars at known places.
fn known() -> Catalogue {
    let mut c = Catalogue::default();
    let ms = KindChoice::Auto;
    for (i, (name, p)) in [
        ("Centre", [0.0, 0.0, 0.0]),
        ("East", [10.0, 0.0, 0.0]),
        ("North", [0.0, 10.0, 4.0]),
        ("Low", [-20.0, -5.0, -6.0]),
        ("Far", [30.0, 25.0, 0.0]),
    ]
    .into_iter()
    .enumerate()
    {
        c.push(row(i as u64 + 1, name, p, 1.0, ms));
    }
    c
}

/// `n` stars named "Long-named system i" in a tight disc (a golden-angle
/// spiral in the plane), of masses 0.5 to 2.3 Msun.
fn long_named_cluster(n: u64) -> Catalogue {
    let mut c = Catalogue::default();
    for i in 0..n {
        let a = i as f64 * 2.399_963; // golden angle, radians
        let r = (i as f64).sqrt() * 1.5;
        c.push(row(
            i + 1,
            &format!("Long-named system {i}"),
            [r * a.cos(), r * a.sin(), 0.0],
            0.5 + (i % 7) as f64 * 0.3,
            KindChoice::Auto,
        ));
    }
    c
}

/// A text item's text and box, from 0.8 em above the baseline to 0.2 em
/// below it; `None` for other items.
fn text_box(item: &Item) -> Option<(&str, Rect)> {
    use starloom::render::scene::Anchor;
    let Item::Text {
        position_mm,
        text,
        size_pt,
        anchor,
        bold,
        ..
    } = item
    else {
        return None;
    };
    let w = starloom::render::text::text_width_mm(text, *size_pt, *bold);
    let h = size_pt * 25.4 / 72.0;
    let x = match anchor {
        Anchor::Start => position_mm[0],
        Anchor::Middle => position_mm[0] - w / 2.0,
        Anchor::End => position_mm[0] - w,
    };
    Some((text, Rect::new(x, position_mm[1] - 0.8 * h, w, h)))
}

/// Centres of every drawn star (batched discs and single markers), mm.
fn star_centres(scene: &Scene) -> Vec<[f32; 2]> {
    let mut out = Vec::new();
    for item in &scene.items {
        match item {
            Item::Stars { centres_mm, .. } => out.extend(centres_mm.iter().copied()),
            Item::Marker {
                centre_mm,
                fill: Some(_),
                ..
            } => out.push(*centre_mm),
            _ => {}
        }
    }
    out
}

fn has_star_at(scene: &Scene, at: [f32; 2], tol_mm: f32) -> bool {
    star_centres(scene)
        .iter()
        .any(|c| (c[0] - at[0]).abs() <= tol_mm && (c[1] - at[1]).abs() <= tol_mm)
}

fn bare() -> MapOptions {
    MapOptions {
        centre_ly: Some([0.0, 0.0, 0.0]),
        mm_per_ly: Some(2.0),
        ..MapOptions::default()
    }
}

/// Map-area centre of an A4 landscape sheet with the panel column: the map
/// spans x 10–225 mm (297 − 10 margin − 58 panel − 4 gap) and y 10–200 mm.
const A4_MAP_CENTRE: [f32; 2] = [117.5, 105.0];

#[test]
fn stars_land_where_the_scale_says() {
    // 5 ly/cm = 2 mm per ly; +x right, +y up the sheet.
    let s = build_sheets(&known(), &bare(), &Overlay::default()).unwrap();
    assert_eq!(s.sheets.len(), 1);
    let scene = &s.sheets[0].scene;
    assert_eq!((scene.width_mm, scene.height_mm), (297.0, 210.0));
    let [cx, cy] = A4_MAP_CENTRE;
    // One pixel at 300 dpi is 25.4/300 = 0.0847 mm.
    let px = 25.4 / 300.0;
    for (p, name) in [
        ([cx, cy], "centre"),
        ([cx + 20.0, cy], "10 ly east"),
        ([cx, cy - 20.0], "10 ly north"),
        ([cx - 40.0, cy + 10.0], "20 ly west, 5 south"),
        ([cx + 60.0, cy - 50.0], "far"),
    ] {
        assert!(
            has_star_at(scene, p, px),
            "{name} not at {p:?}: {:?}",
            star_centres(scene)
        );
    }
}

#[test]
fn fitted_scale_is_round_and_fits() {
    let opts = MapOptions {
        mm_per_ly: None,
        ..bare()
    };
    let s = build_sheets(&known(), &opts, &Overlay::default()).unwrap();
    let ly_per_cm = 10.0 / s.mm_per_ly;
    // Half extents 30 × 25 ly (×1.04) must fit 215 × 190 mm: 2.9 ly/cm
    // would just fit, and the next round scale (1, 2, 2.5, 5 × 10^k) is 5.
    assert!((ly_per_cm - 5.0).abs() < 1e-9, "{ly_per_cm}");
    assert_eq!(s.tiles, [1, 1]);
}

#[test]
fn oblique_and_perspective_views() {
    let oblique = MapOptions {
        view: ViewSpec::Oblique { tilt_deg: 35.0 },
        ..bare()
    };
    let s = build_sheets(&known(), &oblique, &Overlay::default()).unwrap();
    let [cx, cy] = A4_MAP_CENTRE;
    // North (0, 10, 4): v = 10 cos 35° + 4 sin 35° ly, 2 mm each, up the sheet.
    let v = 10.0 * 35f32.to_radians().cos() + 4.0 * 35f32.to_radians().sin();
    assert!(has_star_at(&s.sheets[0].scene, [cx, cy - 2.0 * v], 0.01));
    // A camera 100 ly down −y looking at the origin: East (10, 0, 0) sits
    // at depth 100, so 10 ly right of centre; Low (−20, −5, −6) at depth
    // 95 is scaled by 100/95.
    let persp = MapOptions {
        view: ViewSpec::Perspective {
            eye_ly: Some([0.0, -100.0, 0.0]),
            look_ly: Some([0.0, 0.0, 0.0]),
        },
        ..bare()
    };
    let s = build_sheets(&known(), &persp, &Overlay::default()).unwrap();
    let scene = &s.sheets[0].scene;
    assert!(has_star_at(scene, [cx + 20.0, cy], 0.01));
    let k = 100.0 / 95.0;
    assert!(has_star_at(scene, [cx - 40.0 * k, cy + 12.0 * k], 0.01));
}

#[test]
fn filters_drop_kinds_and_heights() {
    let mut c = known();
    c.push(row(
        10,
        "Ember",
        [5.0, 5.0, 0.0],
        0.6,
        KindChoice::Explicit(StarKind::WhiteDwarf),
    ));
    let only = MapOptions {
        only: Some(vec![StarKind::WhiteDwarf]),
        ..bare()
    };
    let s = build_sheets(&c, &only, &Overlay::default()).unwrap();
    assert_eq!(s.systems, 1);
    let [cx, cy] = A4_MAP_CENTRE;
    let scene = &s.sheets[0].scene;
    // The white dwarf is an open ring: no filled marker, but a Ring marker.
    let ring_at = scene.items.iter().any(|i| {
        matches!(i, Item::Marker { centre_mm, shape: starloom::render::scene::Shape::Ring, fill: None, .. }
            if (centre_mm[0] - (cx + 10.0)).abs() < 0.01 && (centre_mm[1] - (cy - 10.0)).abs() < 0.01)
    });
    assert!(ring_at);
    assert!(!has_star_at(scene, [cx, cy], 0.01));
    let slab = MapOptions {
        z_range_ly: Some([-1.0, 1.0]),
        ..bare()
    };
    let s = build_sheets(&c, &slab, &Overlay::default()).unwrap();
    // Centre, East, Far and Ember have z = 0; North (4) and Low (−6) go.
    assert_eq!(s.systems, 4);
}

#[test]
fn posters_tile_with_overlap_and_an_index() {
    // Stars from −100 to +100 ly in x at 1 mm per ly: 208 mm wide (with the
    // 4 % margin), on A4 landscape tiles of 273 × 186 mm map area.
    let mut c = Catalogue::default();
    for (i, x) in [-100.0, 0.0, 100.0].into_iter().enumerate() {
        c.push(row(
            i as u64 + 1,
            &format!("S{i}"),
            [x, 0.0, 0.0],
            1.0,
            KindChoice::Auto,
        ));
    }
    let opts = MapOptions {
        mm_per_ly: Some(1.0),
        ..bare()
    };
    let s = build_sheets(&c, &opts, &Overlay::default()).unwrap();
    assert_eq!(s.tiles, [1, 1], "208 mm fits one A4 map area");
    // At 2 mm per ly the map is 416 × 4 mm: two columns of 273 mm tiles
    // stepping 263 mm cover 536 mm.
    let opts = MapOptions {
        mm_per_ly: Some(2.0),
        ..opts
    };
    let s = build_sheets(&c, &opts, &Overlay::default()).unwrap();
    assert_eq!(s.tiles, [1, 2]);
    let roles: Vec<SheetRole> = s.sheets.iter().map(|x| x.role).collect();
    assert_eq!(
        roles,
        vec![
            SheetRole::Index,
            SheetRole::Tile { row: 1, col: 1 },
            SheetRole::Tile { row: 1, col: 2 }
        ]
    );
    // The centre star (poster x = 268 mm of 536) lies in the 10 mm both
    // tiles share (263–273 mm), so it is on both sheets.
    let on = |k: usize| star_centres(&s.sheets[k].scene).len();
    assert_eq!(on(1), 2);
    assert_eq!(on(2), 2);
}

#[test]
fn labels_never_overlap_on_a_crowded_sheet() {
    // A tight cluster of 400 stars with long names.
    let c = long_named_cluster(400);
    let opts = MapOptions {
        labels: starloom::map::LabelMode::All,
        layers: Layers {
            stalks: false,
            ..Layers::default()
        },
        ..bare()
    };
    let s = build_sheets(&c, &opts, &Overlay::default()).unwrap();
    let boxes: Vec<Rect> = s.sheets[0]
        .scene
        .items
        .iter()
        .filter_map(text_box)
        .filter(|(text, _)| text.starts_with("Long-named"))
        .map(|(_, b)| b)
        .collect();
    assert!(boxes.len() > 20, "some labels placed: {}", boxes.len());
    assert!(boxes.len() < 400, "a crowded sheet drops labels");
    for (i, a) in boxes.iter().enumerate() {
        for b in &boxes[i + 1..] {
            assert!(!a.overlaps(b), "{a:?} overlaps {b:?}");
        }
    }
    // Never below the readable minimum.
    for item in &s.sheets[0].scene.items {
        if let Item::Text { size_pt, .. } = item {
            assert!(*size_pt >= starloom::map::style::MIN_TEXT_PT);
        }
    }
}

#[test]
fn route_overlay_is_drawn_under_labels() {
    let overlay = Overlay {
        links: vec![[0, 1], [1, 4]],
        route: vec![0, 1, 4],
    };
    let s = build_sheets(&known(), &bare(), &overlay).unwrap();
    let lines = s.sheets[0]
        .scene
        .items
        .iter()
        .filter(|i| matches!(i, Item::Line { points_mm, .. } if points_mm.len() == 3))
        .count();
    assert!(lines >= 1, "the route is one polyline through three stops");
}

#[test]
fn route_ends_are_labelled_on_a_crowded_sheet() {
    // The same tight cluster; the route runs between two faint stars
    // near its middle, where every free place is taken by neighbours.
    let mut c = Catalogue::default();
    for i in 0..400u64 {
        let a = i as f64 * 2.399_963;
        let r = (i as f64).sqrt() * 1.5;
        c.push(row(
            i + 1,
            &format!("Long-named system {i}"),
            [r * a.cos(), r * a.sin(), 0.0],
            if i == 3 || i == 9 { 0.2 } else { 1.2 },
            KindChoice::Auto,
        ));
    }
    let labels = |overlay: &Overlay| -> Vec<String> {
        let s = build_sheets(&c, &bare(), overlay).unwrap();
        s.sheets[0]
            .scene
            .items
            .iter()
            .filter_map(|i| match i {
                Item::Text { text, .. } if text.starts_with("Long-named") => Some(text.clone()),
                _ => None,
            })
            .collect()
    };
    let plain = labels(&Overlay::default());
    let ends = ["Long-named system 3", "Long-named system 9"];
    assert!(
        ends.iter().any(|e| !plain.iter().any(|t| t == e)),
        "without a route the faint inner stars go unlabelled"
    );
    let routed = labels(&Overlay {
        links: Vec::new(),
        route: vec![3, 5, 9],
    });
    for e in ends {
        assert!(routed.iter().any(|t| t == e), "{e} is unlabelled");
    }
}

/// A sheet drawn from a catalogue read with only the map's columns is the
/// same as one drawn from the full read, for every label mode (so the map
/// never looks at a column it does not ask the reader for).
#[test]
fn the_map_columns_are_all_a_sheet_needs() {
    use starloom::catalogue::reader::{read_catalogue, read_catalogue_columns};
    use starloom::map::LabelMode;
    let dir = std::env::temp_dir().join(format!("starloom-mapcols-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("sector.csv");
    let spec = starloom::spec::SectorSpec::new(
        41,
        starloom::spec::Shape::Sphere { radius_ly: 25.0 },
        [0.0; 3],
    );
    let cat = starloom::sampler::generate(&spec, &|_, _| {}).unwrap();
    starloom::catalogue::writer::write_catalogue(&cat, &path, true).unwrap();
    let full = read_catalogue(&path).unwrap();
    let part = read_catalogue_columns(&path, starloom::map::CATALOGUE_COLUMNS).unwrap();
    for label in [LabelMode::Bright, LabelMode::Habitable, LabelMode::All] {
        let opts = MapOptions {
            labels: label,
            ..MapOptions::default()
        };
        let svg = |c: &Catalogue| {
            let sheets = build_sheets(c, &opts, &Overlay::default()).unwrap();
            starloom::render::svg::svg_string(&sheets.sheets[0].scene)
        };
        assert_eq!(svg(&full), svg(&part), "{label:?}");
    }
    std::fs::remove_dir_all(&dir).ok();
}

/// The grid's texts (tick numbers and axis names) of a sheet with their
/// boxes, from 0.8 em above the baseline to 0.2 em below it.
fn grid_text_boxes(scene: &Scene) -> Vec<(String, Rect)> {
    let grid_pt = starloom::map::style::GRID_PT;
    let is_number = |t: &str| t.trim().parse::<f64>().is_ok();
    scene
        .items
        .iter()
        .filter(|i| matches!(i, Item::Text { size_pt, .. } if *size_pt == grid_pt))
        .filter_map(text_box)
        .filter(|(text, _)| {
            is_number(text)
                || text.ends_with(", ly")
                || ((text.starts_with("x ") || text.starts_with("y ")) && is_number(&text[2..]))
        })
        .map(|(text, b)| (text.to_string(), b))
        .collect()
}

/// The map frame of a sheet: its largest closed four-cornered line.
fn map_frame(scene: &Scene) -> Rect {
    scene
        .items
        .iter()
        .filter_map(|i| match i {
            Item::Line {
                points_mm,
                closed: true,
                ..
            } if points_mm.len() == 4 => {
                let xs = points_mm.iter().map(|p| p[0]);
                let ys = points_mm.iter().map(|p| p[1]);
                let (x0, x1) = (
                    xs.clone().fold(f32::MAX, f32::min),
                    xs.fold(f32::MIN, f32::max),
                );
                let (y0, y1) = (
                    ys.clone().fold(f32::MAX, f32::min),
                    ys.fold(f32::MIN, f32::max),
                );
                Some(Rect { x0, y0, x1, y1 })
            }
            _ => None,
        })
        .max_by(|a, b| (a.width() * a.height()).total_cmp(&(b.width() * b.height())))
        .expect("a framed sheet")
}

#[test]
fn grid_texts_keep_clear_of_each_other_and_the_frame() {
    let mut checked = 0;
    let views = [
        ViewSpec::Top,
        ViewSpec::Oblique { tilt_deg: 35.0 },
        ViewSpec::Oblique { tilt_deg: 70.0 },
        ViewSpec::Perspective {
            eye_ly: None,
            look_ly: None,
        },
    ];
    for view in views {
        // Scales and centres that put a grid line at every distance from
        // the map's edges and corners.
        for mm_per_ly in [0.9, 1.0, 1.7, 2.0, 2.6] {
            for k in 0..24 {
                let shift = f64::from(k) * 0.73;
                let opts = MapOptions {
                    centre_ly: Some([shift, -shift, 0.0]),
                    mm_per_ly: Some(mm_per_ly),
                    view,
                    ..MapOptions::default()
                };
                let s = build_sheets(&known(), &opts, &Overlay::default()).unwrap();
                let scene = &s.sheets[0].scene;
                let frame = map_frame(scene);
                let boxes = grid_text_boxes(scene);
                let names = boxes.iter().filter(|(t, _)| t.ends_with(", ly")).count();
                if matches!(view, ViewSpec::Top) {
                    assert_eq!(names, 2, "both axis names are drawn");
                }
                let at = format!("{view:?}, {mm_per_ly} mm/ly, shift {shift}");
                for (i, (t, b)) in boxes.iter().enumerate() {
                    assert!(
                        frame.contains(b),
                        "{t:?} {b:?} crosses the frame {frame:?}: {at}"
                    );
                    for (u, c) in &boxes[..i] {
                        assert!(!b.overlaps(c), "{t:?} {b:?} overlaps {u:?} {c:?}: {at}");
                    }
                    checked += 1;
                }
            }
        }
    }
    assert!(checked > 2000, "grid texts checked: {checked}");
}

/// On a poster's index sheet no star label covers a tile's name.
#[test]
fn index_labels_keep_clear_of_the_tile_names() {
    // A crowded cluster that fills every tile's centre.
    let c = long_named_cluster(600);
    let opts = MapOptions {
        labels: starloom::map::LabelMode::All,
        mm_per_ly: Some(8.0),
        layers: Layers {
            stalks: false,
            ..Layers::default()
        },
        ..bare()
    };
    let s = build_sheets(&c, &opts, &Overlay::default()).unwrap();
    assert!(s.tiles[0] * s.tiles[1] >= 4, "tiles: {:?}", s.tiles);
    let index = s
        .sheets
        .iter()
        .find(|x| x.role == SheetRole::Index)
        .expect("an index sheet");
    let is_tile_name = |t: &str| {
        t.strip_prefix('r')
            .and_then(|t| t.split_once('c'))
            .is_some_and(|(r, c)| r.parse::<u32>().is_ok() && c.parse::<u32>().is_ok())
    };
    let mut names = Vec::new();
    let mut labels = Vec::new();
    for (text, b) in index.scene.items.iter().filter_map(text_box) {
        if is_tile_name(text) {
            names.push((text.to_string(), b));
        } else if text.starts_with("Long-named") {
            labels.push((text.to_string(), b));
        }
    }
    assert_eq!(names.len(), s.tiles[0] * s.tiles[1], "every tile is named");
    assert!(labels.len() > 20, "some labels placed: {}", labels.len());
    for (n, nb) in &names {
        for (l, lb) in &labels {
            assert!(!nb.overlaps(lb), "{l:?} {lb:?} covers tile name {n} {nb:?}");
        }
    }
}

#[test]
fn remnants_without_a_spectrum_get_no_class_colour() {
    // A black hole's class code is `BH` and a neutron star's `NS`: their first
    // letters are not spectral classes, so the class key must not show a
    // black "B" (or an "N") for a sector without B stars.
    let mut c = known();
    c.push(row(
        20,
        "Hollow",
        [-10.0, 10.0, 0.0],
        9.0,
        KindChoice::Explicit(StarKind::BlackHole),
    ));
    c.push(row(
        21,
        "Needle",
        [10.0, -10.0, 0.0],
        1.4,
        KindChoice::Explicit(StarKind::NeutronStar),
    ));
    let s = build_sheets(&c, &bare(), &Overlay::default()).unwrap();
    assert_eq!(s.systems, 7);
    let letters: Vec<&str> = s.sheets[0]
        .scene
        .items
        .iter()
        .filter_map(|i| match i {
            Item::Text { text, .. } if text.len() == 1 => Some(text.as_str()),
            _ => None,
        })
        .collect();
    // The five Sun-like stars are G (or F/K by age); no B or N.
    assert!(letters.iter().any(|t| "FGK".contains(*t)), "{letters:?}");
    assert!(
        !letters.contains(&"B") && !letters.contains(&"N"),
        "{letters:?}"
    );
}

#[test]
fn a_pinned_system_in_a_crowded_generated_sector_is_labelled() {
    // 600 generated stars in a tight disc, and one faint system of the
    // user's own (an imported row) in its middle: on a sheet with far more
    // stars than labels the pin still gets its name, because it is the
    // story's place; as a generated star of its brightness it gets none.
    let with_pin = |origin: Origin| {
        let mut c = long_named_cluster(600);
        for o in c.origin.iter_mut() {
            *o = Origin::Generated;
        }
        c.push(row(
            9000,
            "Keeper's Rest",
            [0.4, 0.3, 0.0],
            0.2,
            KindChoice::Auto,
        ));
        let last = c.len() - 1;
        c.origin[last] = origin;
        c
    };
    let opts = bare();
    let labelled = |c: &Catalogue| {
        let s = build_sheets(c, &opts, &Overlay::default()).unwrap();
        assert_eq!(s.sheets.len(), 1);
        s.sheets[0]
            .scene
            .items
            .iter()
            .filter_map(text_box)
            .any(|(t, _)| t == "Keeper's Rest")
    };
    assert!(labelled(&with_pin(Origin::Imported)));
    assert!(!labelled(&with_pin(Origin::Generated)));
}

#[test]
fn star_labels_keep_clear_of_the_grid_texts() {
    // In every view the grid's numbers and axis names are drawn first and
    // star labels are placed around them (before, oblique and perspective
    // sheets printed "x -20" over a star's name).
    let c = long_named_cluster(300);
    let views = [
        ViewSpec::Top,
        ViewSpec::Oblique { tilt_deg: 35.0 },
        ViewSpec::Perspective {
            eye_ly: None,
            look_ly: None,
        },
    ];
    let mut checked = 0;
    for view in views {
        let opts = MapOptions {
            view,
            labels: starloom::map::LabelMode::All,
            centre_ly: Some([0.0, 0.0, 0.0]),
            mm_per_ly: Some(1.5),
            ..MapOptions::default()
        };
        let s = build_sheets(&c, &opts, &Overlay::default()).unwrap();
        let scene = &s.sheets[0].scene;
        let grid = grid_text_boxes(scene);
        assert!(
            grid.len() >= 2,
            "{view:?}: grid texts drawn: {}",
            grid.len()
        );
        let labels: Vec<(&str, Rect)> = scene
            .items
            .iter()
            .filter_map(text_box)
            .filter(|(t, _)| t.starts_with("Long-named"))
            .collect();
        assert!(
            labels.len() >= 5,
            "{view:?}: labels placed: {}",
            labels.len()
        );
        for (t, b) in &labels {
            for (g, gb) in &grid {
                assert!(
                    !b.overlaps(gb),
                    "{view:?}: {t:?} {b:?} over grid text {g:?} {gb:?}"
                );
                checked += 1;
            }
        }
    }
    assert!(checked > 200, "pairs checked: {checked}");
}

/// Every text of a map's first sheet.
fn sheet_texts(cat: &Catalogue, opts: &MapOptions) -> Vec<String> {
    let sheets = build_sheets(cat, opts, &Overlay::default()).unwrap();
    sheets.sheets[0]
        .scene
        .items
        .iter()
        .filter_map(|i| match i {
            Item::Text { text, .. } => Some(text.clone()),
            _ => None,
        })
        .collect()
}

#[test]
fn only_raster_title_blocks_name_the_resolution() {
    let raster = sheet_texts(&known(), &bare());
    assert!(
        raster.iter().any(|t| t == "A4 landscape, 300 dpi"),
        "{raster:?}"
    );
    let vector = MapOptions {
        raster: false,
        ..bare()
    };
    let vector = sheet_texts(&known(), &vector);
    assert!(vector.iter().any(|t| t == "A4 landscape"), "{vector:?}");
    assert!(!vector.iter().any(|t| t.contains("dpi")), "{vector:?}");
}

#[test]
fn filters_that_leave_nothing_are_reported() {
    let emptied_by = |cat: &Catalogue, opts: MapOptions| {
        build_sheets(cat, &opts, &Overlay::default())
            .unwrap()
            .emptied_by
    };
    let high = Some([100.0, 200.0]);
    let white_dwarfs = Some(vec![StarKind::WhiteDwarf]);
    // The five stars are all main-sequence, from z = -6 to 4 ly.
    let z = MapOptions {
        z_range_ly: high,
        ..bare()
    };
    assert_eq!(emptied_by(&known(), z), [MapFilter::ZRange]);
    let only = MapOptions {
        only: white_dwarfs.clone(),
        ..bare()
    };
    assert_eq!(emptied_by(&known(), only), [MapFilter::Only]);
    let both = MapOptions {
        only: white_dwarfs,
        z_range_ly: high,
        ..bare()
    };
    assert_eq!(
        emptied_by(&known(), both.clone()),
        [MapFilter::Only, MapFilter::ZRange]
    );
    // No star lies from z = 5 to 6 ly, while --only main-sequence keeps
    // all five: the z range alone is to blame.
    let main_sequence_high = MapOptions {
        only: Some(vec![StarKind::MainSequence]),
        z_range_ly: Some([5.0, 6.0]),
        ..bare()
    };
    assert_eq!(
        emptied_by(&known(), main_sequence_high),
        [MapFilter::ZRange]
    );
    // Nothing filtered away: nothing to report.
    assert!(emptied_by(&known(), bare()).is_empty());
    let some = MapOptions {
        z_range_ly: Some([1.0, 6.0]),
        ..bare()
    };
    assert!(emptied_by(&known(), some).is_empty());
    // An empty catalogue: the filters are not to blame.
    assert!(emptied_by(&Catalogue::default(), both).is_empty());
}
