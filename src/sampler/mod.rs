//! The sampler: where systems are, cell by cell, from the seed alone.
//!
//! Space is cut into fixed 10 ly cubes. A cell's content depends only on
//! (seed, cell coordinates): its generator draws a Poisson number of
//! *systems* with mean density × volume ÷ mean stars per system, then a
//! uniform position for each. Each system is drawn by [`crate::population`]
//! from its own key, and its members share its position, so no system
//! straddles a cell edge. Systems outside the shape are dropped. Hence:
//! the same seed is one universe, any region can be made alone, adjacent
//! regions tile seamlessly, and cells run in parallel (rayon) with output
//! in the fixed cell order whatever the thread count.
//!
//! Entry points: [`generate`] (a catalogue in memory) and [`write_sector`]
//! (streams a `.csv`/`.jsonl` file in batches, never holding the catalogue).

pub mod cells;
pub mod density;

use crate::catalogue::designations::{cell_key, star_id, system_key};
use crate::catalogue::names::{member_suffix, system_name};
use crate::catalogue::{Catalogue, CatalogueMeta, Format, Origin, RowView, TextBuffer};
use crate::error::{Error, Result};
use crate::population::{MAX_MEMBERS, Member, Population, SystemMeans};
use crate::seed::{Stream, rng_for};
use crate::spec::{PinnedStar, SectorSpec};
use cells::{CELL_EDGE_LY, CellGrid, cell_of};
use density::Density;
use rand::RngExt;
use rand_distr::{Distribution, Poisson};
use rayon::prelude::*;
use std::collections::HashMap;
use std::io::Write;
use std::path::Path;
use std::sync::{Mutex, OnceLock};

/// Highest system index a generated system may have; pins start here.
const FIRST_PIN_INDEX: u64 = 8000;
/// System index of the home system.
const HOME_INDEX: u64 = 8191;
/// Expected stars above which [`generate`] (in memory) refuses.
pub const MAX_IN_MEMORY_STARS: f64 = 3.0e7;
/// Expected stars above which one output file is refused (use `--shard`).
pub const MAX_FILE_STARS: f64 = 2.0e9;
/// Age of the home system, Gyr (the Sun: Bonanno et al. 2002, A&A 390, 1115).
const HOME_AGE_GYR: f64 = 4.57;

/// A slice `K/N` of the cells (1-based K).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Shard {
    /// Which slice, 1..=count.
    pub index: u64,
    /// How many slices.
    pub count: u64,
}

struct FixedSystem {
    name: String,
    position_ly: [f64; 3],
    star: PinnedStar,
    index: u64,
    origin: Origin,
}

/// A spec prepared for sampling: grid, density, population, pins.
pub struct SectorPlan {
    spec: SectorSpec,
    grid: CellGrid,
    density: Density,
    population: Population,
    mean_stars_per_system: f64,
    members_per_star: f64,
    fixed: HashMap<[i64; 3], Vec<FixedSystem>>,
    clear_points: Vec<[f64; 3]>,
}

impl std::fmt::Debug for SectorPlan {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_struct("SectorPlan")
            .field("grid", &self.grid)
            .field("mean_stars_per_system", &self.mean_stars_per_system)
            .finish()
    }
}

fn calibration_cache() -> &'static Mutex<HashMap<String, SystemMeans>> {
    static CACHE: OnceLock<Mutex<HashMap<String, SystemMeans>>> = OnceLock::new();
    CACHE.get_or_init(|| Mutex::new(HashMap::new()))
}

impl SectorPlan {
    /// Validates `spec` and prepares it.
    pub fn new(spec: &SectorSpec) -> Result<SectorPlan> {
        spec.validate()?;
        let population = Population::new(&spec.population);
        let key = format!("{:?}", spec.population);
        let cached = calibration_cache()
            .lock()
            .ok()
            .and_then(|c| c.get(&key).copied());
        let means = match cached {
            Some(v) => v,
            None => {
                let v = population.system_means();
                if let Ok(mut c) = calibration_cache().lock() {
                    c.insert(key, v);
                }
                v
            }
        };
        let mut fixed: HashMap<[i64; 3], Vec<FixedSystem>> = HashMap::new();
        let mut clear_points = Vec::new();
        for pin in &spec.pins {
            let d = sub(pin.position_ly, spec.centre_ly);
            if !spec.shape.contains(d) {
                continue;
            }
            let cell = cell_of(pin.position_ly);
            let list = fixed.entry(cell).or_default();
            let index = FIRST_PIN_INDEX + list.len() as u64;
            if index >= HOME_INDEX {
                return Err(Error::Usage(format!(
                    "too many pinned systems in one 10 ly cell around {:?}; at most 191",
                    pin.position_ly
                )));
            }
            list.push(FixedSystem {
                name: pin.name.clone(),
                position_ly: pin.position_ly,
                star: pin.star.clone(),
                index,
                origin: Origin::Imported,
            });
            clear_points.push(pin.position_ly);
        }
        if spec.home {
            let p = spec.centre_ly;
            let cell = cell_of(p);
            let mut name = String::new();
            system_name(spec.seed, system_key(cell_key(cell), HOME_INDEX), &mut name);
            fixed.entry(cell).or_default().push(FixedSystem {
                name,
                position_ly: p,
                star: PinnedStar::Evolved {
                    initial_mass_msun: 1.0,
                    age_gyr: HOME_AGE_GYR,
                },
                index: HOME_INDEX,
                origin: Origin::Generated,
            });
            clear_points.push(p);
        }
        Ok(SectorPlan {
            spec: spec.clone(),
            grid: CellGrid::for_spec(spec),
            density: Density::new(spec),
            population,
            mean_stars_per_system: means.stars,
            members_per_star: means.members / means.stars,
            fixed,
            clear_points,
        })
    }

    /// The grid of cells covering the shape.
    pub fn grid(&self) -> CellGrid {
        self.grid
    }

    /// The expected number of stars (brown dwarfs not counted).
    pub fn expected_stars(&self) -> f64 {
        let s = &self.spec;
        let uniform = matches!(s.density_model, crate::spec::DensityModel::Uniform);
        if uniform {
            return s.density_per_ly3 * s.shape.volume_ly3();
        }
        // Midpoint rule on a 48³ grid over the bounding box.
        let h = s.shape.half_extent_ly();
        let n = 48;
        let mut sum = 0.0;
        for k in 0..n {
            for j in 0..n {
                for i in 0..n {
                    let d = [
                        -h[0] + (i as f64 + 0.5) * 2.0 * h[0] / n as f64,
                        -h[1] + (j as f64 + 0.5) * 2.0 * h[1] / n as f64,
                        -h[2] + (k as f64 + 0.5) * 2.0 * h[2] / n as f64,
                    ];
                    if s.shape.contains(d) {
                        sum += self.density.at(add(d, s.centre_ly));
                    }
                }
            }
        }
        sum * 8.0 * h[0] * h[1] * h[2] / (n * n * n) as f64
    }

    /// The expected number of catalogue rows (brown dwarfs counted), from
    /// [`SectorPlan::expected_stars`] and the population's members per star.
    pub fn expected_rows(&self) -> f64 {
        self.expected_stars() * self.members_per_star
    }

    /// Mean stars per system used to turn star density into system counts.
    pub fn mean_stars_per_system(&self) -> f64 {
        self.mean_stars_per_system
    }

    fn cleared(&self, p: [f64; 3]) -> bool {
        let r2 = self.spec.pin_clear_ly * self.spec.pin_clear_ly;
        self.clear_points.iter().any(|q| {
            let d = sub(p, *q);
            d[0] * d[0] + d[1] * d[1] + d[2] * d[2] < r2
        })
    }

    /// Emits every row of the `linear`-th cell, in order.
    fn cell_rows(&self, linear: u64, scratch: &mut Scratch, emit: &mut dyn FnMut(&RowView<'_>)) {
        let s = &self.spec;
        let cell = self.grid.cell(linear);
        let lo = [
            cell[0] as f64 * CELL_EDGE_LY,
            cell[1] as f64 * CELL_EDGE_LY,
            cell[2] as f64 * CELL_EDGE_LY,
        ];
        let hi = [
            lo[0] + CELL_EDGE_LY,
            lo[1] + CELL_EDGE_LY,
            lo[2] + CELL_EDGE_LY,
        ];
        if !s
            .shape
            .may_intersect(sub(lo, s.centre_ly), sub(hi, s.centre_ly))
        {
            return;
        }
        let key = cell_key(cell);
        let mid = [lo[0] + 5.0, lo[1] + 5.0, lo[2] + 5.0];
        let mean = self.density.at(mid) * CELL_EDGE_LY.powi(3) / self.mean_stars_per_system;
        let near_pin = !self.clear_points.is_empty() && {
            let reach = s.pin_clear_ly + CELL_EDGE_LY;
            self.clear_points.iter().any(|q| {
                let d = sub(mid, *q);
                d[0] * d[0] + d[1] * d[1] + d[2] * d[2] < reach * reach
            })
        };
        let mut rng = rng_for(s.seed, key, Stream::CellContents);
        let count = match Poisson::new(mean) {
            Ok(p) if mean > 0.0 => (p.sample(&mut rng) as u64).min(FIRST_PIN_INDEX),
            _ => 0,
        };
        for index in 0..count {
            let u: [f64; 3] = [rng.random(), rng.random(), rng.random()];
            let p = [
                lo[0] + u[0] * CELL_EDGE_LY,
                lo[1] + u[1] * CELL_EDGE_LY,
                lo[2] + u[2] * CELL_EDGE_LY,
            ];
            if !s.shape.contains(sub(p, s.centre_ly)) || (near_pin && self.cleared(p)) {
                continue;
            }
            let skey = system_key(key, index);
            self.population
                .draw_system(s.seed, skey, &mut scratch.members);
            system_name(s.seed, skey, &mut scratch.name);
            emit_system(
                skey,
                &scratch.name,
                p,
                &scratch.members,
                Origin::Generated,
                &mut scratch.label,
                emit,
            );
        }
        if let Some(list) = self.fixed.get(&cell) {
            for f in list {
                let skey = system_key(key, f.index);
                let profile = match f.star {
                    PinnedStar::Evolved {
                        initial_mass_msun,
                        age_gyr,
                    } => self.population.evolve(initial_mass_msun, age_gyr),
                    PinnedStar::Described(profile) => profile,
                };
                scratch.members.clear();
                scratch.members.push(Member {
                    slot: 0,
                    profile,
                    separation_au: 0.0,
                    period_days: 0.0,
                });
                emit_system(
                    skey,
                    &f.name,
                    f.position_ly,
                    &scratch.members,
                    f.origin,
                    &mut scratch.label,
                    emit,
                );
            }
        }
    }
}

fn emit_system(
    skey: u64,
    name: &str,
    p: [f64; 3],
    members: &[Member],
    origin: Origin,
    label: &mut String,
    emit: &mut dyn FnMut(&RowView<'_>),
) {
    let Some(first) = members.first() else {
        return;
    };
    let system = star_id(skey, first.slot);
    for m in members {
        label.clear();
        label.push_str(name);
        if let Some(c) = member_suffix(m.slot) {
            label.push(' ');
            label.push(c);
        }
        emit(&RowView {
            id: star_id(skey, m.slot),
            system,
            name: label,
            position_ly: p,
            profile: &m.profile,
            separation_au: m.separation_au,
            period_days: m.period_days,
            origin,
        });
    }
}

struct Scratch {
    members: Vec<Member>,
    name: String,
    label: String,
}

impl Scratch {
    fn new() -> Scratch {
        Scratch {
            members: Vec::with_capacity(MAX_MEMBERS),
            name: String::with_capacity(32),
            label: String::with_capacity(32),
        }
    }
}

#[inline]
fn sub(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}

#[inline]
fn add(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [a[0] + b[0], a[1] + b[1], a[2] + b[2]]
}

/// The linear cell indices of a shard (all cells without one).
fn shard_cells(total: u64, shard: Option<Shard>) -> std::ops::Range<u64> {
    match shard {
        Some(s) => {
            ((s.index - 1) as u128 * total as u128 / s.count as u128) as u64
                ..(s.index as u128 * total as u128 / s.count as u128) as u64
        }
        None => 0..total,
    }
}

/// The part of the shape's volume that falls in the cells of `shard`,
/// cubic light years: the whole shape's volume without a shard. Cells
/// whose eight corners lie inside (the shapes are convex) count whole;
/// cells on the shape's surface are measured by the midpoint rule on an
/// 8³ grid, so the shards' volumes add up to the shape's within a
/// fraction of a surface cell each.
pub fn shard_volume_ly3(spec: &SectorSpec, shard: Option<Shard>) -> f64 {
    let shape = &spec.shape;
    if shard.is_none() {
        return shape.volume_ly3();
    }
    let grid = CellGrid::for_spec(spec);
    let rel = |p: [f64; 3]| sub(p, spec.centre_ly);
    let cell_volume = CELL_EDGE_LY.powi(3);
    let sub_n = 8;
    let mut sum = 0.0;
    for linear in shard_cells(grid.len(), shard) {
        let cell = grid.cell(linear);
        let lo = [
            cell[0] as f64 * CELL_EDGE_LY,
            cell[1] as f64 * CELL_EDGE_LY,
            cell[2] as f64 * CELL_EDGE_LY,
        ];
        let hi = [
            lo[0] + CELL_EDGE_LY,
            lo[1] + CELL_EDGE_LY,
            lo[2] + CELL_EDGE_LY,
        ];
        if !shape.may_intersect(rel(lo), rel(hi)) {
            continue;
        }
        let inside = (0..8).all(|c| {
            let corner = [
                if c & 1 == 0 { lo[0] } else { hi[0] },
                if c & 2 == 0 { lo[1] } else { hi[1] },
                if c & 4 == 0 { lo[2] } else { hi[2] },
            ];
            shape.contains(rel(corner))
        });
        if inside {
            sum += cell_volume;
            continue;
        }
        let step = CELL_EDGE_LY / sub_n as f64;
        let mut hits = 0u32;
        for k in 0..sub_n {
            for j in 0..sub_n {
                for i in 0..sub_n {
                    let p = [
                        lo[0] + (i as f64 + 0.5) * step,
                        lo[1] + (j as f64 + 0.5) * step,
                        lo[2] + (k as f64 + 0.5) * step,
                    ];
                    hits += shape.contains(rel(p)) as u32;
                }
            }
        }
        sum += cell_volume * hits as f64 / (sub_n * sub_n * sub_n) as f64;
    }
    sum
}

/// Cell ranges (batches) of a shard, each expected to hold a few thousand systems.
fn batches(plan: &SectorPlan, shard: Option<Shard>) -> Vec<std::ops::Range<u64>> {
    let cells = shard_cells(plan.grid.len(), shard);
    let (a, b) = (cells.start, cells.end);
    let spec = &plan.spec;
    let peak = spec.density_per_ly3.max(plan.density.at(spec.centre_ly));
    let per_cell = (peak * CELL_EDGE_LY.powi(3) / plan.mean_stars_per_system).max(1e-3);
    let step = ((4096.0 / per_cell) as u64).clamp(1, 1 << 20);
    let mut out = Vec::new();
    let mut s = a;
    while s < b {
        let e = (s + step).min(b);
        out.push(s..e);
        s = e;
    }
    out
}

/// Generates the catalogue of `spec` in memory, rows in cell order.
///
/// `progress(done, total)` is called with cells done so far (from worker
/// threads, in any order). Refuses regions expected to hold more than
/// [`MAX_IN_MEMORY_STARS`] stars with [`Error::TooLarge`].
pub fn generate(spec: &SectorSpec, progress: &(dyn Fn(u64, u64) + Sync)) -> Result<Catalogue> {
    let plan = SectorPlan::new(spec)?;
    let expected = plan.expected_stars();
    if expected > MAX_IN_MEMORY_STARS {
        return Err(Error::TooLarge(format!(
            "the region would hold about {expected:.3e} stars, more than the {MAX_IN_MEMORY_STARS:.0e} that fit in memory; write it to a file with populate --out (and --shard K/N)"
        )));
    }
    let list = batches(&plan, None);
    let total = plan.grid.len();
    let done = std::sync::atomic::AtomicU64::new(0);
    let parts: Vec<Catalogue> = list
        .par_iter()
        .map_init(Scratch::new, |scratch, range| {
            let mut cat = Catalogue::default();
            for linear in range.clone() {
                plan.cell_rows(linear, scratch, &mut |row| cat.push_view(row));
            }
            let n = range.end - range.start;
            let d = done.fetch_add(n, std::sync::atomic::Ordering::Relaxed) + n;
            progress(d, total);
            cat
        })
        .collect();
    let mut out = Catalogue::default();
    for mut p in parts {
        out.append(&mut p);
    }
    out.meta = CatalogueMeta {
        title: spec.title.clone(),
        seed: Some(spec.seed),
        centre_ly: Some(spec.centre_ly),
    };
    Ok(out)
}

/// What [`write_sector`] wrote.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq)]
pub struct WriteReport {
    /// Rows written.
    pub objects: u64,
    /// Rows that are stars (not brown dwarfs).
    pub stars: u64,
    /// Systems written.
    pub systems: u64,
}

/// Streams the catalogue of `spec` to `path` (`.csv` or `.jsonl` by
/// extension), atomically, in batches of cells generated in parallel and
/// written in order; memory stays bounded whatever the region's size.
/// With `shard = Some(K/N)` only the K-th of N slices of the cells is
/// written (the header only in slice 1), so the N files concatenated in
/// order equal the single-run file.
pub fn write_sector(
    spec: &SectorSpec,
    path: &Path,
    force: bool,
    shard: Option<Shard>,
    progress: &(dyn Fn(u64, u64) + Sync),
) -> Result<WriteReport> {
    let format = Format::from_path(path, "--out")?;
    let plan = SectorPlan::new(spec)?;
    let slices = shard.map_or(1.0, |s| s.count as f64);
    let expected = plan.expected_stars() / slices;
    let estimate_bytes = plan.expected_rows() / slices * format.typical_row_bytes();
    if expected > MAX_FILE_STARS {
        return Err(Error::TooLarge(format!(
            "the request would write about {expected:.3e} stars (about {:.0} GB) to one file, more than the {MAX_FILE_STARS:.0e} allowed; split it with --shard K/N or ask for a smaller region",
            estimate_bytes / 1e9
        )));
    }
    crate::atomic_file::check_target(path, force)?;
    if let Some(free_bytes) = crate::atomic_file::free_space(path) {
        crate::atomic_file::check_free_space(path, estimate_bytes as u64, free_bytes)?;
    }
    let list = batches(&plan, shard);
    let total: u64 = list.iter().map(|r| r.end - r.start).sum();
    // Batches in flight at once: enough to keep every thread busy while
    // finished ones wait for their turn to be written.
    let window = (rayon::current_num_threads() * 4).max(4);
    let mut report = WriteReport::default();
    crate::atomic_file::write_atomic(path, force, |w| {
        let mut head = Vec::new();
        if shard.is_none_or(|s| s.index == 1) {
            format.push_header(&mut head);
        }
        w.write_all(&head)?;
        w.flush()?;
        // Whole buffers go straight to the file, not through the
        // BufWriter's own buffer (flushed above).
        let file = w.get_mut();
        // Emptied buffers are reused, so pages are touched once, not per batch.
        let pool: Mutex<Vec<TextBuffer>> = Mutex::new(Vec::new());
        let (tx, rx) = std::sync::mpsc::channel::<(usize, TextBuffer, WriteReport)>();
        let mut result = Ok(());
        // A sliding window: the pool generates and formats batches while
        // this thread writes the finished ones in batch order, so neither
        // waits for the slowest batch of a group.
        rayon::in_place_scope(|scope| {
            let (plan, pool, list) = (&plan, &pool, &list);
            let spawn = |i: usize| {
                let tx = tx.clone();
                scope.spawn(move |_| {
                    let mut scratch = Scratch::new();
                    let mut buf = pool
                        .lock()
                        .ok()
                        .and_then(|mut p| p.pop())
                        .unwrap_or_else(|| TextBuffer::with_capacity(1 << 21));
                    let mut r = WriteReport::default();
                    for linear in list[i].clone() {
                        plan.cell_rows(linear, &mut scratch, &mut |row| {
                            r.objects += 1;
                            r.stars += row.profile.kind.is_star() as u64;
                            r.systems += (row.id == row.system) as u64;
                            format.push_row(&mut buf, row);
                        });
                    }
                    let _ = tx.send((i, buf, r));
                });
            };
            let mut spawned = list.len().min(window);
            (0..spawned).for_each(spawn);
            let mut ready = std::collections::BTreeMap::new();
            let mut next = 0;
            let mut done = 0u64;
            while next < list.len() && result.is_ok() {
                let Ok((i, buf, r)) = rx.recv() else { break };
                ready.insert(i, (buf, r));
                while let Some((mut buf, r)) = ready.remove(&next) {
                    if let Err(e) = crate::atomic_file::write_in_pieces(file, buf.as_bytes()) {
                        result = Err(e);
                        break;
                    }
                    report.objects += r.objects;
                    report.stars += r.stars;
                    report.systems += r.systems;
                    buf.clear();
                    if let Ok(mut p) = pool.lock() {
                        p.push(buf);
                    }
                    done += list[next].end - list[next].start;
                    progress(done, total);
                    next += 1;
                    if spawned < list.len() {
                        spawn(spawned);
                        spawned += 1;
                    }
                }
            }
        });
        result
    })?;
    Ok(report)
}
