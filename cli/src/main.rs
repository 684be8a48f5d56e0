//! `magwright`: a thin command-line front end over the engine.
//!
//! ```text
//! magwright evaluate FILE|-                  evaluate a design file (JSON report)
//! magwright sweep FILE|- [FROM TO POINTS]    loss against switching frequency (default 20k 1M 200)
//! magwright flux-sweep FILE|- [POINTS]       loss against peak flux density at the design's frequency
//! magwright rank FILE|-                      rank every library core × material for the design's spec
//! magwright demo [forward|flyback|push-pull|inductor] print a demo design file
//! magwright stackup FILE|-                   the design's winding stack-up in its JSON schema
//! magwright cores                            the core library (effective parameters, provenance)
//! magwright materials                        the material library (provenance)
//! ```
//! Output is JSON on stdout (CSV for `sweep --csv`). Bad input: a message on
//! stderr and exit code 2.

use magwright_engine::design::{self, optimise, sweep, Design};
use magwright_engine::{core::library as cores, json, material::library as materials, notation};
use std::io::Read;
use std::process::ExitCode;

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    match run(&args) {
        Ok(out) => {
            println!("{out}");
            ExitCode::SUCCESS
        }
        Err(msg) => {
            eprintln!("magwright: {msg}");
            ExitCode::from(2)
        }
    }
}

const USAGE: &str = "usage: magwright evaluate|sweep|flux-sweep|rank|stackup FILE|-  |  demo [forward|flyback|push-pull|inductor]  |  cores  |  materials";

fn run(args: &[String]) -> Result<String, String> {
    let cmd = args.first().map(String::as_str).ok_or(USAGE)?;
    let file = || -> Result<Design, String> {
        let path = args.get(1).ok_or(format!("{cmd} needs a design file (or - for stdin)"))?;
        let text = read_input(path)?;
        let d = Design::from_json(&text).map_err(|e| format!("{path}: {e}"))?;
        d.check_envelope().map_err(|e| format!("{path}: {e}"))?;
        Ok(d)
    };
    let num = |i: usize, default: f64, unit: &str| -> Result<f64, String> {
        match args.get(i) {
            None => Ok(default),
            Some(s) => notation::parse(s, unit).map_err(|e| format!("argument {i}: {e}")),
        }
    };
    match cmd {
        "evaluate" => Ok(json::to_string_pretty(&design::evaluate(&file()?).map_err(|e| e.to_string())?)),
        "sweep" => {
            let d = file()?;
            let csv = args.iter().any(|a| a == "--csv");
            let rest: Vec<&String> = args.iter().skip(2).filter(|a| *a != "--csv").collect();
            let get = |i: usize, def: f64| rest.get(i).map_or(Ok(def), |s| notation::parse(s, "Hz").map_err(|e| e.to_string()));
            let s = sweep::frequency(&d, get(0, 20e3)?, get(1, 1e6)?, get(2, 200.0)? as usize).map_err(|e| e.to_string())?;
            Ok(if csv { sweep::to_csv(&s, "frequency_Hz") } else { json::to_string_pretty(&s) })
        }
        "flux-sweep" => {
            let d = file()?;
            let n = num(2, 60.0, "")? as usize;
            Ok(json::to_string_pretty(&sweep::flux(&d, n).map_err(|e| e.to_string())?))
        }
        "rank" => {
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
        "-h" | "--help" | "help" => Ok(USAGE.to_string()),
        other => Err(format!("unknown command \"{other}\"; {USAGE}")),
    }
}

fn read_input(path: &str) -> Result<String, String> {
    if path == "-" {
        let mut s = String::new();
        std::io::stdin().read_to_string(&mut s).map_err(|e| format!("stdin: {e}"))?;
        Ok(s)
    } else {
        std::fs::read_to_string(path).map_err(|e| format!("{path}: {e}"))
    }
}
