//! The `sky` command: the night sky seen from one star of a catalogue.

use crate::error::Error;
use crate::render::output::parse_dpi;
use crate::render::paper::{Paper, Theme, parse_paper, parse_theme};
use crate::sky::{self, ChartOptions, SkyOptions, SkyView};
use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// Arguments of `starloom sky`.
#[derive(Debug, clap::Args)]
pub struct SkyArgs {
    /// The catalogue (.csv or .jsonl).
    pub catalogue: PathBuf,
    /// The observer: a system id, a star id or a star name (any case).
    #[arg(long, allow_hyphen_values = true)]
    pub from: String,
    /// Faintest apparent magnitude counted as visible (naked eye: 6.5).
    #[arg(long, allow_hyphen_values = true, value_name = "MAG")]
    pub limit: Option<String>,
    /// Uniform interstellar extinction, V magnitudes per 1000 ly (default
    /// none; about 0.5 in the galactic plane is common practice).
    #[arg(long, allow_hyphen_values = true, value_name = "MAG_PER_KLY")]
    pub extinction: Option<String>,
    /// Print the visible stars as JSON.
    #[arg(long)]
    pub json: bool,
    /// Write the full list (.csv) or a sky chart (.png, .svg, .pdf); may be repeated.
    #[arg(long, value_name = "PATH")]
    pub out: Vec<PathBuf>,
    /// Chart projection: hammer-aitoff (default), mollweide, stereographic, equirectangular.
    #[arg(long)]
    pub projection: Option<String>,
    /// Chart centre L,B in galactic degrees (e.g. 120,-30): the centre of a
    /// stereographic chart; other projections use only L as their centre meridian.
    #[arg(long, allow_hyphen_values = true, value_name = "L,B")]
    pub toward: Option<String>,
    /// Paper size: a4, a3, a2, a1, a0, letter, legal, tabloid.
    #[arg(long)]
    pub paper: Option<String>,
    /// Landscape pages (the default for sky charts).
    #[arg(long, conflicts_with = "portrait")]
    pub landscape: bool,
    /// Portrait pages.
    #[arg(long)]
    pub portrait: bool,
    /// Colour scheme: print (light paper) or screen (dark sky).
    #[arg(long)]
    pub theme: Option<String>,
    /// Raster resolution for PNG, dots per inch.
    #[arg(long, allow_hyphen_values = true)]
    pub dpi: Option<String>,
    /// How many of the brightest stars get name labels.
    #[arg(long, allow_hyphen_values = true)]
    pub labels: Option<String>,
    /// Chart title (default "The sky from NAME").
    #[arg(long)]
    pub title: Option<String>,
    /// Replace existing output files.
    #[arg(long)]
    pub force: bool,
}

enum Output {
    Csv(PathBuf),
    Chart(PathBuf),
}

fn parse_outputs(paths: &[PathBuf], force: bool) -> crate::Result<Vec<Output>> {
    let mut outs = Vec::new();
    for p in paths {
        let ext = p
            .extension()
            .map(|e| e.to_string_lossy().to_ascii_lowercase())
            .unwrap_or_default();
        let out = match ext.as_str() {
            "csv" => Output::Csv(p.clone()),
            "png" | "svg" | "pdf" => Output::Chart(p.clone()),
            _ => {
                return Err(Error::invalid(
                    "--out",
                    p.display(),
                    "it must end in .csv (the star list) or .png, .svg or .pdf (a chart)",
                ));
            }
        };
        crate::atomic_file::check_target(p, force)?;
        outs.push(out);
    }
    Ok(outs)
}

/// Every setting checked before the catalogue is read.
struct Settings {
    options: SkyOptions,
    chart: ChartOptions,
    dpi: f32,
    outputs: Vec<Output>,
}

fn settings(args: &SkyArgs) -> crate::Result<Settings> {
    let mut options = SkyOptions::default();
    if let Some(t) = &args.limit {
        options.limit_mag = sky::parse::parse_magnitude("--limit", t)?;
    }
    if let Some(t) = &args.extinction {
        options.extinction_mag_per_kly = sky::parse::parse_extinction("--extinction", t)?;
    }
    let toward = match &args.toward {
        Some(t) => sky::parse::parse_toward("--toward", t)?,
        None => (0.0, 0.0),
    };
    let projection = sky::parse::parse_projection(
        "--projection",
        args.projection.as_deref().unwrap_or("hammer-aitoff"),
        toward,
    )?;
    let paper = match &args.paper {
        Some(t) => parse_paper(t)?,
        None => Paper::A4,
    };
    let theme = match &args.theme {
        Some(t) => parse_theme(t)?,
        None => Theme::Print,
    };
    let dpi = match &args.dpi {
        Some(t) => parse_dpi(t)?,
        None => 300.0,
    };
    let labels = match &args.labels {
        Some(t) => t.trim().parse::<usize>().map_err(|_| {
            Error::invalid(
                "--labels",
                t,
                "it must be a whole number of labels, 0 or more",
            )
        })?,
        None => 20,
    };
    let chart = ChartOptions {
        projection,
        centre_l_deg: toward.0,
        paper,
        landscape: !args.portrait,
        theme,
        labels,
        title: args.title.clone(),
    };
    let outputs = parse_outputs(&args.out, args.force)?;
    Ok(Settings {
        options,
        chart,
        dpi,
        outputs,
    })
}

/// The JSON document: the observer, the visible stars and how many are fainter.
pub fn view_json(view: &SkyView) -> serde_json::Value {
    use serde_json::json;
    let o = &view.observer;
    let stars: Vec<serde_json::Value> = view
        .visible()
        .iter()
        .map(|s| {
            let mut v = json!({
                "name": s.name,
                "system": s.system,
                "apparent_mag": round(s.apparent_mag, 3),
                "l_deg": round(s.l_deg, 4),
                "b_deg": round(s.b_deg, 4),
                "distance_ly": s.distance_ly,
                "visible": s.visible,
            });
            if let Some(au) = s.separation_au {
                v["separation_au"] = json!(au);
            }
            v
        })
        .collect();
    json!({
        "observer": {
            "name": o.name,
            "id": o.id,
            "system": o.system,
            "position_ly": o.position_ly,
        },
        "limit_mag": view.options.limit_mag,
        "extinction_mag_per_kly": view.options.extinction_mag_per_kly,
        "stars": stars,
        "visible_count": view.visible_count,
        "fainter_count": view.fainter_count(),
    })
}

fn round(x: f64, decimals: i32) -> f64 {
    let p = 10f64.powi(decimals);
    (x * p).round() / p
}

fn print_table(view: &SkyView, w: &mut impl Write) -> std::io::Result<()> {
    let o = &view.observer;
    writeln!(
        w,
        "The sky from {} (system {}): {} brighter than V {}, {} fainter",
        o.name,
        o.system,
        crate::report::counted(view.visible_count as u64, "star", "stars"),
        view.options.limit_mag,
        view.fainter_count()
    )?;
    writeln!(
        w,
        "{:<24} {:>8} {:>9} {:>8} {:>12}",
        "name", "V mag", "l deg", "b deg", "distance"
    )?;
    for s in view.visible() {
        let distance = match s.separation_au {
            Some(au) => format!("{au:.3} au"),
            None => format!("{:.2} ly", s.distance_ly),
        };
        writeln!(
            w,
            "{:<24} {:>8.2} {:>9.2} {:>8.2} {:>12}",
            s.name, s.apparent_mag, s.l_deg, s.b_deg, distance
        )?;
    }
    Ok(())
}

/// Runs `starloom sky`.
pub fn run(args: SkyArgs) -> anyhow::Result<ExitCode> {
    let s = settings(&args)?;
    let cat = crate::catalogue::read_catalogue(&args.catalogue)?;
    if cat.is_empty() {
        return Err(Error::Usage(format!("{} holds no stars", args.catalogue.display())).into());
    }
    let row = sky::find_observer(&cat, &args.from)?;
    let view = sky::sky_view(&cat, row, &s.options);
    for out in &s.outputs {
        match out {
            Output::Csv(p) => sky::write_sky_csv(&view, p, args.force)?,
            Output::Chart(p) => write_chart(&view, &s, p, args.force)?,
        }
    }
    let mut stdout = std::io::BufWriter::new(std::io::stdout().lock());
    if args.json {
        let text = serde_json::to_string_pretty(&view_json(&view))?;
        writeln!(stdout, "{text}")?;
    } else if s.outputs.is_empty() {
        print_table(&view, &mut stdout)?;
    } else {
        for out in &s.outputs {
            let (Output::Csv(p) | Output::Chart(p)) = out;
            eprintln!("wrote {}", p.display());
        }
    }
    stdout.flush()?;
    Ok(ExitCode::SUCCESS)
}

fn write_chart(view: &SkyView, s: &Settings, path: &Path, force: bool) -> crate::Result<()> {
    let scene = sky::sky_chart(view, &s.chart);
    crate::render::output::write_scenes(&[scene], path, s.dpi, force)
}
