//! The built-in demo scenario, the *Amberline Reach*: an invented stretch
//! of space 60 light years in radius around the colony hub of the
//! setting, with five hand-placed systems that matter to its story.
//!
//! [`write_demo`] writes everything the demo shows into one folder,
//! replacing its own earlier files (and only those): the profiles of the
//! scenario's key stars, the sector catalogue with its spec sidecar, and
//! the sector summary.

use crate::catalogue::Catalogue;
use crate::error::Result;
use crate::spec::{SectorSpec, Shape};
use std::path::{Path, PathBuf};

/// Seed of the demo sector (chosen once; any value works).
pub const DEMO_SEED: u64 = 73_012_026;
/// Radius of the demo sector, light years.
pub const DEMO_RADIUS_LY: f64 = 40.0;
/// Title of the demo sector.
pub const DEMO_TITLE: &str = "Amberline Reach";
/// The scenario's colony world orbits this star (a pinned system).
pub const COLONY_STAR: &str = "Quillon";
/// Resolution of the demo's raster sheets, dots per inch.
pub const DEMO_DPI: f32 = 150.0;
/// Radius of the demo's real-neighbourhood sheet around the Sun, ly.
pub const REAL_RADIUS_LY: f64 = 20.0;
/// Jump range of the demo's travel network, light years.
pub const DEMO_JUMP_LY: f64 = 7.0;
/// The demo's sample route: from the colony's star to the giant.
pub const DEMO_ROUTE: (&str, &str) = ("Quillon", "The Tollgate");
/// The hand-placed systems of the scenario (the `--pin` format).
pub const DEMO_PINS_CSV: &str = include_str!("../assets/demo/amberline_pins.csv");

/// What [`write_demo`] wrote.
#[derive(Debug, Clone, Default)]
pub struct DemoReport {
    /// Every file written, in the order written.
    pub files: Vec<PathBuf>,
    /// Rows of the sector catalogue.
    pub objects: usize,
    /// Systems of the sector catalogue.
    pub systems: usize,
}

/// The demo sector's spec, reading the scenario's pins from `pin_file`.
pub fn demo_spec(pin_file: &Path) -> Result<SectorSpec> {
    let mut spec = SectorSpec::new(
        DEMO_SEED,
        Shape::Sphere {
            radius_ly: DEMO_RADIUS_LY,
        },
        [0.0, 0.0, 0.0],
    );
    spec.title = Some(DEMO_TITLE.to_string());
    spec.home = true;
    crate::spec::load_pins(&mut spec, pin_file.to_path_buf(), None)?;
    spec.validate()?;
    Ok(spec)
}

/// A file-name slug: lower case, letters and digits, words joined by `_`.
pub fn slug(name: &str) -> String {
    let mut out = String::new();
    for c in name.chars() {
        if c.is_ascii_alphanumeric() {
            out.push(c.to_ascii_lowercase());
        } else if c.is_whitespace() && !out.ends_with('_') && !out.is_empty() {
            out.push('_');
        }
    }
    out
}

/// Rows of `cat` whose name matches one of the scenario's key systems
/// (the pins and the home system), in pin order, home first.
pub fn key_rows(cat: &Catalogue, spec: &SectorSpec) -> Vec<usize> {
    let mut rows = Vec::new();
    let home = spec.centre_ly;
    if let Some(i) =
        (0..cat.len()).find(|&i| cat.position_ly(i) == home && cat.id[i] == cat.system[i])
    {
        rows.push(i);
    }
    for pin in &spec.pins {
        if let Some(i) = (0..cat.len()).find(|&i| cat.name[i] == pin.name) {
            rows.push(i);
        }
    }
    rows
}

/// Writes the demo into `dir` (created if missing), replacing the demo's
/// own earlier files there. `progress` is told (done, total) steps.
pub fn write_demo(dir: &Path, progress: &(dyn Fn(u64, u64) + Sync)) -> Result<DemoReport> {
    let mut report = DemoReport::default();
    std::fs::create_dir_all(dir.join("profiles")).map_err(|e| crate::Error::Write {
        path: dir.to_path_buf(),
        message: e.to_string(),
    })?;
    let total = 5;
    progress(0, total);

    let pin_file = dir.join("amberline_pins.csv");
    crate::atomic_file::write_bytes(&pin_file, true, DEMO_PINS_CSV.as_bytes())?;
    report.files.push(pin_file.clone());
    let spec = demo_spec(&pin_file)?;

    // The sector: catalogue, then its spec sidecar (the same as populate).
    let cat_path = dir.join("amberline.csv");
    crate::sampler::write_sector(&spec, &cat_path, true, None, &|_, _| {})?;
    report.files.push(cat_path.clone());
    let side = crate::spec::sidecar_path(&cat_path);
    crate::atomic_file::write_bytes(
        &side,
        true,
        crate::spec::to_toml(&spec, None, &side).as_bytes(),
    )?;
    report.files.push(side);
    progress(1, total);

    // Read it back as every other command would.
    let cat = crate::catalogue::read_catalogue(&cat_path)?;
    report.objects = cat.len();
    report.systems = cat.system_ranges().len();

    // Summary, text and JSON.
    let summary = crate::report::summarise(&cat, Some(spec.shape.volume_ly3()));
    let text_path = dir.join("amberline_summary.txt");
    crate::atomic_file::write_bytes(
        &text_path,
        true,
        crate::report::summary_text(&cat, &summary).as_bytes(),
    )?;
    report.files.push(text_path);
    let json_path = dir.join("amberline_summary.json");
    let mut json = serde_json::to_string_pretty(&summary).map_err(|e| crate::Error::Write {
        path: json_path.clone(),
        message: e.to_string(),
    })?;
    json.push('\n');
    crate::atomic_file::write_bytes(&json_path, true, json.as_bytes())?;
    report.files.push(json_path);
    progress(2, total);

    // Profiles of the key stars, as `starloom star` shows them.
    for i in key_rows(&cat, &spec) {
        // Rebuilt through the physics core, as `starloom star` does, so the
        // profile carries the fields the catalogue does not store.
        let fidelity = spec.population.fidelity;
        let profile = match (
            crate::units::SolarMasses::new(cat.initial_mass_msun[i]),
            crate::units::Gigayears::new(cat.age_gyr[i]),
        ) {
            (Some(mass), Some(age)) => crate::physics::star_profile(
                &crate::physics::StarRequest {
                    mass,
                    age,
                    kind: crate::physics::KindChoice::Auto,
                },
                fidelity,
            ),
            _ => cat.profile(i),
        };
        let base = dir.join("profiles").join(slug(&cat.name[i]));
        let mut text = format!("{}\n", &cat.name[i]);
        text.push_str(&crate::cli::star::profile_text(&profile, fidelity));
        let txt = base.with_extension("txt");
        crate::atomic_file::write_bytes(&txt, true, text.as_bytes())?;
        report.files.push(txt);
        let mut value = crate::cli::star::profile_json(&profile, fidelity);
        if let serde_json::Value::Object(map) = &mut value {
            map.insert("name".into(), cat.name[i].to_string().into());
            map.insert("system".into(), cat.system[i].into());
            let p = cat.position_ly(i);
            map.insert("position_ly".into(), serde_json::json!(p));
        }
        let json = base.with_extension("json");
        let mut body = serde_json::to_string_pretty(&value).unwrap_or_default();
        body.push('\n');
        crate::atomic_file::write_bytes(&json, true, body.as_bytes())?;
        report.files.push(json);
    }
    progress(3, total);

    write_routes(dir, &cat, &mut report)?;

    // The sector's stars on a Hertzsprung–Russell diagram.
    let hr_path = dir.join("amberline_hr.png");
    let hr = crate::render::hr_diagram::hr_scene(&cat, crate::render::paper::Theme::Print);
    crate::render::output::write_scenes(&[hr], &hr_path, DEMO_DPI, true)?;
    report.files.push(hr_path);

    // The map sheet: top view with the jump network and the sample route,
    // as PNG and as vector PDF.
    let overlay = crate::routes::map_overlay(
        &cat,
        DEMO_JUMP_LY,
        false,
        Some((DEMO_ROUTE.0, DEMO_ROUTE.1)),
    )?;
    let opts = crate::map::MapOptions {
        dpi: DEMO_DPI,
        centre_ly: Some([0.0, 0.0, 0.0]),
        ..Default::default()
    };
    // The PDF's title block leaves the resolution out, so it has its own
    // sheet.
    for (ext, raster) in [("png", true), ("pdf", false)] {
        let opts = crate::map::MapOptions {
            raster,
            ..opts.clone()
        };
        let sheets = crate::map::build_sheets(&cat, &opts, &overlay)?;
        let path = dir.join(format!("amberline_map.{ext}"));
        crate::render::output::write_scenes(
            std::slice::from_ref(&sheets.sheets[0].scene),
            &path,
            DEMO_DPI,
            true,
        )?;
        report.files.push(path);
    }

    // The real neighbourhood of the Sun within 20 ly: Hipparcos stars,
    // completed by a generated fill that the sheet draws faded.
    let real_spec = SectorSpec::new(
        DEMO_SEED,
        Shape::Sphere {
            radius_ly: REAL_RADIUS_LY,
        },
        [0.0, 0.0, 0.0],
    );
    let mut real = crate::neighbourhood::real_neighbourhood_sector(&real_spec)?;
    real.meta.title = Some("Sun: 20 ly, real + fill".to_string());
    real.meta.seed = Some(DEMO_SEED);
    let real_csv = dir.join("sun_20ly.csv");
    crate::catalogue::writer::write_catalogue(&real, &real_csv, true)?;
    report.files.push(real_csv);
    let real_opts = crate::map::MapOptions {
        dpi: DEMO_DPI,
        mark_generated: true,
        labels: crate::map::LabelMode::All,
        centre_ly: Some([0.0, 0.0, 0.0]),
        // 2.5 ly/cm, so the whole 40 ly wide sphere fits the A4 map panel.
        mm_per_ly: Some(4.0),
        ..Default::default()
    };
    let real_sheets = crate::map::build_sheets(&real, &real_opts, &Default::default())?;
    let real_png = dir.join("sun_20ly_map.png");
    crate::render::output::write_scenes(
        &[real_sheets.sheets[0].scene.clone()],
        &real_png,
        DEMO_DPI,
        true,
    )?;
    report.files.push(real_png);

    // The night sky from the colony world's star.
    let observer = crate::sky::find_observer(&cat, COLONY_STAR)?;
    let view = crate::sky::sky_view(&cat, observer, &crate::sky::SkyOptions::default());
    let sky_csv = dir.join("quillon_sky.csv");
    crate::sky::write_sky_csv(&view, &sky_csv, true)?;
    report.files.push(sky_csv);
    let chart = crate::sky::chart::sky_chart(&view, &crate::sky::chart::ChartOptions::default());
    let sky_png = dir.join("quillon_sky.png");
    crate::render::output::write_scenes(&[chart], &sky_png, DEMO_DPI, true)?;
    report.files.push(sky_png);
    progress(total, total);
    Ok(report)
}

/// The travel network of the demo sector: links, lanes, its summary and a
/// sample itinerary.
fn write_routes(dir: &Path, cat: &Catalogue, report: &mut DemoReport) -> Result<()> {
    use crate::routes::{JumpNetwork, RouteBy, Systems, resolve_system, shortest_route};
    let systems = Systems::from_catalogue(cat);
    let network = JumpNetwork::build(&systems.positions_ly, DEMO_JUMP_LY);
    let forest = network.spanning_forest();
    let links_path = dir.join("amberline_links.csv");
    crate::atomic_file::write_atomic(&links_path, true, |w| {
        crate::routes::write_links_csv(w, &systems, &network.links)
    })?;
    report.files.push(links_path);
    let lanes_path = dir.join("amberline_lanes.csv");
    crate::atomic_file::write_atomic(&lanes_path, true, |w| {
        crate::routes::write_links_csv(
            w,
            &systems,
            forest.lanes.iter().map(|&k| &network.links[k as usize]),
        )
    })?;
    report.files.push(lanes_path);
    let summary = network.summary(&forest);
    let json_path = dir.join("amberline_network.json");
    let mut json = serde_json::to_string_pretty(&summary).unwrap_or_default();
    json.push('\n');
    crate::atomic_file::write_bytes(&json_path, true, json.as_bytes())?;
    report.files.push(json_path);

    // A sample itinerary, by fewest jumps.
    let from = resolve_system(cat, DEMO_ROUTE.0)?;
    let to = resolve_system(cat, DEMO_ROUTE.1)?;
    let (Some(a), Some(b)) = (
        systems.index_of_id(from.system_id),
        systems.index_of_id(to.system_id),
    ) else {
        return Ok(());
    };
    let adjacency = network.adjacency();
    let mut text = format!(
        "From {} to {} with a jump range of {DEMO_JUMP_LY} ly, fewest jumps:\n",
        DEMO_ROUTE.0, DEMO_ROUTE.1
    );
    match shortest_route(
        &adjacency,
        &systems.positions_ly,
        a,
        b,
        RouteBy::Jumps,
        &|_| true,
    ) {
        Some(route) => {
            for (k, &s) in route.systems.iter().enumerate() {
                let row = systems.primary_rows[s as usize];
                let leg = if k == 0 {
                    "start".to_string()
                } else {
                    format!("{:>6.2} ly", route.legs_ly[k - 1])
                };
                text.push_str(&format!(
                    "  {leg:>9}  {} ({})\n",
                    &cat.name[row],
                    cat.class[row].as_str()
                ));
            }
            text.push_str(&format!(
                "{} jumps, {:.2} ly in all\n",
                route.jumps(),
                route.distance_ly
            ));
        }
        None => text.push_str("  no route: the two systems lie in different regions\n"),
    }
    let route_path = dir.join("amberline_route.txt");
    crate::atomic_file::write_bytes(&route_path, true, text.as_bytes())?;
    report.files.push(route_path);
    Ok(())
}
