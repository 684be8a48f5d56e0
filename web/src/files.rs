//! The design file on the page's side: a size limit, then the engine's own
//! reader and check (`Design::load`, what the CLI calls), which refuses
//! foreign, newer, malformed and out-of-range files with a message naming
//! the field by its full path. A refused file changes nothing.

use magwright_engine::design::Design;
use magwright_engine::Error;

/// Largest design file accepted, bytes: the engine's limit, as in the CLI.
pub const MAX_BYTES: usize = magwright_engine::json::MAX_LEN;

/// The design file's text.
pub fn to_json(d: &Design) -> String {
    d.to_json()
}

/// Reads a design file.
pub fn from_json(text: &str) -> Result<Design, Error> {
    from_json_noted(text).map(|(d, _)| d)
}

/// Reads a design file, with the engine's notes on converting an older
/// version (empty for a current file); the page shows them.
pub fn from_json_noted(text: &str) -> Result<(Design, Vec<String>), Error> {
    if text.len() > MAX_BYTES {
        return Err(Error::format(None, format!("the file is {} KB; a design file is a few KB", text.len() / 1024)));
    }
    // The engine's one reader and check, as the CLI calls it.
    Design::load_noted(text)
}

/// A status line with the conversion notes after it.
pub fn with_notes(first: &str, notes: &[String]) -> String {
    std::iter::once(first).chain(notes.iter().map(String::as_str)).collect::<Vec<_>>().join(" ")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn round_trip_and_refusals() {
        let d = Design::demo_flyback();
        assert_eq!(from_json(&to_json(&d)).unwrap(), d);
        assert_eq!(from_json("{\"name\": \"shopping list\"}").unwrap_err().field(), Some("schema"));
        assert!(from_json("{ \"schema\": \"magwright-design\",\n \"version\": 1, ").unwrap_err().message().contains("JSON"));
        let e = from_json("{\"schema\": \"magwright-design\", \"version\": 9}").unwrap_err();
        assert!(e.message().contains("newer"), "{e}");
        let mut v: serde_json::Value = serde_json::from_str(&to_json(&d)).unwrap();
        v["spec"].as_object_mut().unwrap().remove("frequency");
        assert_eq!(from_json(&v.to_string()).unwrap_err().field(), Some("spec.frequency"));
    }
}
