//! The optimiser: the engine's optimiser run from the page, with progress,
//! Cancel, the ranked list and the loss-against-volume Pareto plot.
//!
//! The search is the engine's own ([`Optimiser::over_library`]): every
//! library core × material designed for the specification on the form, the
//! passing ones ranked by volume and by loss. Nothing here decides anything
//! about a candidate; this module only schedules the work and draws.
//!
//! # Keeping the page responsive
//!
//! The optimiser evaluates one candidate per call, so the panel runs it in
//! small chunks: at most [`CHUNK`] candidates, and fewer when a chunk's
//! share of time ([`BUDGET_MS`]) is used up, then it hands the thread back
//! to the browser (input, painting) and queues the next chunk as a new task
//! ([`crate::tasks::next_task`]), so it also uses the time between frames.
//! No Web Worker is needed for a search of a
//! few hundred designs, and the optimiser never leaves the main thread.
//!
//! Each run carries a number (`generation`); Cancel, or a new Run, bumps it
//! and any chunk of the old run that is still queued sees the change and
//! stops. Cancel keeps what was found so far, marked partial.
//!
//! The design is taken from the form when Run is pressed (untracked); a
//! later edit does not restart the search but marks the list as being for
//! an earlier specification. "Use" puts a candidate's core and material on
//! the form, so the page recomputes that design.

use crate::form::Form;
use crate::plot;
use crate::ui::PlotCanvas;
use leptos::prelude::*;
use magwright_engine::design::optimise::{Optimiser, Ranked, Ranking};
use magwright_engine::design::{CoreChoice, Design, MaterialChoice};
use magwright_engine::notation;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};
use web_sys::HtmlCanvasElement;

/// Most candidates evaluated in one chunk.
pub const CHUNK: usize = 8;
/// Time a chunk may spend on the search before yielding, ms.
pub const BUDGET_MS: f64 = 10.0;
/// Rows of the ranked list shown before "Show all".
pub const SHORT_LIST: usize = 15;

const CSS: &str = r#"
.suggest .run-row { display:flex; flex-wrap:wrap; gap:.5rem; align-items:center; margin-bottom:.4rem; }
.suggest progress { width:min(22rem, 100%); height:1rem; }
.suggest .counts { font-variant-numeric: tabular-nums; }
.suggest .note { border-left:4px solid var(--warn); background:#fff8ef; padding:.3rem .7rem; margin:.4rem 0; }
.suggest .note.bad { border-left-color:var(--bad); background:#fff6f5; }
.suggest .body { display:flex; flex-wrap:wrap; gap:1rem; align-items:flex-start; }
.suggest .list { flex:1 1 560px; min-width:0; overflow-x:auto; }
.suggest .side { flex:0 1 540px; min-width:0; }
.suggest fieldset.order { border:0; padding:0; margin:0 0 .3rem; display:flex; gap:.9rem; align-items:center; }
.suggest fieldset.order legend { float:left; margin-right:.5rem; color:var(--muted); }
.suggest table.ranked { border-collapse:collapse; width:100%; }
.suggest table.ranked th, .suggest table.ranked td { padding:.18rem .45rem; white-space:nowrap; }
.suggest table.ranked thead th { text-align:left; font-weight:600; border-bottom:1px solid var(--line); }
.suggest table.ranked td.num, .suggest table.ranked th.num { text-align:right; font-variant-numeric: tabular-nums; }
.suggest table.ranked tbody tr + tr { border-top:1px solid #eef0f3; }
.suggest table.ranked tr.current { background:#eaf5ec; }
.suggest table.ranked td.front { color:#b35900; text-align:center; }
.suggest .failures { margin:.2rem 0 .6rem; padding-left:0; list-style:none; }
.suggest .failures li { padding-left:2.8em; text-indent:-2.8em; }
.suggest .failures .n { display:inline-block; min-width:2.2em; text-align:right; margin-right:.4em; font-variant-numeric: tabular-nums; font-weight:600; }
.suggest .sr { position:absolute; width:1px; height:1px; overflow:hidden; clip:rect(0 0 0 0); white-space:nowrap; }
.suggest button:disabled { opacity:.45; cursor:default; background:#fff; border-color:#8f9aa8; }
.suggest h3 { font-size:.92rem; margin:.5rem 0 .2rem; }
"#;

/// Where a run stands.
#[derive(Debug, Clone, PartialEq)]
pub enum Phase {
    /// Never run.
    Idle,
    Running,
    /// Every candidate evaluated.
    Finished,
    /// Stopped by Cancel: the ranking covers the candidates evaluated so far.
    Cancelled,
    /// The design could not be searched (the message says why).
    Failed(String),
}

/// Which list is shown.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Order {
    Volume,
    Loss,
}

/// Live counts while a run goes.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct Progress {
    pub done: usize,
    pub total: usize,
    pub passed: usize,
}

/// The design with its core and material blanked, so that two designs
/// compare equal when only what the optimiser replaces differs.
fn spec_only(d: &Design) -> Design {
    let mut d = d.clone();
    d.core = CoreChoice::Library { designation: String::new() };
    d.material = MaterialChoice::Library { name: String::new() };
    d
}

/// A run's state: all `Copy` handles, so frame callbacks can carry it.
#[derive(Clone, Copy)]
struct Run {
    optimiser: StoredValue<Option<Optimiser>, LocalStorage>,
    generation: StoredValue<u64>,
    phase: RwSignal<Phase>,
    progress: RwSignal<Progress>,
    ranking: RwSignal<Option<Ranking>>,
    /// The design searched (core and material blanked), for the stale mark.
    searched: RwSignal<Option<Design>>,
}

impl Run {
    fn new() -> Self {
        Run {
            optimiser: StoredValue::new_local(None),
            generation: StoredValue::new(0),
            phase: RwSignal::new(Phase::Idle),
            progress: RwSignal::new(Progress::default()),
            ranking: RwSignal::new(None),
            searched: RwSignal::new(None),
        }
    }

    /// Starts a search of `design`; any run in progress is dropped.
    fn start(self, design: Result<Design, String>) {
        let generation = self.generation.get_value() + 1;
        self.generation.set_value(generation);
        let design = match design {
            Ok(d) => d,
            Err(m) => {
                self.optimiser.set_value(None);
                self.phase.set(Phase::Failed(m));
                return;
            }
        };
        match Optimiser::over_library(&design) {
            Ok(o) => {
                self.progress.set(Progress { done: 0, total: o.total(), passed: 0 });
                self.optimiser.set_value(Some(o));
                self.ranking.set(None);
                self.searched.set(Some(spec_only(&design)));
                self.phase.set(Phase::Running);
                crate::tasks::next_task(move || self.chunk(generation));
            }
            Err(e) => {
                self.optimiser.set_value(None);
                let m = match e.field() {
                    Some(f) => format!("{} ({}): {}", crate::form::label_of(f), f, e.message()),
                    None => e.message().to_string(),
                };
                self.phase.set(Phase::Failed(m));
            }
        }
    }

    /// One chunk of the search, then the next one queued (unless finished
    /// or superseded).
    fn chunk(self, generation: u64) {
        if self.generation.get_value() != generation {
            return;
        }
        let t0 = js_sys::Date::now();
        let mut result = None;
        self.optimiser.update_value(|o| {
            let Some(o) = o else { return };
            let mut finished = o.done() >= o.total();
            let mut n = 0;
            while !finished && n < CHUNK {
                finished = o.step(1);
                n += 1;
                if js_sys::Date::now() - t0 > BUDGET_MS {
                    break;
                }
            }
            let r = o.ranking();
            result = Some((Progress { done: o.done(), total: o.total(), passed: r.passed }, finished, r));
        });
        let Some((progress, finished, ranking)) = result else { return };
        self.progress.set(progress);
        if finished {
            self.optimiser.set_value(None);
            self.ranking.set(Some(ranking));
            self.phase.set(Phase::Finished);
        } else {
            crate::tasks::next_task(move || self.chunk(generation));
        }
    }

    /// Stops the run, keeping the ranking of what was evaluated.
    fn cancel(self) {
        if self.phase.get_untracked() != Phase::Running {
            return;
        }
        self.generation.set_value(self.generation.get_value() + 1);
        let ranking = self.optimiser.with_value(|o| o.as_ref().map(|o| o.ranking()));
        self.optimiser.set_value(None);
        if let Some(r) = ranking {
            self.progress.update(|p| {
                p.done = r.evaluated;
                p.passed = r.passed;
            });
            self.ranking.set(Some(r));
        }
        self.phase.set(Phase::Cancelled);
    }
}

/// A volume in cm³ with three significant figures (display edge only).
fn cm3(v: f64) -> String {
    let c = v * 1e6;
    if !c.is_finite() {
        return "—".into();
    }
    let decimals = if c >= 100.0 {
        0
    } else if c >= 10.0 {
        1
    } else if c >= 1.0 {
        2
    } else {
        3
    };
    format!("{c:.decimals$}")
}

/// The optimiser panel.
#[component]
pub fn OptimiserPanel(form: Form) -> impl IntoView {
    let run = Run::new();
    let order = RwSignal::new(Order::Loss);
    let show_all = RwSignal::new(false);
    let message = RwSignal::new(None::<String>);

    // The list is for an earlier specification once the form differs from
    // the design searched in anything but core and material. The form is
    // read only once there is a search to compare with (not on every
    // keystroke before the first run).
    let current_spec = Memo::new(move |_| {
        if run.searched.with(|s| s.is_none()) {
            return None;
        }
        form.parse().ok().map(|d| spec_only(&d))
    });
    let stale = move || match (run.searched.get(), current_spec.get()) {
        (Some(a), Some(b)) => a != b,
        (Some(_), None) => true,
        _ => false,
    };

    let start = move |_| {
        message.set(None);
        show_all.set(false);
        let design = untrack(|| form.parse()).map_err(|errs| {
            let fields: Vec<String> = errs.iter().map(|(k, _)| crate::form::label_of(k)).collect();
            format!("Fix the marked entries first ({}): the optimiser needs a readable specification.", fields.join(", "))
        });
        run.start(design);
    };
    let cancel = move |_| run.cancel();
    let running = move || run.phase.get() == Phase::Running;

    let in_use = move |c: &Ranked| {
        form.core.with(|k| matches!(k, CoreChoice::Library { designation } if *designation == c.core))
            && form.material.with(|m| matches!(m, MaterialChoice::Library { name } if *name == c.material))
    };
    let use_candidate = move |core: String, material: String| {
        form.core.set(CoreChoice::Library { designation: core.clone() });
        form.material.set(MaterialChoice::Library { name: material.clone() });
        message.set(Some(format!("Loaded {core} in {material} into the form; the results show that design.")));
    };

    let status_line = move || {
        let p = run.progress.get();
        let what = match run.phase.get() {
            Phase::Idle => return "Not run yet.".to_string(),
            Phase::Running => "Running",
            Phase::Finished => "Done",
            Phase::Cancelled => "Stopped",
            Phase::Failed(_) => return String::new(),
        };
        format!("{what}: {} of {} candidates evaluated, {} pass.", p.done, p.total, p.passed)
    };

    let rows = move || {
        let list: Vec<Ranked> = run.ranking.with(|r| match r {
            None => Vec::new(),
            Some(r) => match order.get() {
                Order::Volume => r.by_volume.clone(),
                Order::Loss => r.by_loss.clone(),
            },
        });
        let n = list.len();
        let shown = if show_all.get() { n } else { n.min(SHORT_LIST) };
        list.into_iter()
            .take(shown)
            .enumerate()
            .map(|(i, c)| {
                let (core, material) = (c.core.clone(), c.material.clone());
                let label = format!("Use {} in {}", c.core, c.material);
                let cc = c.clone();
                view! {
                    <tr class:current=move || in_use(&cc) data-testid="ranked-row">
                        <td class="num">{i + 1}</td>
                        <td data-testid="ranked-core">{c.core.clone()}</td>
                        <td data-testid="ranked-material">{c.material.clone()}</td>
                        <td class="num" data-testid="ranked-volume" data-si=format!("{:e}", c.volume)>{cm3(c.volume)}</td>
                        <td class="num" data-testid="ranked-loss" data-si=format!("{:e}", c.total_loss)>
                            {notation::format(c.total_loss, "W", 3)}
                        </td>
                        <td class="num" data-testid="ranked-temperature" data-si=format!("{:e}", c.temperature)>
                            {format!("{:.0} °C", c.temperature)}
                        </td>
                        <td class="num" data-testid="ranked-np" data-si=c.primary_turns.to_string()>{c.primary_turns}</td>
                        <td class="front" data-testid="ranked-pareto" data-pareto=c.pareto.to_string()>
                            {if c.pareto { "◆" } else { "" }}
                            <span class="sr">{if c.pareto { " on the Pareto front" } else { "" }}</span>
                        </td>
                        <td>
                            <button type="button" class="small" data-testid="use" aria-label=label
                                on:click=move |_| use_candidate(core.clone(), material.clone())>"Use"</button>
                        </td>
                    </tr>
                }
            })
            .collect_view()
    };
    let count_passed = move || run.ranking.with(|r| r.as_ref().map_or(0, |r| r.passed));
    let has_list = move || count_passed() > 0;
    let has_ranking = move || run.ranking.with(|r| r.is_some());

    // What the empty list means depends on how far the search got: before
    // the first run nothing has been tried.
    let missing_note = move || match run.phase.get() {
        Phase::Idle => "Not run yet.",
        Phase::Running => "None passes yet; the optimiser is running.",
        Phase::Cancelled => "No candidate evaluated so far passes every check.",
        Phase::Finished | Phase::Failed(_) => "No candidate passes every check.",
    };

    let failures = move || {
        run.ranking.with(|r| {
            r.as_ref().map(|r| {
                r.failures
                    .iter()
                    .map(|f| {
                        view! {
                            <li data-testid="failure" data-count=f.count.to_string()>
                                <span class="n">{f.count}</span>
                                <span class="reason">{f.reason.clone()}</span>
                            </li>
                        }
                    })
                    .collect_view()
            })
        })
    };

    let draw = move |c: &HtmlCanvasElement| {
        let current = (form.core.get(), form.material.get());
        run.ranking.with(|r| match r {
            Some(r) => pareto_chart(c, r, &current),
            None => Ok(()),
        })
    };

    view! {
        <style>{CSS}</style>
        <div class="run-row">
            <button type="button" data-testid="suggest-run" on:click=start disabled=running>
                {move || if has_ranking() { "Run again" } else { "Run" }}
            </button>
            <button type="button" data-testid="suggest-cancel" on:click=cancel disabled=move || !running()>"Cancel"</button>
            <progress
                data-testid="suggest-progress"
                aria-label="Candidates evaluated"
                max=move || run.progress.get().total.max(1).to_string()
                value=move || run.progress.get().done.to_string()
            ></progress>
            <span class="counts" data-testid="suggest-status" role="status" aria-live="polite">{status_line}</span>
            <span class="hidden" data-testid="suggest-evaluated" data-si=move || run.progress.get().done.to_string()></span>
            <span class="hidden" data-testid="suggest-total" data-si=move || run.progress.get().total.to_string()></span>
            <span class="hidden" data-testid="suggest-passed" data-si=move || run.progress.get().passed.to_string()></span>
        </div>
        {move || match run.phase.get() {
            Phase::Failed(m) => Some(view! { <p class="note bad" data-testid="suggest-error" role="alert">{m}</p> }.into_any()),
            Phase::Cancelled => Some(
                view! {
                    <p class="note" data-testid="suggest-partial">
                        <strong>"Partial: "</strong>
                        {move || {
                            let p = run.progress.get();
                            format!("stopped after {} of {} candidates; the ranking covers those only.", p.done, p.total)
                        }}
                    </p>
                }
                .into_any(),
            ),
            _ => None,
        }}
        <p class="note" data-testid="suggest-stale" class:hidden=move || !stale() || !has_ranking()>
            "The specification has changed since this run: run again to rank for the current one."
        </p>
        <p class="status" data-testid="suggest-message" role="status" aria-live="polite">
            {move || message.get().unwrap_or_default()}
        </p>
        <div class="body" class:hidden=move || !has_ranking()>
            <div class="list">
                <fieldset class="order">
                    <legend>"Rank by"</legend>
                    <label>
                        <input type="radio" name="suggest-order" data-testid="order-loss"
                            prop:checked=move || order.get() == Order::Loss on:change=move |_| order.set(Order::Loss) />
                        " lowest loss"
                    </label>
                    <label>
                        <input type="radio" name="suggest-order" data-testid="order-volume"
                            prop:checked=move || order.get() == Order::Volume on:change=move |_| order.set(Order::Volume) />
                        " smallest volume"
                    </label>
                </fieldset>
                <p class="missing-note" data-testid="suggest-missing" class:hidden=has_list>{missing_note}</p>
                <table class="ranked" data-testid="ranked" class:hidden=move || !has_list()>
                    <caption class="sr">"Passing candidates"</caption>
                    <thead>
                        <tr>
                            <th scope="col" class="num">"#"</th>
                            <th scope="col">"Core"</th>
                            <th scope="col">"Material"</th>
                            <th scope="col" class="num" title="Physical volume of the core set (not the effective volume Ve)">"Core set volume (cm³)"</th>
                            <th scope="col" class="num">"Total loss"</th>
                            <th scope="col" class="num" title="Mean surface temperature (McLyman); the winding's hottest point runs higher">"Core temp."</th>
                            <th scope="col" class="num">"Np"</th>
                            <th scope="col" title="On the loss–volume Pareto front: no other candidate is both smaller and lower in loss">"Pareto"</th>
                            <th scope="col"><span class="sr">"Action"</span></th>
                        </tr>
                    </thead>
                    <tbody>{rows}</tbody>
                </table>
                <button type="button" class="small" data-testid="show-all"
                    class:hidden=move || count_passed() <= SHORT_LIST
                    on:click=move |_| show_all.update(|s| *s = !*s)>
                    {move || if show_all.get() { "Show the first 15".to_string() } else { format!("Show all {}", count_passed()) }}
                </button>
            </div>
            <div class="side">
                <figure class="plot" class:hidden=move || !has_list()>
                    <PlotCanvas testid="pareto-plot" label="Total loss against core volume for every passing candidate, with the Pareto front" width=520 height=320 draw=draw />
                    <figcaption>
                        "Each dot is a passing core and material; the line joins the Pareto front (no candidate is both smaller and lower in loss). The ringed dot is the design on the form."
                    </figcaption>
                </figure>
                <h3>"Why the others fail"</h3>
                <p class="help">"How many candidates, then the checks they fail, or why no design exists on them."</p>
                <ul class="failures" data-testid="failures">{failures}</ul>
            </div>
        </div>
    }
}

const FONT: &str = "sans-serif";
const INK: RGBColor = RGBColor(29, 37, 48);

fn rgb(c: plot::Rgb) -> RGBColor {
    RGBColor(c.0, c.1, c.2)
}

fn err<E: std::fmt::Display>(e: E) -> String {
    e.to_string()
}

/// A tick label for cm³ on a log axis.
fn tick_cm3(v: f64) -> String {
    let s = if v >= 10.0 {
        format!("{v:.0}")
    } else if v >= 1.0 {
        format!("{v:.1}")
    } else {
        format!("{v:.2}")
    };
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// Log-axis grid: (every 1…9 × 10ᵏ in range, the labelled 1-2-5 subset).
fn log_ticks(lo: f64, hi: f64) -> (Vec<f64>, Vec<f64>) {
    let (mut grid, mut labels) = (Vec::new(), Vec::new());
    if !(lo > 0.0 && hi > lo && lo.is_finite() && hi.is_finite()) {
        return (grid, labels);
    }
    let steps: &[f64] = if hi / lo > 3000.0 { &[1.0] } else { &[1.0, 2.0, 5.0] };
    let d0 = lo.log10().floor() as i32;
    let d1 = (hi.log10().ceil() as i32).min(d0 + 12);
    for d in d0..=d1 {
        let p = 10f64.powi(d);
        for m in 1..10 {
            let v = f64::from(m) * p;
            if v >= lo && v <= hi {
                grid.push(v);
                if steps.contains(&f64::from(m)) {
                    labels.push(v);
                }
            }
        }
    }
    (grid, labels)
}

/// What a legend entry shows before its text.
#[derive(Clone, Copy)]
enum Key {
    Dot(RGBColor),
    Line(RGBColor),
    Ring(RGBColor),
}

/// Loss against volume: every passing candidate a dot, the Pareto front a
/// line, the candidate on the form ringed. Volume on a log axis (library
/// cores span two decades), loss linear from zero. The legend is a row
/// above the plot, so it never hides a point.
fn pareto_chart(canvas: &HtmlCanvasElement, r: &Ranking, current: &(CoreChoice, MaterialChoice)) -> Result<(), String> {
    let root = crate::hidpi::area(canvas)?;
    let point = |c: &Ranked| (c.volume * 1e6, c.total_loss);
    let ok = |p: &(f64, f64)| p.0.is_finite() && p.0 > 0.0 && p.1.is_finite();
    let pts: Vec<(f64, f64)> = r.by_volume.iter().map(point).filter(ok).collect();
    let x_ext =
        pts.iter().fold(None, |a: Option<(f64, f64)>, p| Some(a.map_or((p.0, p.0), |(l, h)| (l.min(p.0), h.max(p.0)))));
    let Some((x_lo, x_hi)) = x_ext else {
        let font = (FONT, 14).into_font().color(&INK).pos(Pos::new(HPos::Center, VPos::Center));
        let (w, h) = root.dim_in_pixel();
        root.draw(&Text::new("no candidate passes", (w as i32 / 2, h as i32 / 2), font)).map_err(err)?;
        return root.present().map_err(err);
    };
    let (x_lo, x_hi) = (x_lo / 1.25, x_hi * 1.25);
    let y_hi = pts.iter().map(|p| p.1).fold(0.0_f64, f64::max);
    let y_hi = if y_hi > 0.0 { y_hi * 1.08 } else { 1.0 };

    let blue = rgb(plot::BLUE);
    let orange = rgb(plot::ORANGE);
    let green = rgb(plot::GREEN);
    let axis_ink = RGBColor(150, 158, 170);
    let grid_bold = RGBColor(236, 238, 242);
    let grid_light = RGBColor(246, 247, 249);

    let mut chart = ChartBuilder::on(&root)
        .margin(10)
        .margin_top(30)
        .margin_right(18)
        .x_label_area_size(40)
        .y_label_area_size(52)
        .build_cartesian_2d((x_lo..x_hi).log_scale(), 0.0..y_hi)
        .map_err(err)?;
    let blank = |_: &f64| String::new();
    let y_fmt = |v: &f64| {
        let s = format!("{v:.2}");
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    };
    chart
        .configure_mesh()
        .x_desc("Core volume (cm³)")
        .y_desc("Total loss (W)")
        .disable_x_mesh()
        .x_label_formatter(&blank)
        .set_tick_mark_size(LabelAreaPosition::Bottom, 0)
        .bold_line_style(grid_bold)
        .light_line_style(grid_light)
        .axis_style(axis_ink)
        .label_style((FONT, 13).into_font().color(&INK))
        .axis_desc_style((FONT, 13).into_font().color(&INK))
        .y_label_formatter(&y_fmt)
        .y_labels(6)
        .draw()
        .map_err(err)?;
    // Our own log ticks: a light line at every 1…9 of a decade, labels at 1-2-5.
    let (grid, labels) = log_ticks(x_lo, x_hi);
    for v in &grid {
        let style = if labels.contains(v) { grid_bold } else { grid_light };
        chart.draw_series(LineSeries::new([(*v, 0.0), (*v, y_hi)], style)).map_err(err)?;
    }
    let tick_font = (FONT, 13).into_font().color(&INK).pos(Pos::new(HPos::Center, VPos::Top));
    for v in labels {
        let (px, py) = chart.backend_coord(&(v, 0.0));
        root.draw(&PathElement::new(vec![(px, py), (px, py + 5)], axis_ink)).map_err(err)?;
        root.draw(&Text::new(tick_cm3(v), (px, py + 7), tick_font.clone())).map_err(err)?;
    }

    chart.draw_series(pts.iter().map(|&p| Circle::new(p, 3, blue.mix(0.55).filled()))).map_err(err)?;
    let front: Vec<(f64, f64)> = r.pareto.iter().map(point).filter(ok).collect();
    chart.draw_series(LineSeries::new(front.iter().copied(), orange.stroke_width(2))).map_err(err)?;
    chart.draw_series(front.iter().map(|&p| Circle::new(p, 4, orange.filled()))).map_err(err)?;
    let here: Vec<(f64, f64)> = r
        .by_volume
        .iter()
        .filter(|c| {
            matches!(&current.0, CoreChoice::Library { designation } if *designation == c.core)
                && matches!(&current.1, MaterialChoice::Library { name } if *name == c.material)
        })
        .map(point)
        .filter(ok)
        .collect();
    chart.draw_series(here.iter().map(|&p| Circle::new(p, 8, green.stroke_width(2)))).map_err(err)?;

    let mut keys = vec![
        (format!("passing candidate ({})", pts.len()), Key::Dot(blue)),
        (format!("Pareto front ({})", front.len()), Key::Line(orange)),
    ];
    if !here.is_empty() {
        keys.push(("the design on the form".to_string(), Key::Ring(green)));
    }
    let font = (FONT, 12).into_font().color(&INK).pos(Pos::new(HPos::Left, VPos::Center));
    let (mut x, y) = (62, 14);
    for (label, key) in keys {
        match key {
            Key::Dot(c) => root.draw(&Circle::new((x + 9, y), 3, c.mix(0.55).filled())).map_err(err)?,
            Key::Line(c) => {
                root.draw(&PathElement::new(vec![(x, y), (x + 18, y)], c.stroke_width(2))).map_err(err)?;
                root.draw(&Circle::new((x + 9, y), 4, c.filled())).map_err(err)?;
            }
            Key::Ring(c) => root.draw(&Circle::new((x + 9, y), 7, c.stroke_width(2))).map_err(err)?,
        }
        let w = root.estimate_text_size(&label, &font).map_or(120, |s| s.0 as i32);
        root.draw(&Text::new(label, (x + 24, y), font.clone())).map_err(err)?;
        x += 24 + w + 18;
    }
    root.present().map_err(err)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn log_ticks_label_one_two_five_in_range() {
        let (grid, labels) = log_ticks(1.5, 113.0);
        assert_eq!(labels, vec![2.0, 5.0, 10.0, 20.0, 50.0, 100.0]);
        assert_eq!(grid.first(), Some(&2.0));
        assert_eq!(grid.last(), Some(&100.0));
        assert_eq!(grid.len(), 8 + 9 + 1);
        assert_eq!(log_ticks(0.0, 10.0), (vec![], vec![]));
        assert_eq!(log_ticks(5.0, 5.0), (vec![], vec![]));
    }

    #[test]
    fn volume_and_tick_text() {
        assert_eq!(cm3(87.39e-6), "87.4");
        assert_eq!(cm3(9.04e-6), "9.04");
        assert_eq!(cm3(123.4e-6), "123");
        assert_eq!(cm3(f64::NAN), "—");
        assert_eq!(tick_cm3(20.0), "20");
        assert_eq!(tick_cm3(2.0), "2");
        assert_eq!(tick_cm3(0.5), "0.5");
    }

    #[test]
    fn spec_only_ignores_core_and_material_only() {
        let a = Design::demo_forward();
        let mut b = a.clone();
        b.core = CoreChoice::Library { designation: "ETD 59".into() };
        b.material = MaterialChoice::Library { name: "other".into() };
        assert_eq!(spec_only(&a), spec_only(&b));
        b.spec.ambient += 1.0;
        assert_ne!(spec_only(&a), spec_only(&b));
    }
}
