//! The `map` command: parse options, read the catalogue, build the
//! sheets and write them (one file per sheet; all pages in one PDF).

use crate::error::Error;
use crate::map::{self, LabelMode, Layers, MapFilter, MapOptions, options};
use crate::render::overlay::Overlay;
use std::path::PathBuf;
use std::process::ExitCode;

/// Arguments of `starloom map`.
#[derive(Debug, clap::Args)]
pub struct MapArgs {
    /// The catalogue (.csv or .jsonl; a hand-made CSV needs only name,x_ly,y_ly,z_ly).
    pub catalogue: PathBuf,
    /// Output file: .png, .svg or .pdf. Tiled maps write STEM.rRcC.EXT and STEM.index.EXT beside it.
    #[arg(long)]
    pub out: PathBuf,
    /// View: top (default), oblique or perspective.
    #[arg(long, default_value = "top")]
    pub view: String,
    /// Oblique tilt from straight down, degrees (default 35).
    #[arg(long, allow_hyphen_values = true)]
    pub tilt: Option<String>,
    /// Perspective camera position X,Y,Z, ly (default: from −y, raised 30°, far enough to fit).
    #[arg(long, allow_hyphen_values = true)]
    pub eye: Option<String>,
    /// Perspective look point X,Y,Z, ly (default: the map centre).
    #[arg(long, allow_hyphen_values = true)]
    pub look: Option<String>,
    /// Map centre X,Y,Z, ly; heights are measured from its plane (default: the sector centre in
    /// the catalogue's sidecar OUT.toml, else the middle of the catalogue).
    #[arg(long = "centre", visible_alias = "center", allow_hyphen_values = true)]
    pub centre: Option<String>,
    /// Paper: a4 (default), a3, a2, a1, a0, letter, legal, tabloid.
    #[arg(long, default_value = "a4")]
    pub paper: String,
    /// Landscape sheets (the default).
    #[arg(long, conflicts_with = "portrait")]
    pub landscape: bool,
    /// Portrait sheets.
    #[arg(long)]
    pub portrait: bool,
    /// Raster resolution, dots per inch, 10–2400 (default 300).
    #[arg(long, default_value = "300", allow_hyphen_values = true)]
    pub dpi: String,
    /// Scale such as 5ly/cm, 2pc/in or 1ly/in (default: fit one sheet).
    #[arg(long, allow_hyphen_values = true)]
    pub scale: Option<String>,
    /// Which stars get names: bright (default), habitable, all, none.
    #[arg(long, default_value = "bright")]
    pub label: String,
    /// Layers to leave out: grid,labels,legend,scalebar,title,stalks,frame.
    #[arg(long)]
    pub hide: Option<String>,
    /// Only these kinds, e.g. main-sequence,white-dwarf.
    #[arg(long)]
    pub only: Option<String>,
    /// Only heights MIN,MAX, ly.
    #[arg(long, allow_hyphen_values = true)]
    pub z_range: Option<String>,
    /// Colours: print (default, light paper) or screen (dark).
    #[arg(long, visible_alias = "colour-theme", default_value = "print")]
    pub theme: String,
    /// Draw generated stars faded so catalogued ones stand out.
    #[arg(long)]
    pub mark_generated: bool,
    /// Sheet title (default: the catalogue's title).
    #[arg(long)]
    pub title: Option<String>,
    /// Draw the jump network for this jump range (ly, or with a unit) under the stars.
    #[arg(long, allow_hyphen_values = true)]
    pub jump: Option<String>,
    /// With --jump, draw only the lanes (the minimum spanning forest).
    #[arg(long)]
    pub lanes: bool,
    /// With --jump, highlight the route between two systems: A,B.
    #[arg(long, allow_hyphen_values = true)]
    pub route: Option<String>,
    /// Replace existing output files.
    #[arg(long)]
    pub force: bool,
    /// Print how long each stage took (wall clock) to standard error.
    #[arg(long)]
    pub timings: bool,
}

/// Wall-clock stage times for `--timings`, printed to standard error.
struct Stages {
    on: bool,
    start: std::time::Instant,
    last: std::time::Instant,
}

impl Stages {
    fn new(on: bool) -> Stages {
        let now = std::time::Instant::now();
        Stages {
            on,
            start: now,
            last: now,
        }
    }

    /// Ends the stage `name` (begun where the last one ended).
    fn done(&mut self, name: &str) {
        let now = std::time::Instant::now();
        if self.on {
            eprintln!(
                "{name:<22} {:>8.1} ms",
                (now - self.last).as_secs_f64() * 1e3
            );
        }
        self.last = now;
    }

    fn total(&self) {
        if self.on {
            eprintln!(
                "{:<22} {:>8.1} ms",
                "total (after start-up)",
                self.start.elapsed().as_secs_f64() * 1e3
            );
        }
    }
}

/// Parses `--route A,B` into two names.
fn parse_route(text: &str) -> crate::Result<(String, String)> {
    let bad = || {
        Error::invalid(
            "--route",
            text,
            "it must be two system names or ids separated by a comma: A,B",
        )
    };
    let (a, b) = text.split_once(',').ok_or_else(bad)?;
    let (a, b) = (a.trim(), b.trim());
    if a.is_empty() || b.is_empty() || b.contains(',') {
        return Err(bad());
    }
    Ok((a.to_string(), b.to_string()))
}

/// The note for a map whose filters left no systems, naming them with
/// their values: "no systems match --z-range 1000,2000 ly; the sheet
/// shows none".
fn empty_note(opts: &MapOptions, emptied_by: &[MapFilter], n_sheets: usize) -> Option<String> {
    let named: Vec<String> = emptied_by
        .iter()
        .filter_map(|f| match f {
            MapFilter::Only => opts.only.as_ref().map(|kinds| {
                let kinds: Vec<&str> = kinds.iter().map(|k| k.as_str()).collect();
                format!("--only {}", kinds.join(","))
            }),
            MapFilter::ZRange => opts.z_range_ly.map(|[lo, hi]| {
                format!(
                    "--z-range {},{} ly",
                    map::scale::format_number(lo),
                    map::scale::format_number(hi)
                )
            }),
        })
        .collect();
    if named.is_empty() {
        return None;
    }
    let sheets = if n_sheets > 1 {
        "the sheets show"
    } else {
        "the sheet shows"
    };
    Some(format!(
        "no systems match {}; {sheets} none",
        named.join(" with ")
    ))
}

/// Validates every option into map settings and the overlay request.
#[allow(clippy::type_complexity)]
fn settings(
    args: &MapArgs,
) -> crate::Result<(MapOptions, Option<f64>, bool, Option<(String, String)>)> {
    let ext = args
        .out
        .extension()
        .and_then(|e| e.to_str())
        .map(str::to_ascii_lowercase);
    if !matches!(ext.as_deref(), Some("png" | "svg" | "pdf")) {
        return Err(Error::invalid(
            "--out",
            args.out.display(),
            "it must end in .png, .svg or .pdf",
        ));
    }
    let paper = options::parse_paper(&args.paper)?;
    let dpi = options::parse_dpi(&args.dpi)?;
    let landscape = args.landscape || !args.portrait;
    let view = options::parse_view(
        &args.view,
        args.tilt.as_deref(),
        args.eye.as_deref(),
        args.look.as_deref(),
    )?;
    let jump_ly = args
        .jump
        .as_deref()
        .map(|j| crate::spec::parse_length_ly("--jump", j))
        .transpose()?;
    let route = args.route.as_deref().map(parse_route).transpose()?;
    if jump_ly.is_none() && (args.lanes || route.is_some()) {
        return Err(Error::Usage(
            "--lanes and --route need a jump range: add --jump LY".to_string(),
        ));
    }
    let opts = MapOptions {
        view,
        centre_ly: args
            .centre
            .as_deref()
            .map(|c| crate::spec::parse_centre("--centre", c))
            .transpose()?,
        paper,
        landscape,
        dpi,
        raster: ext.as_deref() == Some("png"),
        mm_per_ly: args
            .scale
            .as_deref()
            .map(map::scale::parse_scale_mm_per_ly)
            .transpose()?,
        labels: LabelMode::parse(&args.label)?,
        layers: match &args.hide {
            Some(h) => Layers::hiding(h)?,
            None => Layers::default(),
        },
        only: args.only.as_deref().map(options::parse_only).transpose()?,
        z_range_ly: args
            .z_range
            .as_deref()
            .map(options::parse_z_range)
            .transpose()?,
        theme: options::parse_theme(&args.theme)?,
        mark_generated: args.mark_generated,
        title: args.title.clone(),
    };
    Ok((opts, jump_ly, args.lanes, route))
}

/// Runs `starloom map`.
pub fn run(args: MapArgs) -> anyhow::Result<ExitCode> {
    let mut stages = Stages::new(args.timings);
    let (mut opts, jump_ly, lanes, route) = settings(&args)?;
    crate::render::text::warm_up();
    let cat = crate::catalogue::reader::read_catalogue_columns(
        &args.catalogue,
        crate::map::CATALOGUE_COLUMNS.with(crate::routes::CATALOGUE_COLUMNS),
    )?;
    stages.done("read catalogue");
    if opts.title.is_none() && cat.meta.title.is_none() {
        opts.title = args
            .catalogue
            .file_stem()
            .map(|s| s.to_string_lossy().into_owned());
    }
    let overlay = match jump_ly {
        Some(jump_ly) => crate::routes::map_overlay(
            &cat,
            jump_ly,
            lanes,
            route.as_ref().map(|(a, b)| (a.as_str(), b.as_str())),
        )?,
        None => Overlay::default(),
    };
    if jump_ly.is_some() {
        stages.done("jump network");
    }
    let sheets = map::build_sheets(&cat, &opts, &overlay)?;
    stages.done("build sheets");
    let is_pdf = args
        .out
        .extension()
        .is_some_and(|e| e.eq_ignore_ascii_case("pdf"));
    let paths: Vec<PathBuf> = if is_pdf {
        vec![args.out.clone()]
    } else {
        sheets
            .sheets
            .iter()
            .map(|s| map::sheet_path(&args.out, s))
            .collect()
    };
    // Refuse before writing anything when any target exists.
    for p in &paths {
        crate::atomic_file::check_target(p, args.force)?;
    }
    if is_pdf {
        let scenes: Vec<_> = sheets.sheets.iter().map(|s| s.scene.clone()).collect();
        crate::render::output::write_scenes(&scenes, &args.out, opts.dpi, args.force)?;
    } else {
        for (sheet, path) in sheets.sheets.iter().zip(&paths) {
            crate::render::output::write_scenes(
                std::slice::from_ref(&sheet.scene),
                path,
                opts.dpi,
                args.force,
            )?;
        }
    }
    stages.done("draw, encode, write");
    if let Some(note) = empty_note(&opts, &sheets.emptied_by, sheets.sheets.len()) {
        eprintln!("starloom: note: {note}");
    }
    let [rows, cols] = sheets.tiles;
    if rows * cols > 1 {
        let tiles = format!(
            "an index sheet and {} tiles ({} × {}) at {}",
            rows * cols,
            crate::report::counted(rows as u64, "row", "rows"),
            crate::report::counted(cols as u64, "column", "columns"),
            map::scale::describe_scale(sheets.mm_per_ly)
        );
        match paths.as_slice() {
            [one] => println!("wrote {}: {tiles}, one page each", one.display()),
            [first, second, last] => println!(
                "wrote {tiles}: {}, {} and {}",
                first.display(),
                second.display(),
                last.display()
            ),
            [first, second, .., last] => println!(
                "wrote {tiles}: {} and {} … {}",
                first.display(),
                second.display(),
                last.display()
            ),
            [] | [_, _] => {}
        }
    } else {
        println!(
            "wrote {} ({}, {})",
            paths[0].display(),
            crate::report::counted(sheets.systems as u64, "system", "systems"),
            map::scale::describe_scale(sheets.mm_per_ly)
        );
    }
    // The process ends now: handing the catalogue (a million names and
    // columns) back to the allocator one piece at a time would only add
    // tens of milliseconds before the operating system frees it all.
    std::mem::forget((sheets, overlay, cat));
    stages.total();
    Ok(ExitCode::SUCCESS)
}
