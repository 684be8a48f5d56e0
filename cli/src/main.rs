//! `magwright`: a thin command-line front end over the engine.
//!
//! ```text
//! magwright forward FILE|-     design a forward transformer from a spec (JSON)
//! magwright demo               print the demo forward spec (JSON)
//! magwright cores              list the core library (JSON)
//! magwright materials          list the material library (JSON)
//! ```
//! Output is JSON on stdout. Bad input: a message on stderr and exit code 2.

use magwright_engine::{core::library as cores, design::forward, material::library as materials};
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

const USAGE: &str = "usage: magwright forward FILE|- | demo | cores | materials";

fn run(args: &[String]) -> Result<String, String> {
    let cmd = args.first().map(String::as_str).ok_or(USAGE)?;
    let json = |v: &dyn erased::Json| v.to_json();
    match cmd {
        "forward" => {
            let path = args.get(1).ok_or("forward needs a spec file (or - for stdin)")?;
            let text = read_input(path)?;
            let spec: forward::ForwardSpec =
                serde_json::from_str(&text).map_err(|e| format!("{path}: not a forward spec: {e}"))?;
            let report = forward::design(&spec).map_err(|e| e.to_string())?;
            Ok(json(&report))
        }
        "demo" => Ok(json(&forward::ForwardSpec::demo())),
        "cores" => Ok(json(&cores::cores())),
        "materials" => Ok(json(&materials::materials())),
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

mod erased {
    /// Pretty JSON of any serialisable value.
    pub trait Json {
        fn to_json(&self) -> String;
    }
    impl<T: serde::Serialize> Json for T {
        fn to_json(&self) -> String {
            serde_json::to_string_pretty(self).unwrap_or_else(|e| format!("{{\"error\":\"{e}\"}}"))
        }
    }
}
