//! `magwright-bundle WASM TEMPLATE OUT`
//!
//! Turns the web crate's raw wasm into one self-contained HTML page:
//! 1. runs the bindings generator (the `wasm-bindgen-cli-support` library,
//!    pinned to the exact version of the `wasm-bindgen` crate, so one lock
//!    file holds both) with the `web` target;
//! 2. inlines the JS glue into a `<script type="module">` and the wasm as
//!    base64 of its raw DEFLATE stream (inflated in the page by the
//!    browser's `DecompressionStream`), because a page opened from file://
//!    may neither import a module file nor fetch a .wasm file;
//! 3. writes the template with `<!-- MAGWRIGHT_APP -->` replaced.

use std::path::{Path, PathBuf};
use std::process::ExitCode;

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    if args.len() != 3 {
        eprintln!("usage: magwright-bundle WASM TEMPLATE OUT");
        return ExitCode::from(2);
    }
    match run(Path::new(&args[0]), Path::new(&args[1]), Path::new(&args[2])) {
        Ok(()) => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("magwright-bundle: {e}");
            ExitCode::FAILURE
        }
    }
}

fn run(wasm: &Path, template: &Path, out: &Path) -> Result<(), String> {
    let work: PathBuf = out.parent().unwrap_or(Path::new(".")).join(".bindgen");
    std::fs::create_dir_all(&work).map_err(|e| format!("{}: {e}", work.display()))?;
    // MAGWRIGHT_KEEP_NAMES=1 keeps the function names, for a browser CPU
    // profile that names Rust functions (a much bigger file; never shipped).
    let keep_names = std::env::var_os("MAGWRIGHT_KEEP_NAMES").is_some();
    let mut b = wasm_bindgen_cli_support::Bindgen::new();
    b.input_path(wasm)
        .web(true)
        .map_err(|e| e.to_string())?
        .typescript(false)
        .remove_name_section(!keep_names)
        .remove_producers_section(true)
        .out_name("app");
    b.generate(&work).map_err(|e| format!("wasm-bindgen: {e:#}"))?;

    let js = std::fs::read_to_string(work.join("app.js")).map_err(|e| format!("glue: {e}"))?;
    let bin = std::fs::read(work.join("app_bg.wasm")).map_err(|e| format!("wasm: {e}"))?;
    let page = std::fs::read_to_string(template).map_err(|e| format!("{}: {e}", template.display()))?;
    const MARK: &str = "<!-- MAGWRIGHT_APP -->";
    if !page.contains(MARK) {
        return Err(format!("{} has no {MARK} marker", template.display()));
    }
    // The wasm travels as base64 of its raw DEFLATE stream; the page inflates
    // it with the browser's DecompressionStream (no network involved).
    let packed = miniz_oxide::deflate::compress_to_vec(&bin, 9);
    let script = format!(
        "<script type=\"module\">\n{}\nconst b64 = \"{}\";\nconst raw = atob(b64);\nconst packed = new Uint8Array(raw.length);\nfor (let i = 0; i < raw.length; i++) packed[i] = raw.charCodeAt(i);\nconst inflated = new Blob([packed]).stream().pipeThrough(new DecompressionStream('deflate-raw'));\nconst bytes = new Uint8Array(await new Response(inflated).arrayBuffer());\nawait __wbg_init({{ module_or_path: bytes }});\n</script>",
        module_as_script(&js),
        base64(&packed)
    );
    let html = page.replace(MARK, &script);
    if let Some(dir) = out.parent() {
        std::fs::create_dir_all(dir).map_err(|e| format!("{}: {e}", dir.display()))?;
    }
    std::fs::write(out, &html).map_err(|e| format!("{}: {e}", out.display()))?;
    println!(
        "wrote {} ({} KB; wasm {} KB, {} KB deflated)",
        out.display(),
        html.len() / 1024,
        bin.len() / 1024,
        packed.len() / 1024
    );
    Ok(())
}

/// The glue is an ES module; inline, nothing imports it, so its `export`
/// keywords go, and `</script` inside strings must not end our tag.
fn module_as_script(js: &str) -> String {
    let mut out = String::with_capacity(js.len());
    for line in js.lines() {
        let t = line.trim_start();
        if t.starts_with("export {") || t.starts_with("export default") {
            continue;
        }
        let line = line
            .replacen("export function ", "function ", 1)
            .replacen("export async function ", "async function ", 1)
            .replacen("export class ", "class ", 1)
            .replacen("export const ", "const ", 1);
        out.push_str(&line);
        out.push('\n');
    }
    out.replace("</script", "<\\/script")
}

/// Standard base64 (RFC 4648) with padding.
fn base64(data: &[u8]) -> String {
    const T: &[u8; 64] = b"ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";
    let mut s = String::with_capacity(data.len().div_ceil(3) * 4);
    for c in data.chunks(3) {
        let n = (c[0] as u32) << 16 | (*c.get(1).unwrap_or(&0) as u32) << 8 | *c.get(2).unwrap_or(&0) as u32;
        s.push(T[(n >> 18) as usize & 63] as char);
        s.push(T[(n >> 12) as usize & 63] as char);
        s.push(if c.len() > 1 { T[(n >> 6) as usize & 63] as char } else { '=' });
        s.push(if c.len() > 2 { T[n as usize & 63] as char } else { '=' });
    }
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn base64_rfc4648_vectors() {
        // RFC 4648 §10 test vectors.
        for (i, o) in [("", ""), ("f", "Zg=="), ("fo", "Zm8="), ("foo", "Zm9v"), ("foobar", "Zm9vYmFy")] {
            assert_eq!(base64(i.as_bytes()), o);
        }
    }

    #[test]
    fn deflate_round_trips() {
        let data: Vec<u8> = (0..50_000u32).map(|i| (i * 7 % 251) as u8).collect();
        let packed = miniz_oxide::deflate::compress_to_vec(&data, 9);
        assert!(packed.len() < data.len());
        assert_eq!(miniz_oxide::inflate::decompress_to_vec(&packed).unwrap(), data);
    }

    #[test]
    fn exports_are_stripped_and_script_end_escaped() {
        let js = "export function a() {}\nexport { initSync };\nexport default __wbg_init;\nconst s = '</script>';";
        let out = module_as_script(js);
        assert!(out.contains("function a()"));
        assert!(!out.contains("export"));
        assert!(out.contains("<\\/script>"));
    }
}
