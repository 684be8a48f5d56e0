//! `magwright`: a thin command-line front end over the engine.
//!
//! ```text
//! magwright evaluate FILE|-                  evaluate a design file (JSON report)
//! magwright sweep FILE|- [FROM TO POINTS] [--as-wound] [--envelope] [--every-core] [--csv]
//!                                            loss against switching frequency (default 20k 1M 200):
//!                                            redesigned at each point; as wound; best material
//! magwright flux-sweep FILE|- [POINTS]       loss against peak flux density at the design's frequency
//! magwright optimise FILE|-                  the optimiser: every library core × material for the design's spec, ranked
//! magwright demo [forward|flyback|push-pull|inductor] print a demo design file
//! magwright stackup FILE|-                   the design's winding stack-up in its JSON schema
//! magwright cores                            the core library (effective parameters, provenance)
//! magwright materials                        the material library (provenance)
//! ```
//! Output is JSON on stdout (CSV for `sweep --csv`). Bad input: a message on
//! stderr and exit code 2. Files are read up to [`MAX_INPUT`] bytes; a
//! UTF-8 byte-order mark is skipped; an argument a command does not take
//! (an extra file, an unknown `--flag`, a count that is not whole) is
//! refused, never ignored.

mod help;

use magwright_engine::design::{self, optimise, sweep, Design};
use magwright_engine::{core::library as cores, json, material::library as materials, notation};
use std::io::{Read, Write};
use std::process::ExitCode;

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    match run(&args) {
        Ok(out) => {
            // A reader that stops early (`| head`) closes the pipe: that is
            // not an error of ours, and must not panic as `println!` would.
            let mut stdout = std::io::stdout().lock();
            match writeln!(stdout, "{out}").and_then(|()| stdout.flush()) {
                Ok(()) => ExitCode::SUCCESS,
                Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => ExitCode::SUCCESS,
                Err(e) => {
                    eprintln!("magwright: cannot write the output: {e}");
                    ExitCode::from(1)
                }
            }
        }
        Err(msg) => {
            eprintln!("magwright: {msg}");
            ExitCode::from(2)
        }
    }
}

const USAGE: &str = "usage: magwright evaluate|sweep|flux-sweep|optimise|stackup FILE|-  |  demo [forward|flyback|push-pull|inductor]  |  cores  |  materials  |  help";

/// Largest input read, bytes (the engine's limit, 16 MB): more than any
/// design file (a few kB), little enough that `magwright evaluate /dev/zero`
/// stops at once.
const MAX_INPUT: u64 = json::MAX_LEN as u64;

/// What each command takes after its name: (least, most) plain arguments
/// and the flags it knows. Anything else is refused.
fn arity(cmd: &str) -> Option<(usize, usize, &'static [&'static str])> {
    Some(match cmd {
        "evaluate" | "optimise" | "stackup" => (1, 1, &[]),
        "sweep" => (1, 4, SWEEP_FLAGS),
        "flux-sweep" => (1, 2, &[]),
        "demo" => (0, 1, &[]),
        "cores" | "materials" | "-h" | "--help" | "help" => (0, 0, &[]),
        _ => return None,
    })
}

/// Refuses arguments the command does not take.
fn check_args(cmd: &str, rest: &[String]) -> Result<(), String> {
    let Some((lo, hi, flags)) = arity(cmd) else { return Ok(()) };
    for a in rest {
        if a.starts_with("--") && !flags.contains(&a.as_str()) {
            let known = if flags.is_empty() { "none".to_string() } else { flags.join(", ") };
            return Err(format!("{cmd} does not take \"{a}\" (its flags: {known}); {USAGE}"));
        }
    }
    let plain = rest.iter().filter(|a| !flags.contains(&a.as_str())).count();
    if plain < lo || plain > hi || (cmd == "sweep" && plain != 1 && plain != 4) {
        let want = match (cmd, lo, hi) {
            ("sweep", ..) => "a file and, optionally, FROM TO POINTS (all three)".to_string(),
            (_, 0, 0) => "no arguments".to_string(),
            (_, l, h) if l == h => format!("{l} argument{}", if l == 1 { "" } else { "s" }),
            (_, l, h) => format!("{l} to {h} arguments"),
        };
        return Err(format!("{cmd} takes {want} (got {plain}); {USAGE}"));
    }
    Ok(())
}

/// A count argument (points): whole and at least 2.
fn count_arg(text: &str, what: &str) -> Result<usize, String> {
    match notation::parse_count(text) {
        Ok(n) if n >= 2 => Ok(n as usize),
        Ok(n) => Err(format!("{what}: at least 2 points (got {n})")),
        Err(e) => Err(format!("{what}: {e}")),
    }
}

fn run(args: &[String]) -> Result<String, String> {
    let cmd = args.first().map(String::as_str).ok_or(USAGE)?;
    check_args(cmd, &args[1..])?;
    let file = || -> Result<Design, String> {
        let path = args.get(1).ok_or(format!("{cmd} needs a design file (or - for stdin)"))?;
        let text = read_input(path)?;
        let (d, notes) = Design::load_noted(&text).map_err(|e| format!("{path}: {e}"))?;
        for n in notes {
            eprintln!("magwright: note: {path}: {n}");
        }
        Ok(d)
    };
    match cmd {
        "evaluate" => Ok(json::to_string_pretty(&design::evaluate(&file()?).map_err(|e| e.to_string())?)),
        "sweep" => sweep_command(&file()?, &args[2..]),
        "flux-sweep" => {
            let d = file()?;
            let n = args.get(2).map_or(Ok(60), |s| count_arg(s, "POINTS"))?;
            Ok(json::to_string_pretty(&sweep::flux(&d, n).map_err(|e| e.to_string())?))
        }
        "optimise" => {
            let d = file()?;
            let r = optimise::optimise(&d, cores::cores(), materials::materials(), &[]).map_err(|e| e.to_string())?;
            Ok(json::to_string_pretty(&r))
        }
        "stackup" => Ok(design::evaluate(&file()?).map_err(|e| e.to_string())?.stackup_json),
        "demo" => match args.get(1).map(String::as_str).unwrap_or("forward") {
            "forward" => Ok(Design::demo_forward().to_json()),
            "flyback" => Ok(Design::demo_flyback().to_json()),
            "push-pull" => Ok(Design::demo_push_pull().to_json()),
            "inductor" => Ok(Design::demo_inductor().to_json()),
            other => Err(format!("no demo \"{other}\" (forward, flyback, push-pull, inductor)")),
        },
        "cores" => Ok(json::to_string_pretty(&cores::cores())),
        "materials" => Ok(json::to_string_pretty(&materials::materials())),
        "-h" | "--help" | "help" => Ok(help::help()),
        // The optimiser's one name is "optimise" (it was "rank").
        "rank" => Err(format!("the optimiser's command is \"optimise\" (it was \"rank\"); {USAGE}")),
        other => Err(format!("unknown command \"{other}\"; {USAGE}")),
    }
}

/// The sweep's flags (each also in `arity` and in the help text).
const SWEEP_FLAGS: &[&str] = &["--csv", "--as-wound", "--envelope", "--every-core"];

/// `magwright sweep FILE [FROM TO POINTS] [--as-wound] [--envelope]
/// [--every-core] [--csv]`: the redesigned sweep alone (its JSON as
/// before), or with `--as-wound` / `--envelope` an object of the curves
/// asked for; `--csv` writes one curve. The arguments were checked by
/// [`check_args`] (known flags, no or all three of FROM TO POINTS).
fn sweep_command(d: &Design, args: &[String]) -> Result<String, String> {
    let flag = |f: &str| args.iter().any(|a| a == f);
    let (csv, wound, every) = (flag("--csv"), flag("--as-wound"), flag("--every-core"));
    let env = flag("--envelope") || every;
    let rest: Vec<&String> = args.iter().filter(|a| !SWEEP_FLAGS.contains(&a.as_str())).collect();
    let get = |i: usize, def: f64, what: &str| {
        rest.get(i).map_or(Ok(def), |s| notation::parse(s, "Hz").map_err(|e| format!("{what}: {e}")))
    };
    let (lo, hi) = (get(0, 20e3, "FROM")?, get(1, 1e6, "TO")?);
    let n = rest.get(2).map_or(Ok(200), |s| count_arg(s, "POINTS"))?;
    let e = |e: magwright_engine::error::Error| e.to_string();
    if csv {
        return match (wound, env) {
            (true, true) => Err("sweep --csv writes one curve: give --as-wound or --envelope, not both".into()),
            (true, false) => Ok(sweep::to_csv(&sweep::as_wound(d, lo, hi, n).map_err(e)?, "frequency_Hz")),
            (false, true) => Ok(sweep::envelope_csv(&sweep::envelope(d, lo, hi, n, every).map_err(e)?)),
            (false, false) => Ok(sweep::to_csv(&sweep::frequency(d, lo, hi, n).map_err(e)?, "frequency_Hz")),
        };
    }
    let redesigned = sweep::frequency(d, lo, hi, n).map_err(e)?;
    if !wound && !env {
        return Ok(json::to_string_pretty(&redesigned));
    }
    let study = Study {
        redesigned,
        as_wound: if wound { Some(sweep::as_wound(d, lo, hi, n).map_err(e)?) } else { None },
        envelope: if env { Some(sweep::envelope(d, lo, hi, n, every).map_err(e)?) } else { None },
    };
    Ok(json::to_string_pretty(&study))
}

/// The sweep command's JSON when a curve beyond the redesigned one is asked for.
#[derive(serde::Serialize)]
struct Study {
    redesigned: sweep::Sweep,
    #[serde(skip_serializing_if = "Option::is_none")]
    as_wound: Option<sweep::Sweep>,
    #[serde(skip_serializing_if = "Option::is_none")]
    envelope: Option<sweep::Envelope>,
}

/// The text of a file (or stdin for "-"), at most [`MAX_INPUT`] bytes.
fn read_input(path: &str) -> Result<String, String> {
    let name = if path == "-" { "stdin" } else { path };
    let mut bytes = Vec::new();
    let read = if path == "-" {
        std::io::stdin().lock().take(MAX_INPUT + 1).read_to_end(&mut bytes)
    } else {
        std::fs::File::open(path).and_then(|f| f.take(MAX_INPUT + 1).read_to_end(&mut bytes))
    };
    read.map_err(|e| format!("{name}: {e}"))?;
    if bytes.len() as u64 > MAX_INPUT {
        return Err(format!("{name}: more than {} MB; a design file is a few kB", MAX_INPUT >> 20));
    }
    // The byte-order mark is skipped by the engine's reader (as on the page).
    String::from_utf8(bytes).map_err(|e| format!("{name}: not UTF-8 text (byte {})", e.utf8_error().valid_up_to()))
}
