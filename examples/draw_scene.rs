//! Draws a small test sheet with every kind of item and writes it as
//! PNG, SVG and PDF: `cargo run --example draw_scene -- OUTDIR`.

use starloom::render::output::write_scenes;
use starloom::render::scene::{Anchor, Item, Rgba, Scene, Shape, Stroke};
use std::path::PathBuf;

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let dir = PathBuf::from(std::env::args().nth(1).unwrap_or_else(|| ".".into()));
    let ink = Rgba::rgb(20, 20, 30);
    let thin = Stroke {
        color: ink,
        width_mm: 0.2,
        dash_mm: None,
    };
    let mut items = vec![
        Item::Line {
            points_mm: vec![[10.0, 10.0], [138.0, 10.0], [138.0, 95.0], [10.0, 95.0]],
            closed: true,
            stroke: thin,
        },
        Item::Line {
            points_mm: vec![[15.0, 85.0], [130.0, 60.0]],
            closed: false,
            stroke: Stroke {
                color: Rgba::rgb(200, 40, 40),
                width_mm: 0.4,
                dash_mm: Some((2.0, 1.0)),
            },
        },
        Item::Polygon {
            points_mm: vec![[100.0, 70.0], [130.0, 70.0], [115.0, 90.0]],
            fill: Rgba {
                r: 60,
                g: 120,
                b: 220,
                a: 128,
            },
            stroke: Some(thin),
        },
    ];
    let shapes = [
        Shape::Disc,
        Shape::Ring,
        Shape::Square,
        Shape::Diamond,
        Shape::Triangle,
        Shape::Cross,
    ];
    for (i, s) in shapes.iter().enumerate() {
        items.push(Item::Marker {
            centre_mm: [20.0 + 15.0 * i as f32, 25.0],
            radius_mm: 4.0,
            shape: *s,
            fill: Some(Rgba::rgb(255, 200, 120)),
            stroke: Some(thin),
        });
    }
    let mut centres = Vec::new();
    let mut radii = Vec::new();
    let mut fills = Vec::new();
    for i in 0..200 {
        let t = i as f32 / 200.0;
        centres.push([15.0 + 110.0 * t, 45.0 + 8.0 * (t * 40.0).sin()]);
        radii.push(0.1 + 1.2 * t);
        fills.push(Rgba::rgb(
            (155.0 + 100.0 * t) as u8,
            (180.0 + 40.0 * t) as u8,
            (255.0 - 150.0 * t) as u8,
        ));
    }
    items.push(Item::Stars {
        centres_mm: centres,
        radii_mm: radii,
        fills,
        outline: Some(Stroke {
            color: ink,
            width_mm: 0.08,
            dash_mm: None,
        }),
    });
    items.push(Item::Text {
        position_mm: [15.0, 80.0],
        text: "Amberline Reach — Vega 12 · 3.4 ly".into(),
        size_pt: 12.0,
        color: ink,
        anchor: Anchor::Start,
        bold: false,
        rotation_deg: 0.0,
    });
    items.push(Item::Text {
        position_mm: [74.0, 70.0],
        text: "Centred bold".into(),
        size_pt: 9.0,
        color: ink,
        anchor: Anchor::Middle,
        bold: true,
        rotation_deg: 0.0,
    });
    items.push(Item::Text {
        position_mm: [135.0, 92.0],
        text: "rotated 90°".into(),
        size_pt: 8.0,
        color: ink,
        anchor: Anchor::Start,
        bold: false,
        rotation_deg: 90.0,
    });
    items.push(Item::Text {
        position_mm: [30.0, 92.0],
        text: "tilted 20°".into(),
        size_pt: 8.0,
        color: ink,
        anchor: Anchor::Start,
        bold: false,
        rotation_deg: 20.0,
    });
    let scene = Scene {
        width_mm: 148.0,
        height_mm: 105.0,
        background: Rgba::rgb(250, 248, 240),
        items,
    };
    for ext in ["png", "svg", "pdf"] {
        let path = dir.join(format!("draw_scene.{ext}"));
        write_scenes(std::slice::from_ref(&scene), &path, 300.0, true)?;
        println!("wrote {}", path.display());
    }
    Ok(())
}
