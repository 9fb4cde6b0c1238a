//! The rasteriser: same pixels whatever the thread count, and small
//! golden images compared exactly (`STARLOOM_BLESS=1` rewrites them; see
//! tests/golden/README.md).

use rand::{RngExt, SeedableRng};
use starloom::render::raster::rasterise;
use starloom::render::scene::{Anchor, Item, Rgba, Scene, Shape, Stroke};
use std::path::PathBuf;

fn busy_scene(stars: usize, w: f32, h: f32) -> Scene {
    let mut rng = rand_pcg::Pcg64::seed_from_u64(7);
    let mut centres = Vec::with_capacity(stars);
    let mut radii = Vec::with_capacity(stars);
    let mut fills = Vec::with_capacity(stars);
    for _ in 0..stars {
        centres.push([
            rng.random_range(-2.0..w + 2.0),
            rng.random_range(-2.0..h + 2.0),
        ]);
        // Mostly sprites, a few above the sprite limit.
        let r: f32 = rng.random_range(0.0f32..1.0);
        radii.push(0.05 + 0.8 * r.powi(6));
        fills.push(Rgba::rgb(rng.random(), rng.random(), rng.random()));
    }
    let ink = Rgba::rgb(20, 20, 30);
    let mut items = vec![Item::Stars {
        centres_mm: centres,
        radii_mm: radii,
        fills,
        outline: Some(Stroke {
            color: ink,
            width_mm: 0.05,
            dash_mm: None,
        }),
    }];
    for k in 0..6 {
        let y = 5.0 + k as f32 * h / 6.0;
        items.push(Item::Line {
            points_mm: vec![[1.0, y], [w - 1.0, y + 3.0]],
            closed: false,
            stroke: Stroke {
                color: ink,
                width_mm: 0.3,
                dash_mm: (k % 2 == 0).then_some((1.5, 0.7)),
            },
        });
        items.push(Item::Text {
            position_mm: [w / 2.0, y + 1.0],
            text: format!("Band seam {k}"),
            size_pt: 9.0,
            color: ink,
            anchor: Anchor::Middle,
            bold: k % 2 == 1,
            rotation_deg: if k == 3 { 30.0 } else { 0.0 },
        });
    }
    Scene {
        width_mm: w,
        height_mm: h,
        background: Rgba::rgb(250, 250, 245),
        items,
    }
}

#[test]
fn same_pixels_with_one_or_two_threads() {
    // 60 × 90 mm at 200 dpi is 472 × 709 px: six bands of 128 rows.
    let scene = busy_scene(20_000, 60.0, 90.0);
    let run = |threads| {
        rayon::ThreadPoolBuilder::new()
            .num_threads(threads)
            .build()
            .unwrap()
            .install(|| rasterise(&scene, 200.0).unwrap())
    };
    let one = run(1);
    let two = run(2);
    assert_eq!((one.width(), one.height()), (472, 709));
    assert!(one.data() == two.data(), "1 and 2 threads differ");
    // Something was drawn: not every pixel is the background.
    let bg = one.data()[..4].to_vec();
    assert!(one.data().chunks_exact(4).any(|p| p != bg.as_slice()));
}

fn golden_dir() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("tests/golden/render")
}

/// Compares a scene's pixels with `tests/golden/render/NAME.png`
/// exactly; `STARLOOM_BLESS=1` writes the reference instead. On a
/// mismatch the actual image goes to `target/golden-diff/render/`.
fn check_golden(name: &str, scene: &Scene, dpi: f32) {
    let bytes = starloom::render::output::png_bytes(scene, dpi).unwrap();
    let reference = golden_dir().join(format!("{name}.png"));
    if std::env::var("STARLOOM_BLESS").is_ok_and(|v| v == "1") {
        std::fs::create_dir_all(golden_dir()).unwrap();
        std::fs::write(&reference, &bytes).unwrap();
        return;
    }
    assert!(
        reference.exists(),
        "missing {}; run with STARLOOM_BLESS=1 to create it",
        reference.display()
    );
    let actual = decode(&bytes);
    let expected = decode(&std::fs::read(&reference).unwrap());
    if actual != expected {
        let out = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("target/golden-diff/render");
        std::fs::create_dir_all(&out).unwrap();
        std::fs::write(out.join(format!("{name}.png")), &bytes).unwrap();
        panic!(
            "{name}: pixels differ from {} (actual written to {})",
            reference.display(),
            out.display()
        );
    }
}

fn decode(bytes: &[u8]) -> (u32, u32, Vec<u8>) {
    let mut reader = png::Decoder::new(std::io::Cursor::new(bytes))
        .read_info()
        .unwrap();
    let mut buf = vec![0; reader.output_buffer_size().unwrap()];
    let info = reader.next_frame(&mut buf).unwrap();
    buf.truncate(info.buffer_size());
    (info.width, info.height, buf)
}

#[test]
fn golden_markers_and_text() {
    let ink = Rgba::rgb(20, 20, 30);
    let thin = Stroke {
        color: ink,
        width_mm: 0.2,
        dash_mm: None,
    };
    let shapes = [
        Shape::Disc,
        Shape::Ring,
        Shape::Square,
        Shape::Diamond,
        Shape::Triangle,
        Shape::Cross,
    ];
    let mut items: Vec<Item> = shapes
        .iter()
        .enumerate()
        .map(|(i, s)| Item::Marker {
            centre_mm: [6.0 + 8.0 * i as f32, 7.0],
            radius_mm: 2.5,
            shape: *s,
            fill: Some(Rgba::rgb(240, 180, 90)),
            stroke: Some(thin),
        })
        .collect();
    items.push(Item::Line {
        points_mm: vec![[3.0, 14.0], [47.0, 14.0]],
        closed: false,
        stroke: Stroke {
            color: Rgba::rgb(180, 30, 30),
            width_mm: 0.35,
            dash_mm: Some((1.5, 1.0)),
        },
    });
    items.push(Item::Polygon {
        points_mm: vec![[40.0, 18.0], [48.0, 18.0], [44.0, 26.0]],
        fill: Rgba {
            r: 40,
            g: 90,
            b: 200,
            a: 140,
        },
        stroke: Some(thin),
    });
    items.push(Item::Text {
        position_mm: [3.0, 21.0],
        text: "Amberline 4.2 ly".into(),
        size_pt: 8.0,
        color: ink,
        anchor: Anchor::Start,
        bold: false,
        rotation_deg: 0.0,
    });
    items.push(Item::Text {
        position_mm: [25.0, 27.0],
        text: "Reach".into(),
        size_pt: 7.0,
        color: ink,
        anchor: Anchor::Middle,
        bold: true,
        rotation_deg: 15.0,
    });
    let scene = Scene {
        width_mm: 50.0,
        height_mm: 30.0,
        background: Rgba::rgb(255, 255, 255),
        items,
    };
    check_golden("markers_and_text", &scene, 200.0);
}

#[test]
fn golden_star_field() {
    // 40 × 30 mm at 200 dpi: 315 × 236 px.
    check_golden("star_field", &busy_scene(600, 40.0, 30.0), 200.0);
}
