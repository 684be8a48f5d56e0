//! CLI input safety (issue 14): bounded reads, the byte-order mark, strict
//! arguments, and the engine's one reader (full field paths, unknown keys).
//! Exit code 2 and a message on stderr for every refusal.

use std::io::Write;
use std::process::{Command, Output, Stdio};

fn bin() -> Command {
    Command::new(env!("CARGO_BIN_EXE_magwright"))
}

fn run(args: &[&str]) -> Output {
    bin().args(args).output().expect("run magwright")
}

fn with_stdin(args: &[&str], input: &[u8]) -> Output {
    let mut child = bin().args(args).stdin(Stdio::piped()).stdout(Stdio::piped()).stderr(Stdio::piped()).spawn().unwrap();
    let mut stdin = child.stdin.take().unwrap();
    let data = input.to_vec();
    // Written from a thread: the CLI may stop reading (and close the pipe) early.
    let writer = std::thread::spawn(move || {
        let _ = stdin.write_all(&data);
    });
    let out = child.wait_with_output().unwrap();
    writer.join().unwrap();
    out
}

fn refused(out: &Output) -> String {
    assert_eq!(out.status.code(), Some(2), "stdout: {}", String::from_utf8_lossy(&out.stdout));
    let err = String::from_utf8_lossy(&out.stderr).into_owned();
    assert!(err.starts_with("magwright: "), "{err}");
    err
}

fn demo() -> String {
    String::from_utf8(run(&["demo", "flyback"]).stdout).unwrap()
}

fn temp(name: &str, text: &str) -> String {
    let dir = std::env::temp_dir().join(format!("magwright-input-test-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let p = dir.join(name);
    std::fs::write(&p, text).unwrap();
    p.to_str().unwrap().to_string()
}

/// `/dev/zero` never ends: the CLI stops at its stated limit and says so.
#[test]
fn endless_input_is_cut_at_the_limit() {
    let e = refused(&run(&["evaluate", "/dev/zero"]));
    assert!(e.contains("more than 16 MB"), "{e}");
    let big = vec![b' '; (16 << 20) + 10];
    let e = refused(&with_stdin(&["evaluate", "-"], &big));
    assert!(e.contains("more than 16 MB"), "{e}");
}

/// A UTF-8 byte-order mark (EF BB BF) before the JSON is skipped.
#[test]
fn byte_order_mark_is_accepted() {
    let mut text = "\u{feff}".as_bytes().to_vec();
    text.extend_from_slice(demo().as_bytes());
    let out = with_stdin(&["evaluate", "-"], &text);
    assert!(out.status.success(), "{}", String::from_utf8_lossy(&out.stderr));
    let e = refused(&with_stdin(&["evaluate", "-"], &[0xff, 0xfe, b'{', b'}']));
    assert!(e.contains("UTF-8"), "{e}");
}

#[test]
fn extra_or_malformed_arguments_are_refused() {
    let f = temp("d.json", &demo());
    let cases: Vec<Vec<&str>> = vec![
        vec!["evaluate", &f, "extra"],
        vec!["evaluate", &f, "--verbose"],
        vec!["optimise", &f, &f],
        vec!["stackup", &f, "x"],
        vec!["cores", "x"],
        vec!["materials", "--all"],
        vec!["demo", "forward", "x"],
        vec!["sweep", &f, "50k"],
        vec!["sweep", &f, "50k", "400k"],
        vec!["sweep", &f, "50k", "400k", "2.5"],
        vec!["sweep", &f, "50k", "400k", "-3"],
        vec!["sweep", &f, "50k", "400k", "5", "6"],
        vec!["sweep", &f, "--cvs"],
        vec!["flux-sweep", &f, "2.5"],
        vec!["flux-sweep", &f, "-4"],
        vec!["flux-sweep", &f, "5", "6"],
        vec!["sweep", &f, "1,5k", "400k", "5"],
    ];
    for args in cases {
        let e = refused(&run(&args));
        assert!(e.len() > 20, "{args:?}: {e}");
    }
    // What they take is still accepted.
    assert!(run(&["sweep", &f, "50k", "400k", "3", "--csv"]).status.success());
    assert!(run(&["flux-sweep", &f, "4"]).status.success());
    assert!(run(&["demo"]).status.success());
}

/// The CLI calls the engine's one reader: misspelt keys inside nested
/// objects are refused with their full path, and so is a 1,000-output spec.
#[test]
fn files_are_read_by_the_engine_reader() {
    let d = demo();
    let misspelt = d.replacen("\"ripple_ratio\"", "\"ripple_ratoi\"", 1);
    assert_ne!(misspelt, d);
    let e = refused(&run(&["evaluate", &temp("m.json", &misspelt)]));
    assert!(e.contains("spec.flyback.ripple_ratoi") && e.contains("did you mean \"ripple_ratio\""), "{e}");
    let mut v: serde_json::Value = serde_json::from_str(&d).unwrap();
    let one = v["spec"]["outputs"][0].clone();
    v["spec"]["outputs"] = serde_json::Value::Array(vec![one; 1000]);
    let e = refused(&run(&["evaluate", &temp("o.json", &v.to_string())]));
    assert!(e.contains("spec.outputs"), "{e}");
    let e = refused(&run(&["evaluate", &temp("n.json", &d.replacen("\"vac_min\"", "\"vac_mn\"", 1))]));
    assert!(e.contains("line "), "{e}");
}
