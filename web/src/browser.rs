//! Thin, panic-free wrappers over the browser APIs the page uses: storage,
//! the URL fragment, downloads, reading a chosen file, the clipboard and
//! printing. Each returns an error message (or None) instead of throwing,
//! so callers can tell the user what happened.

use wasm_bindgen::{JsCast, JsValue};
use wasm_bindgen_futures::JsFuture;

fn window() -> Option<web_sys::Window> {
    web_sys::window()
}

fn js_msg(e: JsValue) -> String {
    e.as_string()
        .or_else(|| e.dyn_ref::<js_sys::Error>().map(|e| String::from(e.message())))
        .unwrap_or_else(|| "the browser refused".to_string())
}

/// localStorage, when the browser allows it.
pub fn storage() -> Option<web_sys::Storage> {
    window()?.local_storage().ok().flatten()
}

/// The URL fragment including '#', or "".
pub fn hash() -> String {
    window().and_then(|w| w.location().hash().ok()).unwrap_or_default()
}

/// The page's address without its fragment.
pub fn url_without_hash() -> String {
    let href = window().and_then(|w| w.location().href().ok()).unwrap_or_default();
    match href.find('#') {
        Some(i) => href[..i].to_string(),
        None => href,
    }
}

/// Drops the fragment from the address bar without reloading or adding a
/// history entry (so a reload after opening a link shows the latest edits).
pub fn clear_hash() {
    if let Some(h) = window().and_then(|w| w.history().ok()) {
        let _ = h.replace_state_with_url(&JsValue::NULL, "", Some(&url_without_hash()));
    }
}

/// Offers `content` as a file download: a Blob, an object URL and a
/// temporary `<a download>` clicked once. Works from file:// and under a
/// CSP with `connect-src 'none'` (no request is made).
pub fn download(filename: &str, mime: &str, content: &str) -> Result<(), String> {
    let doc = window().and_then(|w| w.document()).ok_or("no document")?;
    let parts = js_sys::Array::of1(&JsValue::from_str(content));
    let opts = web_sys::BlobPropertyBag::new();
    opts.set_type(mime);
    let blob = web_sys::Blob::new_with_str_sequence_and_options(&parts, &opts).map_err(js_msg)?;
    let url = web_sys::Url::create_object_url_with_blob(&blob).map_err(js_msg)?;
    let a: web_sys::HtmlAnchorElement = doc.create_element("a").map_err(js_msg)?.unchecked_into();
    a.set_href(&url);
    a.set_download(filename);
    a.set_attribute("hidden", "").map_err(js_msg)?;
    let body = doc.body().ok_or("no body")?;
    body.append_child(&a).map_err(js_msg)?;
    a.click();
    a.remove();
    // Let the download start before the URL is revoked.
    leptos::prelude::set_timeout(
        move || {
            let _ = web_sys::Url::revoke_object_url(&url);
        },
        std::time::Duration::from_secs(5),
    );
    Ok(())
}

/// The text of a file the user chose, refused above `max_bytes`.
pub async fn read_text(file: web_sys::File, max_bytes: usize) -> Result<String, String> {
    if file.size() > max_bytes as f64 {
        return Err(format!("the file is {:.0} KB; a design file is a few KB", file.size() / 1024.0));
    }
    let text = JsFuture::from(file.text()).await.map_err(js_msg)?;
    text.as_string().ok_or_else(|| "the file is not text".to_string())
}

/// Puts `text` on the clipboard, if the browser offers the clipboard here.
pub async fn copy(text: &str) -> Result<(), String> {
    let nav = window().ok_or("no window")?.navigator();
    let has = js_sys::Reflect::get(&nav, &JsValue::from_str("clipboard")).map(|v| !v.is_undefined()).unwrap_or(false);
    if !has {
        return Err("this browser offers no clipboard to this page".into());
    }
    JsFuture::from(nav.clipboard().write_text(text)).await.map(|_| ()).map_err(js_msg)
}

/// Opens the browser's print dialog.
pub fn print() -> Result<(), String> {
    window().ok_or("no window")?.print().map_err(js_msg)
}
