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

/// Decodes PNG bytes: size, colour type, pHYs and the pixels.
fn decode_full(
    bytes: &[u8],
) -> (
    u32,
    u32,
    png::ColorType,
    Option<png::PixelDimensions>,
    Vec<u8>,
) {
    let mut reader = png::Decoder::new(std::io::Cursor::new(bytes))
        .read_info()
        .unwrap();
    let dims = reader.info().pixel_dims;
    let mut buf = vec![0; reader.output_buffer_size().unwrap()];
    let info = reader.next_frame(&mut buf).unwrap();
    buf.truncate(info.buffer_size());
    (info.width, info.height, info.color_type, dims, buf)
}

#[test]
fn band_pipeline_png_decodes_to_the_rasterised_pixels() {
    // 60 × 90 mm at 200 dpi: 472 × 709 px, six bands (the last partial),
    // so band seams and the Sub/Up filter switch are all crossed.
    let scene = busy_scene(20_000, 60.0, 90.0);
    let dpi = 200.0;
    let pixmap = rasterise(&scene, dpi).unwrap();
    let expected: Vec<u8> = pixmap
        .data()
        .chunks_exact(4)
        .flat_map(|p| [p[0], p[1], p[2]])
        .collect();
    let run = |threads| {
        rayon::ThreadPoolBuilder::new()
            .num_threads(threads)
            .build()
            .unwrap()
            .install(|| starloom::render::output::png_bytes(&scene, dpi).unwrap())
    };
    let one = run(1);
    let two = run(2);
    assert!(one == two, "PNG bytes differ between 1 and 2 threads");
    let (w, h, color, dims, pixels) = decode_full(&one);
    assert_eq!((w, h, color), (472, 709, png::ColorType::Rgb));
    // 200 dpi = 200 / 0.0254 px per metre = 7874.0157 → 7874.
    let dims = dims.expect("a pHYs chunk");
    assert_eq!(
        (dims.xppu, dims.yppu, dims.unit),
        (7874, 7874, png::Unit::Meter)
    );
    assert!(pixels == expected, "decoded PNG differs from the pixmap");
    // Encoding a pixmap drawn whole gives the same file.
    let mut again = Vec::new();
    starloom::render::output::encode_png(&pixmap, dpi, &mut again).unwrap();
    assert!(again == one, "encode_png and png_bytes differ");
}

#[test]
fn translucent_page_round_trips_as_straight_rgba() {
    let mut scene = busy_scene(300, 20.0, 25.0);
    scene.background = Rgba {
        r: 0,
        g: 0,
        b: 0,
        a: 0,
    };
    let pixmap = rasterise(&scene, 200.0).unwrap();
    let bytes = starloom::render::output::png_bytes(&scene, 200.0).unwrap();
    let (w, h, color, _, pixels) = decode_full(&bytes);
    assert_eq!((w, h), (pixmap.width(), pixmap.height()));
    assert_eq!(color, png::ColorType::Rgba);
    // Premultiplied → straight alpha as tiny-skia's own demultiply does it.
    for (p, q) in pixmap.pixels().iter().zip(pixels.chunks_exact(4)) {
        let c = p.demultiply();
        assert_eq!(q[3], c.alpha());
        if c.alpha() != 0 {
            for (a, b) in [(q[0], c.red()), (q[1], c.green()), (q[2], c.blue())] {
                assert!(a.abs_diff(b) <= 1, "{a} vs {b}");
            }
        }
    }
}
