//! Page furniture shared by every panel: a titled section with one line of
//! help saying what the panel does.

use leptos::prelude::*;

/// A titled panel. `id` names its CSS class, its heading id (`<id>-h`) and
/// its test id (`panel-<id>`).
#[component]
pub fn Panel(id: &'static str, title: &'static str, help: &'static str, children: Children) -> impl IntoView {
    let h = format!("{id}-h");
    let labelled_by = h.clone();
    view! {
        <section class=format!("panel {id}") aria-labelledby=labelled_by data-testid=format!("panel-{id}")>
            <h2 id=h>{title}</h2>
            <p class="help">{help}</p>
            {children()}
        </section>
    }
}

/// A canvas redrawn whenever what `draw` reads changes. `draw` gets the
/// element and returns an error message to log (a failed drawing leaves
/// the rest of the page alone). `width` × `height` is the nominal CSS size
/// (`data-w`, `data-h`); drawing through [`crate::hidpi::area`] sizes the
/// backing store to the laid-out CSS size × devicePixelRatio.
#[component]
pub fn PlotCanvas<F>(
    /// `data-testid` of the canvas.
    testid: &'static str,
    /// What the picture shows, for screen readers.
    label: &'static str,
    width: u32,
    height: u32,
    draw: F,
) -> impl IntoView
where
    F: Fn(&web_sys::HtmlCanvasElement) -> Result<(), String> + 'static,
{
    let canvas = NodeRef::<leptos::html::Canvas>::new();
    // Bumped when the canvas's laid-out width changes (a resize, a panel
    // shown): the picture is redrawn at the new size.
    let resized = RwSignal::new(0u32);
    Effect::new(move |_| {
        resized.track();
        if let Some(c) = canvas.get() {
            if let Err(e) = draw(&c) {
                leptos::logging::warn!("{testid}: {e}");
            }
        }
    });
    let observer = StoredValue::new_local(None::<crate::hidpi::WidthWatch>);
    canvas.on_load(move |c| observer.set_value(crate::hidpi::WidthWatch::new(&c, move || resized.update(|n| *n += 1))));
    on_cleanup(move || observer.set_value(None));
    view! {
        <canvas node_ref=canvas width=width height=height data-w=width data-h=height data-testid=testid role="img" aria-label=label></canvas>
    }
}
