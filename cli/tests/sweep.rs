//! `magwright sweep` and its curves: the redesigned sweep (the plain JSON
//! of before, with its x axis named and the material's data band),
//! `--as-wound`, `--envelope`, `--every-core` (JSON and CSV), bad options,
//! and the help text naming every flag.

use std::path::PathBuf;
use std::process::{Command, Output};

fn run(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_magwright")).args(args).output().expect("run magwright")
}

fn forward() -> String {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../examples/forward-48v-bus.json").to_string_lossy().into_owned()
}

fn json(out: &Output) -> serde_json::Value {
    assert!(out.status.success(), "stderr: {}", String::from_utf8_lossy(&out.stderr));
    serde_json::from_slice(&out.stdout).expect("JSON")
}

fn text(out: &Output) -> String {
    assert!(out.status.success(), "stderr: {}", String::from_utf8_lossy(&out.stderr));
    String::from_utf8(out.stdout.clone()).unwrap()
}

#[test]
fn plain_sweep_is_the_redesigned_curve() {
    let v = json(&run(&["sweep", &forward(), "50k", "2M", "12"]));
    assert_eq!(v["curve"], "redesigned");
    assert_eq!(v["x_axis"]["quantity"], "switching frequency");
    assert_eq!(v["x_axis"]["unit"], "Hz");
    let pts = v["points"].as_array().unwrap();
    assert_eq!(pts.len(), 12);
    let band_max = v["band"]["max"].as_f64().unwrap();
    assert!(v["band"]["fitted_max"].as_f64().unwrap() < band_max);
    // Past the band: never feasible, in_data false; the minimum inside.
    for p in pts {
        assert!(p["in_data"].is_boolean());
        if p["x"].as_f64().unwrap() > band_max {
            assert_eq!(p["in_data"], false, "{p}");
            assert_eq!(p["feasible"], false, "{p}");
        }
    }
    let i = v["minimum"].as_u64().unwrap() as usize;
    assert!(pts[i]["x"].as_f64().unwrap() <= band_max);
}

#[test]
fn both_curves_and_the_envelope() {
    let v = json(&run(&["sweep", &forward(), "50k", "500k", "5", "--as-wound", "--envelope"]));
    assert_eq!(v["redesigned"]["curve"], "redesigned");
    assert_eq!(v["as_wound"]["curve"], "as_wound");
    let env = &v["envelope"];
    assert_eq!(env["x_axis"]["unit"], "Hz");
    let pts = env["points"].as_array().unwrap();
    assert_eq!(pts.len(), 5);
    assert!(pts.iter().any(|p| p["material"].is_string()), "the envelope names materials");
    assert!(env["changes"].is_array());
    // As wound, the primary turns are the same at every point.
    let turns: Vec<u64> = v["as_wound"]["points"]
        .as_array()
        .unwrap()
        .iter()
        .filter_map(|p| p["values"]["primary_turns"].as_u64())
        .collect();
    assert!(turns.len() >= 2 && turns.iter().all(|&t| t == turns[0]), "{turns:?}");
    // Only the curves asked for.
    let w = json(&run(&["sweep", &forward(), "50k", "500k", "3", "--as-wound"]));
    assert!(w.get("envelope").is_none() && w["as_wound"]["points"].is_array());
    // --every-core: the envelope over the family's cores (implies --envelope).
    let all = json(&run(&["sweep", &forward(), "100k", "300k", "2", "--every-core"]));
    assert!(all["envelope"]["cores"].as_array().unwrap().len() > 1, "{}", all["envelope"]["cores"]);
}

#[test]
fn csv_of_each_curve() {
    let t = text(&run(&["sweep", &forward(), "50k", "500k", "4", "--envelope", "--csv"]));
    assert!(t.starts_with("frequency_Hz,feasible,in_data,material,core,"), "{t}");
    assert_eq!(t.trim_end().lines().count(), 5);
    let t = text(&run(&["sweep", &forward(), "50k", "500k", "4", "--as-wound", "--csv"]));
    assert!(t.starts_with("frequency_Hz,feasible,in_data,primary_turns,"), "{t}");
    assert_eq!(t.trim_end().lines().count(), 5);
    // The in_data column: false past the data (2 MHz on a 300 kHz fit).
    let t = text(&run(&["sweep", &forward(), "100k", "2M", "3", "--csv"]));
    let last: Vec<&str> = t.trim_end().lines().last().unwrap().split(',').collect();
    assert_eq!((last[1], last[2]), ("false", "false"), "{t}");
}

#[test]
fn bad_options_are_refused() {
    for args in [vec!["--bogus"], vec!["--as-wound", "--envelope", "--csv"], vec!["50k", "500k", "2.5", "--as-wound"], vec!["50k", "--envelope"]] {
        let mut a = vec!["sweep".to_string(), forward()];
        a.extend(args.iter().map(|s| s.to_string()));
        let out = run(&a.iter().map(String::as_str).collect::<Vec<_>>());
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        assert!(String::from_utf8_lossy(&out.stderr).starts_with("magwright: "));
    }
    let help = String::from_utf8(run(&["--help"]).stdout).unwrap();
    for flag in ["--as-wound", "--envelope", "--every-core", "--csv", "in_data"] {
        assert!(help.contains(flag), "help lacks {flag}");
    }
}
