//! The `magwright` binary end to end: every command on the example design
//! files, bad input → exit code 2 with a message on stderr, and `--help`.

use std::io::Write;
use std::path::PathBuf;
use std::process::{Command, Output, Stdio};

fn bin() -> Command {
    Command::new(env!("CARGO_BIN_EXE_magwright"))
}

fn examples() -> Vec<PathBuf> {
    let dir = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../examples");
    let mut v: Vec<PathBuf> = std::fs::read_dir(dir).unwrap().map(|e| e.unwrap().path()).filter(|p| p.extension().is_some_and(|x| x == "json")).collect();
    v.sort();
    assert!(v.len() >= 3);
    v
}

/// The forward example (its frequency, 200 kHz, is what some checks edit).
fn forward_example() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../examples/forward-48v-bus.json")
}

fn run(args: &[&str]) -> Output {
    bin().args(args).output().expect("run magwright")
}

fn ok_json(out: &Output) -> serde_json::Value {
    assert!(out.status.success(), "exit {:?}, stderr: {}", out.status, String::from_utf8_lossy(&out.stderr));
    serde_json::from_slice(&out.stdout).expect("stdout is JSON")
}

fn bad(out: &Output) -> String {
    assert_eq!(out.status.code(), Some(2), "stdout: {}", String::from_utf8_lossy(&out.stdout));
    let err = String::from_utf8_lossy(&out.stderr).into_owned();
    assert!(err.starts_with("magwright: ") && err.trim().len() > "magwright:".len(), "stderr: {err}");
    err
}

#[test]
fn evaluate_each_example() {
    for p in examples() {
        let v = ok_json(&run(&["evaluate", p.to_str().unwrap()]));
        assert!(v["losses"]["total"].as_f64().is_some_and(|x| x > 0.0), "{p:?}");
        assert_eq!(v["pass"], serde_json::Value::Bool(true), "{p:?}");
    }
}

#[test]
fn sweep_flux_sweep_rank_stackup_on_examples() {
    let p = forward_example().clone();
    let f = p.to_str().unwrap();
    let s = ok_json(&run(&["sweep", f, "50k", "400k", "5"]));
    assert_eq!(s["points"].as_array().unwrap().len(), 5);
    let csv = run(&["sweep", f, "50k", "400k", "4", "--csv"]);
    assert!(csv.status.success());
    let text = String::from_utf8(csv.stdout).unwrap();
    assert!(text.starts_with("frequency_Hz,feasible"));
    assert_eq!(text.trim().lines().count(), 5);
    let fl = ok_json(&run(&["flux-sweep", f, "6"]));
    assert!(fl["two_over_beta"].as_f64().is_some());
    let r = ok_json(&run(&["optimise", f]));
    assert!(r["evaluated"].as_u64().unwrap() > 10);
    for p in examples() {
        let st = ok_json(&run(&["stackup", p.to_str().unwrap()]));
        assert_eq!(st["schema"], "magwright.stackup/2");
    }
}

#[test]
fn stdin_demo_cores_materials() {
    for demo in ["forward", "flyback", "push-pull"] {
        let d = run(&["demo", demo]);
        assert!(d.status.success());
        let mut child = bin().args(["evaluate", "-"]).stdin(Stdio::piped()).stdout(Stdio::piped()).stderr(Stdio::piped()).spawn().unwrap();
        child.stdin.take().unwrap().write_all(&d.stdout).unwrap();
        let out = child.wait_with_output().unwrap();
        ok_json(&out);
    }
    assert!(ok_json(&run(&["cores"])).as_array().unwrap().len() >= 40);
    assert!(!ok_json(&run(&["materials"])).as_array().unwrap().is_empty());
}

#[test]
fn help() {
    for h in ["--help", "-h", "help"] {
        let out = run(&[h]);
        assert!(out.status.success());
        assert!(String::from_utf8_lossy(&out.stdout).contains("usage: magwright"));
    }
}

#[test]
fn bad_input_exits_2_with_a_message() {
    let dir = std::env::temp_dir().join(format!("magwright-cli-test-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let write = |name: &str, text: &str| {
        let p = dir.join(name);
        std::fs::write(&p, text).unwrap();
        p.to_str().unwrap().to_string()
    };
    bad(&run(&[]));
    bad(&run(&["frobnicate"]));
    bad(&run(&["evaluate"]));
    bad(&run(&["evaluate", "/nonexistent/design.json"]));
    bad(&run(&["demo", "buck"]));
    let e = bad(&run(&["evaluate", &write("empty.json", "")]));
    assert!(e.contains("empty"), "{e}");
    bad(&run(&["evaluate", &write("notjson.json", "{ nope")]));
    let example = std::fs::read_to_string(&forward_example()).unwrap();
    let e = bad(&run(&["evaluate", &write("v4.json", &example.replace("\"version\": 3", "\"version\": 4"))]));
    assert!(e.contains("version"), "{e}");
    // A version-1 file opens, converted, with a note on stderr (design::upgrade).
    let old = run(&["evaluate", &write("v1.json", &example.replace("\"version\": 3", "\"version\": 1"))]);
    let v = ok_json(&old);
    assert!(v["losses"]["total"].as_f64().is_some_and(|x| x > 0.0));
    assert!(String::from_utf8_lossy(&old.stderr).contains("note:"), "stderr: {}", String::from_utf8_lossy(&old.stderr));
    let e = bad(&run(&["evaluate", &write("f.json", &example.replace("200000.0", "-5.0"))]));
    assert!(e.contains("frequency"), "{e}");
    let e = bad(&run(&["sweep", forward_example().to_str().unwrap(), "1M", "10k", "5"]));
    assert!(e.contains("sweep.f_max"), "{e}");
    bad(&run(&["sweep", forward_example().to_str().unwrap(), "abc"]));
    bad(&run(&["flux-sweep", forward_example().to_str().unwrap(), "1"]));
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn help_lists_every_command_and_option_and_the_standing_caution() {
    let out = run(&["--help"]);
    assert!(out.status.success());
    let text = String::from_utf8_lossy(&out.stdout);
    for word in [
        "evaluate", "sweep", "FROM TO POINTS", "--csv", "flux-sweep", "optimise", "stackup", "demo", "cores", "materials",
        "IEC 62368-1", "IEC 61558", "does not certify", "McLyman",
    ] {
        assert!(text.contains(word), "help lacks {word}: {text}");
    }
}

/// A reader that closes the pipe early (`magwright sweep f | head -1`) ends
/// the run quietly: no panic message, a normal exit. The 1000-point sweep's
/// JSON is far larger than a pipe's buffer (64 KiB on Linux), so the write
/// meets the closed pipe.
#[test]
fn a_closed_pipe_is_not_a_panic() {
    use std::io::Read;
    let f = forward_example();
    let mut child = bin()
        .args(["sweep", f.to_str().unwrap(), "20k", "1M", "1000"])
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("spawn");
    let mut first = [0u8; 16];
    child.stdout.take().expect("stdout").read_exact(&mut first).expect("some output");
    // The read end is dropped here, before the rest of the library is written.
    let out = child.wait_with_output().expect("wait");
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(!err.contains("panicked"), "stderr: {err}");
    assert!(out.status.success(), "exit {:?}, stderr: {err}", out.status);
}

/// The optimiser has one name: `optimise`; the old `rank` says so.
#[test]
fn the_optimiser_is_called_optimise() {
    let f = forward_example();
    let err = bad(&run(&["rank", f.to_str().unwrap()]));
    assert!(err.contains("\"optimise\""), "{err}");
}
