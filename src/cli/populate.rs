//! The `populate` command: turn flags (and an optional spec file) into a
//! [`SectorSpec`](crate::spec::SectorSpec), stream the catalogue to `--out` and write the sidecar
//! `OUT.toml` holding the resolved spec.

use crate::error::Error;
use crate::sampler::Shard;
use crate::spec::{self, NumberOrText, ShapeFile, SpecFile};
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// Arguments of `starloom populate`.
#[derive(Debug, clap::Args)]
#[command(
    after_help = "The hz_inner_au/hz_outer_au columns and the habitable-host flag are simplified \
models for fiction and games, not guidance for any real-world decision."
)]
pub struct PopulateArgs {
    /// A spec file (TOML); flags given here override its values.
    #[arg(long)]
    pub spec: Option<PathBuf>,
    /// A box: full edge lengths X,Y,Z (ly, or with a unit: 30pc).
    #[arg(long = "box", allow_hyphen_values = true)]
    pub box_size: Option<String>,
    /// A sphere of radius R.
    #[arg(long, allow_hyphen_values = true)]
    pub sphere: Option<String>,
    /// A cylinder of radius R and full height H along z: R,H.
    #[arg(long, allow_hyphen_values = true)]
    pub cylinder: Option<String>,
    /// Centre X,Y,Z, light years, galactic axes (default 0,0,0).
    #[arg(long = "centre", visible_alias = "center", allow_hyphen_values = true)]
    pub centre: Option<String>,
    /// Stars per cubic light year, or per cubic parsec with /pc3 (default 0.0025).
    #[arg(long, allow_hyphen_values = true)]
    pub density: Option<String>,
    /// Use the Galactic disk model (density falls off with height).
    #[arg(long, visible_alias = "disc")]
    pub disk: bool,
    /// Thick-disk to thin-disk local density ratio for --disk (default 0.12).
    #[arg(long, allow_hyphen_values = true)]
    pub thick_share: Option<String>,
    /// Initial mass function: kirkpatrick (default), kroupa or chabrier.
    #[arg(long)]
    pub imf: Option<String>,
    /// Age range MIN,MAX in gigayears (default 0,11.2).
    #[arg(long, allow_hyphen_values = true)]
    pub ages: Option<String>,
    /// Keep every neutron star and black hole (no natal-kick losses).
    #[arg(long)]
    pub keep_remnants: bool,
    /// Universe seed; without it a fresh one is drawn and printed.
    #[arg(long, allow_hyphen_values = true)]
    pub seed: Option<String>,
    /// Physics fidelity: fitted (default) or rules.
    #[arg(long)]
    pub physics: Option<String>,
    /// Put a sun-like home system at the centre.
    #[arg(long)]
    pub home: bool,
    /// Real stars (Hipparcos, within 100 ly of the Sun) inside the volume,
    /// the Sun at the origin as home, plus generated stars where the real
    /// list is incomplete.
    #[arg(long)]
    pub real: bool,
    /// Sector title (recorded in the sidecar).
    #[arg(long)]
    pub title: Option<String>,
    /// A CSV of the user's own systems to place (import format).
    #[arg(long)]
    pub pin: Option<PathBuf>,
    /// Radius cleared of generated systems around each pin (default 3ly).
    #[arg(long, allow_hyphen_values = true)]
    pub pin_clear: Option<String>,
    /// Write only slice K of N of the cells (K from 1). The N files
    /// concatenated equal the single-run file, so only shard 1 has the CSV
    /// header row; prepend its first line to read a later shard on its own.
    #[arg(long, allow_hyphen_values = true)]
    pub shard: Option<String>,
    /// Output catalogue: .csv or .jsonl.
    #[arg(long)]
    pub out: PathBuf,
    /// Replace existing output files.
    #[arg(long)]
    pub force: bool,
}

/// Parses `--shard K/N` (also the sidecar's `shard`); `option` names the
/// flag or the file key in an error.
pub(crate) fn parse_shard(option: &str, text: &str) -> crate::Result<Shard> {
    let bad = || {
        Error::invalid(
            option,
            text,
            "it must be K/N with whole numbers 1 <= K <= N (e.g. 2/8)",
        )
    };
    let (k, n) = text.split_once('/').ok_or_else(bad)?;
    let k: u64 = k.trim().parse().map_err(|_| bad())?;
    let n: u64 = n.trim().parse().map_err(|_| bad())?;
    if k == 0 || n == 0 || k > n {
        return Err(bad());
    }
    Ok(Shard { index: k, count: n })
}

/// Builds the spec from the file (if any) and the flags. Flag values are
/// checked here and name their flag; the file's own values are checked by
/// [`SpecFile::resolve`] and name the file, line and key.
pub fn build_spec(args: &PopulateArgs) -> crate::Result<(spec::SectorSpec, Option<Shard>, bool)> {
    let mut file = match &args.spec {
        Some(p) => SpecFile::read(p)?,
        None => SpecFile::default(),
    };
    let flags = flag_settings(args)?;
    file.override_with(flags);
    let mut base = PathBuf::new();
    if args.pin.is_none()
        && let Some(sp) = &args.spec
    {
        base = sp.parent().map(Path::to_path_buf).unwrap_or(base);
    }
    let shard = match (&args.shard, &file.shard) {
        (Some(s), _) => Some(parse_shard("--shard", s)?),
        (None, Some(s)) => Some(parse_shard(&file.label(spec::Setting::Shard), s)?),
        _ => None,
    };
    let drew_seed = file.seed.is_none();
    let fresh = std::time::SystemTime::now()
        .duration_since(std::time::UNIX_EPOCH)
        .map(|d| crate::seed::mix64(d.as_nanos() as u64))
        .unwrap_or(0)
        % 1_000_000_000;
    let spec = file.resolve(fresh, &base)?;
    Ok((spec, shard, drew_seed))
}

/// The settings typed on the command line, as a spec-file layer that
/// overrides the file; each value that can be checked alone is checked.
fn flag_settings(args: &PopulateArgs) -> crate::Result<SpecFile> {
    let mut file = SpecFile::default();
    let shapes = [&args.box_size, &args.sphere, &args.cylinder]
        .iter()
        .filter(|s| s.is_some())
        .count();
    if shapes > 1 {
        return Err(Error::Usage(
            "give exactly one shape: --box X,Y,Z, --sphere R or --cylinder R,H, not several".into(),
        ));
    }
    let text = |v: String| NumberOrText::Text(v);
    if let Some(b) = &args.box_size {
        let l = spec::parse_length_list(
            "--box",
            b,
            3,
            "three full edge lengths X,Y,Z in light years (e.g. 100,100,50 or 30pc,30pc,10pc)",
        )?;
        file.shape = Some(ShapeFile {
            kind: "box".into(),
            size_ly: Some(l.into_iter().map(NumberOrText::Number).collect()),
            ..Default::default()
        });
    }
    if let Some(r) = &args.sphere {
        file.shape = Some(ShapeFile {
            kind: "sphere".into(),
            radius_ly: Some(NumberOrText::Number(spec::parse_length_ly("--sphere", r)?)),
            ..Default::default()
        });
    }
    if let Some(c) = &args.cylinder {
        let l = spec::parse_length_list(
            "--cylinder",
            c,
            2,
            "a radius and a full height R,H in light years (e.g. 50,20)",
        )?;
        file.shape = Some(ShapeFile {
            kind: "cylinder".into(),
            radius_ly: Some(NumberOrText::Number(l[0])),
            height_ly: Some(NumberOrText::Number(l[1])),
            ..Default::default()
        });
    }
    if let Some(c) = &args.centre {
        let v = spec::parse_centre("--centre", c)?;
        file.centre_ly = Some(v.iter().map(|&x| NumberOrText::Number(x)).collect());
    }
    if let Some(d) = &args.density {
        spec::parse_density("--density", d)?;
        file.density = Some(text(d.clone()));
    }
    if args.disk {
        file.density_model = Some("disk".into());
    }
    if let Some(t) = &args.thick_share {
        let v: f64 = t
            .trim()
            .parse()
            .map_err(|_| Error::invalid("--thick-share", t, "it must be a number from 0 to 1"))?;
        if !(v.is_finite() && (0.0..=1.0).contains(&v)) {
            return Err(Error::invalid(
                "--thick-share",
                t,
                "it must be a number from 0 to 1",
            ));
        }
        file.thick_share = Some(v);
    }
    if let Some(i) = &args.imf {
        file.imf = Some(i.clone());
    }
    if let Some(a) = &args.ages {
        let parts: Vec<Option<f64>> = a.split(',').map(|p| p.trim().parse().ok()).collect();
        match parts.as_slice() {
            [Some(x), Some(y)] => file.ages_gyr = Some(vec![*x, *y]),
            _ => {
                return Err(Error::invalid(
                    "--ages",
                    a,
                    "it must be MIN,MAX in gigayears with 0 <= MIN < MAX <= 13.8",
                ));
            }
        }
    }
    if args.keep_remnants {
        file.keep_remnants = Some(true);
    }
    if let Some(s) = &args.seed {
        let v: u64 = s.trim().parse().map_err(|_| {
            Error::invalid(
                "--seed",
                s,
                "it must be a whole number from 0 to 18446744073709551615",
            )
        })?;
        file.seed = Some(v);
    }
    if let Some(p) = &args.physics {
        file.physics = Some(p.clone());
    }
    if args.home {
        file.home = Some(true);
    }
    if let Some(t) = &args.title {
        file.title = Some(t.clone());
    }
    if let Some(p) = &args.pin {
        file.pin = Some(p.display().to_string());
    }
    if let Some(c) = &args.pin_clear {
        let v = c.trim();
        let ly = if v == "0" {
            0.0
        } else {
            spec::parse_length_ly("--pin-clear", v)?
        };
        file.pin_clear_ly = Some(NumberOrText::Number(ly));
    }
    Ok(file)
}

/// Runs `starloom populate --real`: the real neighbourhood in memory, then
/// written in one go.
fn run_real(args: &PopulateArgs, spec: &spec::SectorSpec, side: &Path) -> crate::Result<()> {
    if args.shard.is_some() {
        return Err(Error::Usage(
            "--real cannot be combined with --shard: the real neighbourhood is written in one file"
                .into(),
        ));
    }
    if args.pin.is_some() || !spec.pins.is_empty() {
        return Err(Error::Usage(
            "--real cannot be combined with --pin: the real stars take the place of pins".into(),
        ));
    }
    let cat = crate::neighbourhood::real_neighbourhood_sector(spec)?;
    crate::catalogue::write_catalogue(&cat, &args.out, args.force)?;
    let mut real_spec = spec.clone();
    real_spec.home = false;
    let text = format!(
        "# written by `starloom populate --real`: add --real to the command below to regenerate the same catalogue.\n{}",
        spec::to_toml(&real_spec, None, side)
    );
    crate::atomic_file::write_bytes(side, args.force, text.as_bytes())?;
    let real = cat
        .origin
        .iter()
        .zip(&cat.kind)
        .filter(|(o, k)| **o == crate::catalogue::Origin::Hipparcos && k.is_star())
        .count();
    let stars = cat.kind.iter().filter(|k| k.is_star()).count();
    println!(
        "wrote {} ({real} real, {} generated; {} counting brown dwarfs, {}) to {}",
        crate::report::counted(stars as u64, "star", "stars"),
        stars - real,
        crate::report::counted(cat.len() as u64, "object", "objects"),
        crate::report::counted(cat.system_ranges().len() as u64, "system", "systems"),
        args.out.display()
    );
    Ok(())
}

/// Runs `starloom populate`.
pub fn run(args: PopulateArgs) -> anyhow::Result<ExitCode> {
    let (spec, shard, drew_seed) = build_spec(&args)?;
    let side = spec::sidecar_path(&args.out);
    crate::catalogue::Format::from_path(&args.out, "--out")?;
    crate::atomic_file::check_target(&args.out, args.force)?;
    crate::atomic_file::check_target(&side, args.force)?;
    if args.real {
        run_real(&args, &spec, &side)?;
        println!("spec written to {}", side.display());
        print_seed(spec.seed, drew_seed);
        return Ok(ExitCode::SUCCESS);
    }
    let bar = super::progress::bar(1, "populate");
    let report =
        crate::sampler::write_sector(&spec, &args.out, args.force, shard, &|done, total| {
            bar.set_length(total.max(1));
            bar.set_position(done);
        })?;
    bar.finish_and_clear();
    let shard_pair = shard.map(|s| (s.index, s.count));
    crate::atomic_file::write_bytes(
        &side,
        args.force,
        spec::to_toml(&spec, shard_pair, &side).as_bytes(),
    )?;
    println!(
        "wrote {} ({} counting brown dwarfs, {}) to {}",
        crate::report::counted(report.stars, "star", "stars"),
        crate::report::counted(report.objects, "object", "objects"),
        crate::report::counted(report.systems, "system", "systems"),
        args.out.display()
    );
    println!("spec written to {}", side.display());
    print_seed(spec.seed, drew_seed);
    Ok(ExitCode::SUCCESS)
}

fn print_seed(seed: u64, drew_seed: bool) {
    if drew_seed {
        println!("seed {seed} (drawn fresh; pass --seed {seed} to repeat)");
    } else {
        println!("seed {seed}");
    }
}
