//! The `routes` command: the jump network of a catalogue (links, regions,
//! lanes) and, with `--from`/`--to`, the best route between two systems.

use crate::error::Error;
use crate::physics::StarKind;
use crate::routes::{
    JumpNetwork, RouteBy, Systems, connecting_jump_ly, parse_kinds, resolve_system, shortest_route,
    systems_of_kinds, unreachable_sentence, write_links_csv,
};
use serde_json::{Map, Value, json};
use std::path::PathBuf;
use std::process::ExitCode;

/// Arguments of `starloom routes`.
#[derive(Debug, clap::Args)]
pub struct RoutesArgs {
    /// The catalogue (.csv or .jsonl).
    pub catalogue: PathBuf,
    /// Jump range: two systems at most this far apart are linked (light
    /// years, or with a unit: `8ly`, `2.5pc`).
    #[arg(long, allow_hyphen_values = true)]
    pub jump: String,
    /// Write the links as CSV (`from_system,to_system,distance_ly`).
    #[arg(long)]
    pub out: Option<PathBuf>,
    /// Write the lanes (the minimum spanning forest) as CSV, same columns.
    #[arg(long)]
    pub lanes_out: Option<PathBuf>,
    /// Print JSON instead of text.
    #[arg(long)]
    pub json: bool,
    /// Start of a route: a system id, a star id or a star name.
    #[arg(long, allow_hyphen_values = true)]
    pub from: Option<String>,
    /// End of a route: a system id, a star id or a star name.
    #[arg(long, allow_hyphen_values = true)]
    pub to: Option<String>,
    /// What the route minimises: `distance` (default) or `jumps` (ties
    /// broken by distance).
    #[arg(long)]
    pub by: Option<String>,
    /// Keep the route off systems whose primary is of these kinds
    /// (comma-separated, e.g. `white-dwarf,neutron-star`); the two ends
    /// are always allowed.
    #[arg(long)]
    pub avoid: Option<String>,
    /// Travel speed, light years per day: adds the time of each leg.
    #[arg(long, allow_hyphen_values = true)]
    pub speed: Option<String>,
    /// Time of one jump, days, whatever its length (instead of `--speed`).
    #[arg(long, allow_hyphen_values = true)]
    pub jump_time: Option<String>,
    /// Replace existing output files.
    #[arg(long)]
    pub force: bool,
}

/// How travel time is counted.
#[derive(Debug, Clone, Copy)]
enum Pace {
    LyPerDay(f64),
    DaysPerJump(f64),
}

impl Pace {
    fn days(self, leg_ly: f64) -> f64 {
        match self {
            Pace::LyPerDay(v) => leg_ly / v,
            Pace::DaysPerJump(d) => d,
        }
    }
}

fn positive(option: &str, text: &str, what: &str) -> crate::Result<f64> {
    match text.trim().parse::<f64>() {
        Ok(v) if v.is_finite() && v > 0.0 => Ok(v),
        _ => Err(Error::invalid(
            option,
            text,
            format!("it must be a positive, finite number of {what}"),
        )),
    }
}

/// The route part of the settings.
struct RouteRequest {
    from: String,
    to: String,
    by: RouteBy,
    avoid: Vec<StarKind>,
    pace: Option<Pace>,
}

fn route_request(args: &RoutesArgs) -> crate::Result<Option<RouteRequest>> {
    let by = args
        .by
        .as_deref()
        .map(|t| {
            RouteBy::parse(t)
                .ok_or_else(|| Error::invalid("--by", t, "it must be distance or jumps"))
        })
        .transpose()?;
    let avoid = args
        .avoid
        .as_deref()
        .map(|t| parse_kinds("--avoid", t))
        .transpose()?;
    let pace = match (&args.speed, &args.jump_time) {
        (Some(_), Some(_)) => {
            return Err(Error::Usage(
                "--speed and --jump-time cannot be used together; give one of them".into(),
            ));
        }
        (Some(s), None) => Some(Pace::LyPerDay(positive(
            "--speed",
            s,
            "light years per day",
        )?)),
        (None, Some(t)) => Some(Pace::DaysPerJump(positive("--jump-time", t, "days")?)),
        (None, None) => None,
    };
    match (&args.from, &args.to) {
        (Some(from), Some(to)) => Ok(Some(RouteRequest {
            from: from.clone(),
            to: to.clone(),
            by: by.unwrap_or(RouteBy::Distance),
            avoid: avoid.unwrap_or_default(),
            pace,
        })),
        (None, None) => {
            let used = [
                ("--by", by.is_some()),
                ("--avoid", avoid.is_some()),
                ("--speed", args.speed.is_some()),
                ("--jump-time", args.jump_time.is_some()),
            ];
            match used.iter().find(|u| u.1) {
                Some((name, _)) => Err(Error::Usage(format!(
                    "{name} applies to a route; give --from and --to as well"
                ))),
                None => Ok(None),
            }
        }
        _ => Err(Error::Usage(
            "a route needs both --from and --to (a system id or a star name each)".into(),
        )),
    }
}

/// Runs `starloom routes`.
pub fn run(args: RoutesArgs) -> anyhow::Result<ExitCode> {
    let jump_ly = crate::spec::parse_length_ly("--jump", &args.jump)?;
    let request = route_request(&args)?;
    if let (Some(a), Some(b)) = (&args.out, &args.lanes_out)
        && a == b
    {
        return Err(Error::Usage(format!(
            "--out and --lanes-out both name {}; give two different files",
            a.display()
        ))
        .into());
    }
    for out in [&args.out, &args.lanes_out].into_iter().flatten() {
        crate::atomic_file::check_target(out, args.force)?;
    }
    // Names and kinds serve only a route (its ends, --avoid, the stops).
    let columns = if request.is_some() {
        crate::routes::CATALOGUE_COLUMNS
    } else {
        crate::catalogue::reader::Columns::POSITIONS
    };
    let cat = crate::catalogue::reader::read_catalogue_columns(&args.catalogue, columns)?;
    let systems = Systems::from_catalogue(&cat);
    let ends = match &request {
        Some(r) => {
            let node = |text: &str| -> crate::Result<u32> {
                let m = resolve_system(&cat, text)?;
                Ok(systems
                    .index_of_row(&cat, m.primary_row)
                    .expect("a resolved system is in the system list"))
            };
            Some((node(&r.from)?, node(&r.to)?))
        }
        None => None,
    };

    let network = JumpNetwork::build(&systems.positions_ly, jump_ly);
    let forest = network.spanning_forest();
    let summary = network.summary(&forest);
    if let Some(out) = &args.out {
        crate::atomic_file::write_atomic(out, args.force, |w| {
            write_links_csv(w, &systems, &network.links)
        })?;
    }
    if let Some(out) = &args.lanes_out {
        crate::atomic_file::write_atomic(out, args.force, |w| {
            write_links_csv(
                w,
                &systems,
                forest.lanes.iter().map(|&k| &network.links[k as usize]),
            )
        })?;
    }

    let mut doc = match serde_json::to_value(&summary)? {
        Value::Object(m) => m,
        _ => Map::new(),
    };
    if !args.json {
        print_summary(&summary);
        for (out, what) in [(&args.out, "links"), (&args.lanes_out, "lanes")] {
            if let Some(p) = out {
                println!("wrote {what} to {}", p.display());
            }
        }
    }
    let (Some(req), Some((from, to))) = (request, ends) else {
        if args.json {
            println!("{}", serde_json::to_string_pretty(&Value::Object(doc))?);
        }
        return Ok(ExitCode::SUCCESS);
    };

    let avoided = systems_of_kinds(&cat, &systems, &req.avoid);
    let allowed = |n: u32| !avoided[n as usize];
    let adjacency = network.adjacency();
    let name = |n: u32| cat.name[systems.primary_rows[n as usize]].to_string();
    let id = |n: u32| systems.ids[n as usize];
    doc.insert("from".into(), json!(id(from)));
    doc.insert("to".into(), json!(id(to)));
    doc.insert("by".into(), json!(req.by.as_str()));
    doc.insert(
        "avoid".into(),
        json!(req.avoid.iter().map(|k| k.as_str()).collect::<Vec<_>>()),
    );
    let Some(route) = shortest_route(
        &adjacency,
        &systems.positions_ly,
        from,
        to,
        req.by,
        &allowed,
    ) else {
        let needed = connecting_jump_ly(&network, &systems.positions_ly, from, to, &allowed);
        if args.json {
            doc.insert("reachable".into(), json!(false));
            doc.insert("connecting_jump_ly".into(), json!(needed));
            println!("{}", serde_json::to_string_pretty(&Value::Object(doc))?);
        }
        let mut sentence = unreachable_sentence(&name(from), &name(to), jump_ly, needed);
        if !req.avoid.is_empty() {
            sentence.push_str(" while avoiding the kinds asked");
        }
        return Err(anyhow::anyhow!(sentence));
    };

    let legs: Vec<Value> = route
        .systems
        .windows(2)
        .zip(&route.legs_ly)
        .map(|(w, &d)| {
            let mut leg = Map::new();
            leg.insert("from".into(), json!(id(w[0])));
            leg.insert("to".into(), json!(id(w[1])));
            leg.insert("distance_ly".into(), json!(d));
            if let Some(p) = req.pace {
                leg.insert("days".into(), json!(p.days(d)));
            }
            Value::Object(leg)
        })
        .collect();
    let travel_days: Option<f64> = req
        .pace
        .map(|p| route.legs_ly.iter().map(|&d| p.days(d)).sum());
    if args.json {
        doc.insert("reachable".into(), json!(true));
        doc.insert(
            "path".into(),
            json!(route.systems.iter().map(|&n| id(n)).collect::<Vec<_>>()),
        );
        doc.insert(
            "names".into(),
            json!(route.systems.iter().map(|&n| name(n)).collect::<Vec<_>>()),
        );
        doc.insert("jumps".into(), json!(route.jumps()));
        doc.insert("distance_ly".into(), json!(route.distance_ly));
        doc.insert("legs".into(), Value::Array(legs));
        if let Some(t) = travel_days {
            doc.insert("travel_days".into(), json!(t));
        }
        println!("{}", serde_json::to_string_pretty(&Value::Object(doc))?);
        return Ok(ExitCode::SUCCESS);
    }
    println!();
    println!(
        "route from {} to {} by {}: {} jumps, {:.2} ly{}",
        name(from),
        name(to),
        req.by.as_str(),
        route.jumps(),
        route.distance_ly,
        travel_days
            .map(|t| format!(", {t:.1} days"))
            .unwrap_or_default()
    );
    let mut total_ly = 0.0;
    let mut total_days = 0.0;
    for (k, &n) in route.systems.iter().enumerate() {
        let mut line = format!("  {k:>3}  {:<20} system {:<20}", name(n), id(n));
        if k > 0 {
            let d = route.legs_ly[k - 1];
            total_ly += d;
            line.push_str(&format!(" leg {d:>7.2} ly  total {total_ly:>8.2} ly"));
            if let Some(p) = req.pace {
                total_days += p.days(d);
                line.push_str(&format!(
                    "  {:>7.1} days (total {total_days:.1})",
                    p.days(d)
                ));
            }
        } else {
            line.push_str(" start");
        }
        println!("{}", line.trim_end());
    }
    Ok(ExitCode::SUCCESS)
}

fn print_summary(s: &crate::routes::NetworkSummary) {
    use crate::report::counted;
    println!(
        "jump range {} ly: {}, {}",
        s.jump_ly,
        counted(s.systems, "system", "systems"),
        counted(s.links, "link", "links")
    );
    println!(
        "{}, the largest with {}; {}",
        counted(s.regions, "region", "regions"),
        counted(s.largest_region, "system", "systems"),
        counted(s.isolated_systems, "isolated system", "isolated systems")
    );
    println!(
        "{}, {:.2} ly in total",
        counted(s.lanes, "lane", "lanes"),
        s.lanes_ly
    );
}
