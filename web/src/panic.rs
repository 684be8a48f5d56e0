//! What happens when the page itself has a bug.
//!
//! [`install`] sets a panic hook that (1) logs the panic and the JavaScript
//! stack to the console, as the small `console_error_panic_hook` crate
//! does (a dozen lines, so written here rather than added as a dependency),
//! and (2) puts a message over the page. The wasm build aborts after a
//! panic, so nothing may run afterwards: the page stays as it was, showing
//! the last design, and localStorage still holds the last good design
//! (saved on every valid edit), which a reload opens.
//!
//! The overlay is plain DOM built here with web-sys, not Leptos, because
//! the reactive system may be in the middle of an update when the panic
//! happens. Its one button reloads the page without its fragment using an
//! inline handler, since no Rust code can run after the abort.

use wasm_bindgen::JsCast;

/// TEST-ONLY: the fragment that makes the page panic on purpose (see
/// [`test_route`]). Nothing in the page links to it.
pub const TEST_PANIC_FRAGMENT: &str = "#magwright-test-panic";

const OVERLAY_ID: &str = "panic-overlay";

/// Installs the hook; call once, first thing.
pub fn install() {
    std::panic::set_hook(Box::new(|info| {
        let stack = js_sys::Reflect::get(&js_sys::Error::new(""), &"stack".into())
            .ok()
            .and_then(|s| s.as_string())
            .unwrap_or_default();
        web_sys::console::error_1(&format!("Magwright panicked: {info}\n\nStack:\n{stack}").into());
        show_overlay();
    }));
}

/// Puts the error message over the page (once).
pub fn show_overlay() {
    let Some(doc) = web_sys::window().and_then(|w| w.document()) else { return };
    if doc.get_element_by_id(OVERLAY_ID).is_some() {
        return;
    }
    let Ok(el) = doc.create_element("div") else { return };
    el.set_id(OVERLAY_ID);
    let _ = el.set_attribute("role", "alertdialog");
    let _ = el.set_attribute("aria-modal", "true");
    let _ = el.set_attribute("aria-labelledby", "panic-h");
    let _ = el.set_attribute("data-testid", "panic");
    // Static text only: no user data goes into this markup.
    el.set_inner_html(
        "<div class=\"panic-box\">\
           <h2 id=\"panic-h\">Magwright hit an internal error</h2>\
           <p>Magwright hit an internal error; your last good design is saved — reload to continue.</p>\
           <p class=\"panic-detail\">The page has stopped responding to edits. The details are in the browser's console.</p>\
           <button type=\"button\" onclick=\"location.replace(location.href.split('#')[0])\">Reload</button>\
         </div>",
    );
    if let Some(body) = doc.body() {
        let _ = body.append_child(&el);
        if let Some(b) =
            el.query_selector("button").ok().flatten().and_then(|b| b.dyn_into::<web_sys::HtmlElement>().ok())
        {
            let _ = b.focus();
        }
    }
}

/// TEST-ONLY route, for the browser test of the hook: when the fragment is
/// exactly [`TEST_PANIC_FRAGMENT`] and the design on screen came from
/// localStorage, panic deliberately shortly after the page has drawn.
/// A user never reaches this: no link or control in the page leads here.
pub fn test_route(hash: &str, design_from_storage: bool) {
    if hash == TEST_PANIC_FRAGMENT && design_from_storage {
        leptos::prelude::set_timeout(
            || panic!("deliberate test panic ({TEST_PANIC_FRAGMENT})"),
            std::time::Duration::from_millis(100),
        );
    }
}
