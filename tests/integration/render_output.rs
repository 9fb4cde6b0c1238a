//! Render back ends: page sizes in pixels, the PNG pHYs chunk, SVG and
//! PDF structure, bad output requests.

use crate::util::work_dir;
use starloom::render::output::{pixels_per_metre, write_scenes};
use starloom::render::paper::Paper;
use starloom::render::raster::raster_size_px;
use starloom::render::scene::{Anchor, Item, Rgba, Scene, Shape, Stroke};
use std::path::Path;

fn page(w: f32, h: f32, items: Vec<Item>) -> Scene {
    Scene {
        width_mm: w,
        height_mm: h,
        background: Rgba::rgb(255, 255, 255),
        items,
    }
}

/// Decodes a PNG: (width, height, pHYs, RGB(A) bytes, channels).
pub fn decode_png(path: &Path) -> (u32, u32, Option<png::PixelDimensions>, Vec<u8>, usize) {
    let file = std::io::BufReader::new(std::fs::File::open(path).unwrap());
    let mut reader = png::Decoder::new(file).read_info().unwrap();
    let dims = reader.info().pixel_dims;
    let mut buf = vec![0; reader.output_buffer_size().unwrap()];
    let info = reader.next_frame(&mut buf).unwrap();
    buf.truncate(info.buffer_size());
    let channels = info.color_type.samples();
    (info.width, info.height, dims, buf, channels)
}

#[test]
fn paper_sizes_in_pixels() {
    // ISO 216:2007 A4 = 210 × 297 mm; ANSI/ASME Y14.1 Letter = 8.5 × 11 in
    // (1 in = 25.4 mm exactly). Pixels = mm / 25.4 × dpi, rounded;
    // computed by hand: 210/25.4*72 = 595.28, 297/25.4*72 = 841.89,
    // *150 = 1240.16 / 1753.94, *300 = 2480.31 / 3507.87,
    // *600 = 4960.63 / 7015.75; Letter is 8.5 and 11 times the dpi.
    let a4 = |dpi| {
        let (w, h) = Paper::A4.size_mm(false);
        raster_size_px(&page(w, h, vec![]), dpi)
    };
    assert_eq!(a4(72.0), (595, 842));
    assert_eq!(a4(150.0), (1240, 1754));
    assert_eq!(a4(300.0), (2480, 3508));
    assert_eq!(a4(600.0), (4961, 7016));
    let letter = |dpi| {
        let (w, h) = Paper::Letter.size_mm(false);
        raster_size_px(&page(w, h, vec![]), dpi)
    };
    assert_eq!(letter(72.0), (612, 792));
    assert_eq!(letter(100.0), (850, 1100));
    assert_eq!(letter(300.0), (2550, 3300));
    // A3 landscape at 300 dpi: 420/25.4*300 = 4960.63, 297 → 3507.87.
    let (w, h) = Paper::A3.size_mm(true);
    assert_eq!(raster_size_px(&page(w, h, vec![]), 300.0), (4961, 3508));
}

#[test]
fn png_carries_size_and_resolution() {
    let dir = work_dir("render_png_phys");
    // A4 portrait at 50 dpi: 210/25.4*50 = 413.39, 297/25.4*50 = 584.65.
    let path = dir.join("a4.png");
    write_scenes(&[page(210.0, 297.0, vec![])], &path, 50.0, false).unwrap();
    let (w, h, dims, _, channels) = decode_png(&path);
    assert_eq!((w, h, channels), (413, 585, 3));
    // pHYs is in pixels per metre (PNG specification, W3C 2003, §11.3.5.3):
    // 50 / 0.0254 = 1968.5 → 1969; 300 / 0.0254 = 11811.02 → 11811.
    let d = dims.expect("a pHYs chunk");
    assert_eq!((d.xppu, d.yppu, d.unit), (1969, 1969, png::Unit::Meter));
    assert_eq!(pixels_per_metre(300.0), 11811);
    assert_eq!(pixels_per_metre(72.0), 2835);
}

fn dark_centroid(rgb: &[u8], w: u32, channels: usize) -> (f64, f64) {
    let (mut sx, mut sy, mut sw) = (0.0, 0.0, 0.0);
    for (i, p) in rgb.chunks_exact(channels).enumerate() {
        let ink = 255.0 - f64::from(p[1]);
        let (x, y) = ((i as u32 % w) as f64 + 0.5, (i as u32 / w) as f64 + 0.5);
        sx += ink * x;
        sy += ink * y;
        sw += ink;
    }
    (sx / sw, sy / sw)
}

#[test]
fn a_disc_lands_where_the_millimetres_say() {
    let dir = work_dir("render_disc_position");
    // At 100 dpi, (50.8 mm, 25.4 mm) = (2 in, 1 in) = pixel (200, 100).
    let black = Rgba::rgb(0, 0, 0);
    let marker = Item::Marker {
        centre_mm: [50.8, 25.4],
        radius_mm: 1.0,
        shape: Shape::Disc,
        fill: Some(black),
        stroke: None,
    };
    // A small star (sprite path) at (1.3 in, 0.7 in) = pixel (130, 70),
    // and a large one (vector path) at (2.5 in, 1.5 in) = (250, 150).
    let small = Item::Stars {
        centres_mm: vec![[1.3 * 25.4, 0.7 * 25.4]],
        radii_mm: vec![0.5],
        fills: vec![black],
        outline: None,
    };
    let large = Item::Stars {
        centres_mm: vec![[2.5 * 25.4, 1.5 * 25.4]],
        radii_mm: vec![3.0],
        fills: vec![black],
        outline: None,
    };
    for (name, item, want) in [
        ("marker", marker, (200.0, 100.0)),
        ("sprite", small, (130.0, 70.0)),
        ("vector", large, (250.0, 150.0)),
    ] {
        let path = dir.join(format!("{name}.png"));
        write_scenes(&[page(101.6, 76.2, vec![item])], &path, 100.0, false).unwrap();
        let (w, h, _, rgb, ch) = decode_png(&path);
        assert_eq!((w, h), (400, 300));
        let (cx, cy) = dark_centroid(&rgb, w, ch);
        assert!(
            (cx - want.0).abs() < 1.0 && (cy - want.1).abs() < 1.0,
            "{name}: centre at ({cx}, {cy}), expected {want:?}"
        );
        // The centre pixel is solid ink.
        let i = (want.1 as usize * w as usize + want.0 as usize) * ch;
        assert!(rgb[i] < 20, "{name}: centre pixel {}", rgb[i]);
    }
}

fn mixed_scene() -> Scene {
    let ink = Rgba::rgb(10, 10, 10);
    let thin = Stroke {
        color: ink,
        width_mm: 0.2,
        dash_mm: Some((1.0, 0.5)),
    };
    page(
        210.0,
        297.0,
        vec![
            Item::Stars {
                centres_mm: vec![[10.0, 10.0], [20.0, 20.0], [30.0, 30.0]],
                radii_mm: vec![0.5, 1.0, 4.0],
                fills: vec![Rgba::rgb(255, 200, 100); 3],
                outline: Some(Stroke {
                    color: ink,
                    width_mm: 0.1,
                    dash_mm: None,
                }),
            },
            Item::Marker {
                centre_mm: [50.0, 50.0],
                radius_mm: 2.0,
                shape: Shape::Disc,
                fill: Some(ink),
                stroke: None,
            },
            Item::Marker {
                centre_mm: [60.0, 50.0],
                radius_mm: 2.0,
                shape: Shape::Triangle,
                fill: None,
                stroke: Some(thin),
            },
            Item::Line {
                points_mm: vec![[0.0, 0.0], [100.0, 100.0]],
                closed: false,
                stroke: thin,
            },
            Item::Text {
                position_mm: [20.0, 100.0],
                text: "Tarn & <Veil>".into(),
                size_pt: 10.0,
                color: ink,
                anchor: Anchor::Start,
                bold: false,
                rotation_deg: 0.0,
            },
        ],
    )
}

#[test]
fn svg_is_in_millimetres_with_vector_stars() {
    let dir = work_dir("render_svg");
    let path = dir.join("sheet.svg");
    write_scenes(&[mixed_scene()], &path, 300.0, false).unwrap();
    let svg = std::fs::read_to_string(&path).unwrap();
    assert!(svg.starts_with("<?xml"));
    let root = &svg[svg.find("<svg").unwrap()..];
    let root = &root[..root.find('>').unwrap()];
    assert!(root.contains("width=\"210mm\""), "{root}");
    assert!(root.contains("height=\"297mm\""), "{root}");
    assert!(root.contains("viewBox=\"0 0 210 297\""), "{root}");
    // Three stars and one disc marker.
    assert_eq!(svg.matches("<circle").count(), 4);
    assert_eq!(svg.matches("<text").count(), 1);
    assert!(svg.contains("Tarn &amp; &lt;Veil&gt;"));
    assert!(svg.contains("stroke-dasharray=\"1 0.5\""));
    // Every element opened is closed (self-closing or with an end tag).
    let opened = svg.matches('<').count() - svg.matches("</").count() - 1; // minus <?xml
    let closed = svg.matches("/>").count() + svg.matches("</").count();
    assert_eq!(opened, closed);
    assert!(svg.trim_end().ends_with("</svg>"));
}

#[test]
fn pdf_has_one_page_per_scene_at_paper_size() {
    let dir = work_dir("render_pdf");
    let path = dir.join("sheets.pdf");
    let letter = Paper::Letter.size_mm(true);
    let scenes = [
        mixed_scene(),
        page(letter.0, letter.1, vec![]),
        mixed_scene(),
    ];
    write_scenes(&scenes, &path, 300.0, false).unwrap();
    let bytes = std::fs::read(&path).unwrap();
    let text = String::from_utf8_lossy(&bytes);
    assert!(text.starts_with("%PDF-"));
    assert!(text.trim_end().ends_with("%%EOF"));
    let pages = text.matches("/Type /Page\n").count() + text.matches("/Type /Page\r").count();
    let pages = if pages == 0 {
        text.matches("/Type /Page").count() - text.matches("/Type /Pages").count()
    } else {
        pages
    };
    assert_eq!(pages, 3);
    assert!(text.contains("/Count 3"));
    // A4 portrait: 210 and 297 mm × 72/25.4 = 595.28 × 841.89 pt;
    // Letter landscape: 11 × 8.5 in × 72 = 792 × 612 pt.
    assert_eq!(text.matches("/MediaBox [0 0 595.28 841.89]").count(), 2);
    assert_eq!(text.matches("/MediaBox [0 0 792 612]").count(), 1);
}

#[test]
fn bad_requests_write_nothing() {
    let dir = work_dir("render_bad_requests");
    let scene = mixed_scene();
    let bad = dir.join("sheet.jpg");
    let err = write_scenes(std::slice::from_ref(&scene), &bad, 300.0, false).unwrap_err();
    let msg = err.to_string();
    assert!(
        msg.contains("sheet.jpg") && msg.contains(".png, .svg or .pdf"),
        "{msg}"
    );
    let two = dir.join("two.png");
    let err = write_scenes(&[scene.clone(), scene.clone()], &two, 300.0, false).unwrap_err();
    assert!(err.to_string().contains("one page"), "{err}");
    // 1400 mm at 2400 dpi is 132 283 px, longer than the 131 072 px a
    // side that can be drawn: refused before drawing, naming the highest
    // resolution that fits (131 072 / 132 283 × 2400 = 2378.03).
    let huge = dir.join("huge.png");
    let err = write_scenes(&[page(1400.0, 1000.0, vec![])], &huge, 2400.0, false).unwrap_err();
    assert!(matches!(err, starloom::Error::TooLarge(_)), "{err}");
    assert!(err.to_string().contains("up to 2378 dpi"), "{err}");
    let low = dir.join("low.png");
    let err = write_scenes(std::slice::from_ref(&scene), &low, 5.0, false).unwrap_err();
    assert!(err.to_string().contains("--dpi"), "{err}");
    assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 0);
    // An existing file is kept without force.
    let ok = dir.join("ok.svg");
    write_scenes(std::slice::from_ref(&scene), &ok, 300.0, false).unwrap();
    assert!(matches!(
        write_scenes(std::slice::from_ref(&scene), &ok, 300.0, false),
        Err(starloom::Error::OutputExists(_))
    ));
}

/// The PNG file `write_scenes` streams for `scene` at `dpi` on `threads`
/// threads.
fn png_file(dir: &Path, name: &str, scene: &Scene, dpi: f32, threads: usize) -> Vec<u8> {
    let path = dir.join(name);
    rayon::ThreadPoolBuilder::new()
        .num_threads(threads)
        .build()
        .unwrap()
        .install(|| write_scenes(std::slice::from_ref(scene), &path, dpi, true))
        .unwrap();
    std::fs::read(&path).unwrap()
}

#[test]
fn streamed_png_files_hold_the_bytes_of_png_bytes() {
    // 60 × 90 mm at 300 dpi: 709 × 1063 px, nine bands (the last partial).
    let dir = work_dir("render_streamed_png");
    let mut scene = mixed_scene();
    (scene.width_mm, scene.height_mm) = (60.0, 90.0);
    let bytes = starloom::render::output::png_bytes(&scene, 300.0).unwrap();
    for threads in [1, 2, 3] {
        let file = png_file(&dir, "sheet.png", &scene, 300.0, threads);
        assert!(file == bytes, "{threads} threads: the file differs");
    }
    let (w, h, _, _, channels) = decode_png(&dir.join("sheet.png"));
    assert_eq!((w, h, channels), (709, 1063, 3));
}

#[test]
fn a_transparent_page_painted_over_is_written_as_rgb() {
    // The background is transparent, so the writer starts in RGBA; every
    // pixel turns out opaque, so it starts again in RGB (emptying the file
    // it had begun) and gives the bytes of the page drawn whole.
    let dir = work_dir("render_transparent_painted");
    let (w, h) = (40.0, 50.0);
    let cover = Item::Polygon {
        points_mm: vec![
            [-1.0, -1.0],
            [w + 1.0, -1.0],
            [w + 1.0, h + 1.0],
            [-1.0, h + 1.0],
        ],
        fill: Rgba::rgb(20, 40, 60),
        stroke: None,
    };
    let mut scene = page(w, h, vec![cover]);
    scene.items.extend(mixed_scene().items);
    scene.background = Rgba {
        r: 0,
        g: 0,
        b: 0,
        a: 0,
    };
    let pixmap = starloom::render::raster::rasterise(&scene, 300.0).unwrap();
    let mut whole = Vec::new();
    starloom::render::output::encode_png(&pixmap, 300.0, &mut whole).unwrap();
    for threads in [1, 2] {
        let file = png_file(&dir, "painted.png", &scene, 300.0, threads);
        assert!(file == whole, "{threads} threads: the file differs");
    }
    let (_, _, _, _, channels) = decode_png(&dir.join("painted.png"));
    assert_eq!(channels, 3);
    // Left uncovered, the page stays RGBA.
    scene.items.remove(0);
    let file = png_file(&dir, "bare.png", &scene, 300.0, 2);
    assert!(file == starloom::render::output::png_bytes(&scene, 300.0).unwrap());
    let (_, _, _, _, channels) = decode_png(&dir.join("bare.png"));
    assert_eq!(channels, 4);
}
