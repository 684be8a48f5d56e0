//! File-import fuzzing: a deterministic mutation loop over the corpus in
//! `tests/fuzz/corpus/` (valid design files = the three examples, their
//! stack-ups from `magwright stackup`, truncated and hand-broken files).
//!
//! Each corpus file is mutated a fixed number of times with a small
//! xorshift generator (fixed seed: the same inputs on every run):
//! truncation at a random byte, deletion, duplication and insertion of
//! bytes, swapping a digit, a number replaced by a hostile token (1e999,
//! -0, NaN-like strings, huge integers), a key renamed. Design files go to
//! `Design::load` (the one reader the CLI and the page call) + `evaluate`;
//! stack-ups to `stackup::from_json` and `stackup::import` on a library
//! core. Never a panic; accepted reports finite; errors carry a message,
//! and a field whenever the document is valid JSON (only a syntax error
//! may lack one).
//!
//! Size: [`FUZZ_INPUTS`] mutated inputs per run (at least 100 000; the
//! `MAGWRIGHT_FUZZ_INPUTS` environment variable sets another count). Every
//! refused or merely parsed input is checked; of the accepted design files
//! one in [`EVALUATE_EVERY`] is also evaluated in full (evaluation is the
//! property tests' subject; here the reader is).

use crate::check_error;
use crate::design::check_report;
use magwright_engine::core::library as cores;
use magwright_engine::design::evaluate;
use magwright_engine::design::file::Design;
use magwright_engine::error::Error;
use magwright_engine::winding::stackup;
use std::path::PathBuf;

struct Rng(u64);
impl Rng {
    fn next(&mut self) -> u64 {
        // xorshift64 (Marsaglia 2003).
        self.0 ^= self.0 << 13;
        self.0 ^= self.0 >> 7;
        self.0 ^= self.0 << 17;
        self.0
    }
    fn below(&mut self, n: usize) -> usize {
        (self.next() % n.max(1) as u64) as usize
    }
}

const TOKENS: [&str; 12] = [
    "1e999",
    "-1e999",
    "-0",
    "0",
    "-1",
    "\"NaN\"",
    "null",
    "true",
    "[]",
    "{}",
    "18446744073709551616",
    "5e-324",
];

fn mutate(text: &str, rng: &mut Rng) -> String {
    let b = text.as_bytes();
    let n = b.len();
    let mut out: Vec<u8> = b.to_vec();
    match rng.below(7) {
        0 => out.truncate(rng.below(n)),
        1 => {
            let i = rng.below(n);
            let j = (i + 1 + rng.below(16)).min(n);
            out.drain(i..j);
        }
        2 => {
            let i = rng.below(n);
            let j = (i + 1 + rng.below(32)).min(n);
            let chunk = out[i..j].to_vec();
            let k = rng.below(n);
            out.splice(k..k, chunk);
        }
        3 => {
            let i = rng.below(n);
            out.insert(i, b"{}[],:\"0-e."[rng.below(11)]);
        }
        4 => {
            // A digit changed.
            let digits: Vec<usize> = (0..n).filter(|&i| b[i].is_ascii_digit()).collect();
            if let Some(&i) = digits.get(rng.below(digits.len())) {
                out[i] = b"0123456789"[rng.below(10)];
            }
        }
        5 => {
            // A whole number replaced by a hostile token.
            let starts: Vec<usize> = (1..n)
                .filter(|&i| {
                    b[i].is_ascii_digit() && !b[i - 1].is_ascii_alphanumeric() && b[i - 1] != b'.'
                })
                .collect();
            if let Some(&i) = starts.get(rng.below(starts.len())) {
                let mut j = i;
                while j < n && (b[j].is_ascii_digit() || b".eE+-".contains(&b[j])) {
                    j += 1;
                }
                let start = if b[i - 1] == b'-' { i - 1 } else { i };
                out.splice(start..j, TOKENS[rng.below(TOKENS.len())].bytes());
            }
        }
        _ => {
            // A key renamed (its first letter changed).
            let keys: Vec<usize> = (1..n)
                .filter(|&i| b[i - 1] == b'"' && b[i].is_ascii_lowercase())
                .collect();
            if let Some(&i) = keys.get(rng.below(keys.len())) {
                out[i] = b'z';
            }
        }
    }
    String::from_utf8_lossy(&out).into_owned()
}

fn corpus() -> Vec<(String, String)> {
    let dir = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("fuzz/corpus");
    let mut files: Vec<_> = std::fs::read_dir(&dir)
        .expect("tests/fuzz/corpus")
        .filter_map(|e| e.ok())
        .map(|e| e.path())
        .collect();
    files.sort();
    files
        .into_iter()
        .filter(|p| p.extension().is_some_and(|x| x == "json"))
        .map(|p| {
            (
                p.file_name().unwrap().to_string_lossy().into_owned(),
                std::fs::read_to_string(&p).unwrap(),
            )
        })
        .collect()
}

/// A field is required when the text is valid JSON (then the error is
/// about some value or key, not about syntax): a Format error may name
/// the root as missing-field/unknown-field text, which serde words as
/// "missing field `x`" / "unknown field `x`", naming it in the message.
fn check_import_error(text: &str, e: &Error) -> Result<(), String> {
    check_error(e)?;
    let valid_json = serde_json::from_str::<serde_json::Value>(text).is_ok();
    if valid_json && e.field().is_none() && !e.message().contains('`') && !e.message().contains('"')
    {
        return Err(format!("valid JSON but the error names no field: {e:?}"));
    }
    Ok(())
}

/// Mutated inputs per run, at least this many.
const FUZZ_INPUTS: usize = 100_000;
/// One accepted design file in this many is evaluated in full.
const EVALUATE_EVERY: usize = 25;

fn design_case(text: &str, evaluate_it: bool) -> Result<bool, String> {
    match Design::load(text) {
        Ok(d) if evaluate_it => match evaluate(&d) {
            Ok(r) => check_report(&d, &r).map(|_| true),
            Err(e) => check_error(&e).map(|_| true),
        },
        Ok(_) => Ok(true),
        Err(e) => check_import_error(text, &e).map(|_| false),
    }
}

fn stackup_case(text: &str, core_index: usize) -> Result<bool, String> {
    let st = stackup::from_json(text);
    let core = &cores::all()[core_index % cores::all().len()];
    let imp = stackup::import(text, core);
    match (&st, &imp) {
        (Err(e), _) => check_import_error(text, e).map(|_| false),
        (Ok(s), Ok(s2)) => {
            if s != s2 {
                return Err("import and from_json disagree".into());
            }
            Ok(true)
        }
        // Read, but does not fit this core: still an accepted document.
        (Ok(_), Err(e)) => check_error(e).map(|_| true),
    }
}

#[test]
fn corpus_files_behave() {
    let c = corpus();
    assert!(c.len() >= 10, "corpus has {} files", c.len());
    for (name, text) in &c {
        let is_design = name.starts_with("design-");
        let valid = !name.contains("-bad-") && !name.contains("-truncated");
        let r = if is_design {
            design_case(text, true)
        } else {
            stackup_case(text, 0)
        };
        match r {
            Ok(accepted) => assert_eq!(
                accepted || !valid,
                true,
                "{name}: a valid corpus file was refused"
            ),
            Err(m) => panic!("{name}: {m}"),
        }
        if !valid {
            assert_eq!(r, Ok(false), "{name}: a broken file was accepted");
        }
    }
}

/// The corpus's refusals from issue 14 name the full path of the value
/// (the design file's schema, docs/design-file.md).
#[test]
fn corpus_refusals_name_the_path() {
    let want = [
        ("design-bad-misspelt-ripple.json", "spec.flyback.ripple_ratoi"),
        ("design-bad-outputs-1000.json", "spec.outputs"),
        ("design-bad-turns-extra-key.json", "choices.turns.turns"),
        ("design-bad-comma-current.json", "spec.outputs[0].current"),
        ("design-bad-negative-wraps.json", "choices.insulation.section_wraps"),
        ("design-bad-fractional-wraps.json", "choices.insulation.section_wraps"),
        ("design-bad-wire-awg.json", "choices.wires[1].wire.awg"),
        ("design-bad-input-misspelt.json", "spec.input.mn"),
        ("design-bad-zero-bsat.json", "material.material.bsat_100"),
        ("design-bad-unknown-key.json", ""),
    ];
    let c = corpus();
    for (name, path) in want {
        let (_, text) = c.iter().find(|(n, _)| n == name).unwrap_or_else(|| panic!("{name} not in the corpus"));
        let e = Design::load(text).expect_err(name);
        if !path.is_empty() {
            assert_eq!(e.field(), Some(path), "{name}: {e}");
        }
        assert!(e.field().is_some(), "{name}: {e}");
    }
    let (_, bom) = c.iter().find(|(n, _)| n == "design-bom-flyback.json").unwrap();
    assert!(bom.starts_with('\u{feff}'));
    Design::load(bom).expect("a byte-order mark is skipped");
}

#[test]
fn mutated_corpus_never_panics() {
    let t0 = std::time::Instant::now();
    let mut rng = Rng(0x9e37_79b9_7f4a_7c15);
    let total = std::env::var("MAGWRIGHT_FUZZ_INPUTS").ok().and_then(|v| v.parse().ok()).unwrap_or(FUZZ_INPUTS);
    let files = corpus();
    let per_file = total.div_ceil(files.len());
    let (mut n, mut accepted, mut accepted_designs) = (0, 0, 0);
    for (name, text) in &files {
        let is_design = name.starts_with("design-");
        for k in 0..per_file {
            let mut m = mutate(text, &mut rng);
            if k % 3 == 0 {
                m = mutate(&m, &mut rng);
            }
            let r = if is_design {
                // Parsed first; evaluated for one accepted file in EVALUATE_EVERY.
                let r = design_case(&m, false);
                if r == Ok(true) {
                    accepted_designs += 1;
                    if accepted_designs % EVALUATE_EVERY == 0 {
                        design_case(&m, true)
                    } else {
                        r
                    }
                } else {
                    r
                }
            } else {
                stackup_case(&m, k)
            };
            match r {
                Ok(a) => accepted += a as usize,
                Err(msg) => panic!("{name}, mutation {k}: {msg}\n--- input ---\n{m}"),
            }
            n += 1;
        }
    }
    assert!(n >= total.min(FUZZ_INPUTS), "{n} inputs");
    eprintln!(
        "fuzz: {n} mutated files, {accepted} accepted, {} refused ({} design files evaluated), {:.2} s",
        n - accepted,
        accepted_designs / EVALUATE_EVERY,
        t0.elapsed().as_secs_f64()
    );
}
