//! The page: its layout, where the design comes from, and the Files actions.
//!
//! State lives in signals (the text of each field, in [`Form`]); everything
//! else is derived in memos: the parsed spec, then the engine's outcome,
//! then the last good design, which an effect saves to localStorage on
//! every valid edit. Nothing here knows what kind of design it is: that is
//! [`crate::form`] and [`crate::report_view`].
//!
//! Where the first design comes from, in order: a `#design=` share link,
//! else the design saved in this browser, else the demo.

use crate::browser;
use crate::files;
use crate::form::{self, FluxFields, Form, Outcome, Problem, SpecFields};
use crate::panels::library::Library;
use crate::panels::pictures::Pictures;
use crate::panels::results::Results;
use crate::panels::sheet::BuildSheet;
use crate::panels::optimiser::OptimiserPanel;
use crate::panels::windings::Windings;
use crate::panic;
use crate::persist;
use crate::ui::Panel;
use leptos::html::Input;
use leptos::prelude::*;
use leptos::task::spawn_local;
use magwright_engine::design::Design;
use magwright_engine::Error;
use wasm_bindgen::JsCast;

/// Name of a saved design file.
const FILE_NAME: &str = "magwright-design.json";

/// Where the design on screen at start came from.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Source {
    Link,
    Storage,
    Demo,
}

/// A message from the Files actions.
#[derive(Debug, Clone, PartialEq)]
pub struct Status {
    pub ok: bool,
    pub text: String,
}

impl Status {
    fn ok(text: impl Into<String>) -> Option<Self> {
        Some(Status { ok: true, text: text.into() })
    }
    fn err(text: impl Into<String>) -> Option<Self> {
        Some(Status { ok: false, text: text.into() })
    }
}

/// A file error for people: the field's full path and the message, in the
/// words the CLI uses (`spec.input.min: must be …`).
fn describe(e: &Error) -> String {
    e.to_string()
}

/// A stored design the page cannot read: kept untouched (never saved over)
/// until the user downloads or discards it.
#[derive(Debug, Clone, PartialEq)]
pub struct Held {
    pub text: String,
    pub why: String,
}

/// The design from a `#design=` fragment, if the fragment is one.
fn from_link(hash: &str) -> Option<Result<Design, String>> {
    persist::from_fragment(hash).map(|r| r.and_then(|text| files::from_json(&text).map_err(|e| describe(&e))))
}

/// Where the page starts.
struct Start {
    design: Design,
    source: Source,
    note: Option<Status>,
    /// The stored text, when it cannot be read.
    held: Option<Held>,
    /// A link replaced a different stored design (kept under
    /// [`persist::BEFORE_LINK_KEY`]).
    replaced: bool,
}

/// Before a link's design is shown: keeps a different, readable stored
/// design one click away. True when one was kept.
fn keep_stored_for(link: &Design) -> bool {
    match persist::load() {
        Some(text) => match files::from_json(&text) {
            Ok(stored) if &stored != link => persist::keep_before_link(&text),
            _ => false,
        },
        None => false,
    }
}

/// The first design: link, else storage, else demo; and a note to show.
/// A stored design that cannot be read is held, never replaced.
fn initial(hash: &str) -> Start {
    let mut note = None;
    let stored = persist::load();
    let held = stored.as_ref().and_then(|text| {
        files::from_json(text).err().map(|e| Held { text: text.clone(), why: describe(&e) })
    });
    if let Some(link) = from_link(hash) {
        browser::clear_hash();
        match link {
            Ok(d) => {
                let replaced = held.is_none() && keep_stored_for(&d);
                return Start { design: d, source: Source::Link, note: Status::ok("Opened the design from the link."), held, replaced };
            }
            Err(m) => {
                note = Status::err(format!("The link's design could not be read: {m}. Nothing was taken from it."))
            }
        }
    }
    if let (Some(text), None) = (&stored, &held) {
        if let Ok((d, notes)) = files::from_json_noted(text) {
            let note = if !notes.is_empty() && note.is_none() {
                Status::ok(files::with_notes("The design saved in this browser:", &notes))
            } else {
                note
            };
            return Start { design: d, source: Source::Storage, note, held: None, replaced: false };
        }
    }
    Start { design: form::demo(), source: Source::Demo, note, held, replaced: false }
}

#[component]
pub fn App() -> impl IntoView {
    let hash = browser::hash();
    let Start { design: first, source, note, held, replaced } = initial(&hash);
    let form = Form::new(&first);
    let status = RwSignal::new(note);
    // The unreadable stored design, while it is kept; nothing is saved then.
    let held = RwSignal::new(held);
    // A link's design replaced a different stored one (kept one click away).
    let replaced = RwSignal::new(replaced);

    let spec = Memo::new(move |_| form.parse());
    let outcome: Memo<Outcome> = Memo::new(move |_| match spec.get() {
        Err(errs) => Err(Problem::Fields(errs)),
        Ok(s) => form::compute(&s).map_err(Problem::Engine),
    });
    // The last good design: parsed and accepted by the engine.
    let good = Memo::new(move |_| match (spec.get(), outcome.with(|o| o.is_ok())) {
        (Ok(s), true) => Some(s),
        _ => None,
    });
    // While an entry is invalid, results and pictures keep the last good
    // design (marked as not matching the form); see `StaleNote`.
    let shown: Memo<Outcome> = Memo::new(move |prev: Option<&Outcome>| match (outcome.get(), prev) {
        (Ok(r), _) => Ok(r),
        (Err(_), Some(Ok(r))) => Ok(r.clone()),
        (Err(p), _) => Err(p),
    });
    let stale = Memo::new(move |_| outcome.with(|o| o.is_err()) && shown.with(|s| s.is_ok()));
    // The design the pictures sweep: the last good one.
    let design = Memo::new(move |prev: Option<&Option<Design>>| match (good.get(), prev) {
        (Some(d), _) => Some(d),
        (None, Some(p)) => p.clone(),
        (None, None) => None,
    });
    let saved = RwSignal::new(true);
    Effect::new(move |_| {
        if let Some(s) = good.get() {
            // An unreadable stored design is kept until the user decides.
            if held.with(|h| h.is_none()) {
                saved.set(persist::save(&files::to_json(&s)));
            }
        }
    });

    // A link pasted into the address bar of the open page changes only the
    // fragment; open its design too.
    let _ = window_event_listener(leptos::ev::hashchange, move |_| {
        let h = browser::hash();
        if let Some(link) = from_link(&h) {
            browser::clear_hash();
            match link {
                Ok(s) => {
                    if held.with_untracked(|h| h.is_none()) && keep_stored_for(&s) {
                        replaced.set(true);
                    }
                    form.set(&s);
                    status.set(Status::ok("Opened the design from the link."));
                }
                Err(m) => {
                    status.set(Status::err(format!("The link's design could not be read: {m}. Nothing was changed.")))
                }
            }
        } else {
            panic::test_route(&h, persist::load().is_some());
        }
    });
    panic::test_route(&hash, source == Source::Storage);

    view! {
        <a class="skip" href="#results-h">"Skip to results"</a>
        <header class="top" data-source=match source { Source::Link => "link", Source::Storage => "storage", Source::Demo => "demo" }>
            <h1>"Magwright"</h1>
            <span class="sub">{form::TITLE}</span>
            <span class="saved" data-testid="saved-state">
                {move || if held.with(|h| h.is_some()) {
                    "Not saved: the design stored in this browser is kept (see above)"
                } else if saved.get() { "Saved in this browser" } else { "Not saved: this browser refuses storage" }}
            </span>
            <p class="standing-caution" data-testid="standing-caution" role="note">
                {magwright_engine::topology::spec::STANDING_CAUTION}
            </p>
        </header>
        <StorageNotes form=form held=held replaced=replaced status=status />
        <main class="layout">
            <div class="col inputs">
                <Panel id="spec" title="Specification" help="The converter this transformer serves. Values take SI prefixes (200k, 4.7u, 150m); every edit recomputes the design.">
                    <SpecFields form=form outcome=outcome />
                </Panel>
                <Panel id="core" title="Core and material" help="The core set and its material from the built-in libraries, or your own; the flux limit and how turns are chosen.">
                    <Library form=form outcome=outcome />
                    <FluxFields form=form outcome=outcome />
                    <crate::panels::material_curves::MaterialCurves form=form />
                </Panel>
            </div>
            <div class="col outputs">
                <Panel id="results" title="Results" help="The checks that decide the design, with their margins and worst line corner, then the key figures and cautions.">
                    <StaleNote outcome=outcome stale=stale what="results" />
                    <div class="stale-able" class:stale=stale><Results outcome=shown /></div>
                </Panel>
                <Panel id="files" title="Files" help="Save the design as a file, open one, copy a link that holds the design, or print a build sheet. Your last good design is also kept in this browser.">
                    <FileActions form=form spec=spec status=status />
                </Panel>
            </div>
            <div class="col pictures">
                <Panel id="pictures" title="Pictures" help="The flux in the core over one period at both line corners, and the design redone across switching frequency.">
                    <StaleNote outcome=outcome stale=stale what="pictures" />
                    <div class="stale-able" class:stale=stale><Pictures outcome=shown design=design /></div>
                </Panel>
                <Panel id="windings" title="Windings" help="What to wind with which wire, the loss of each winding, and the window it goes into, to scale.">
                    <Windings form=form outcome=outcome />
                </Panel>
            </div>
        </main>
        <Panel id="suggest" title="Optimiser" help="Designs this specification on every library core and material and ranks those that pass.">
            <OptimiserPanel form=form />
        </Panel>
        <BuildSheet outcome=outcome />
    }
}

/// Says that the results (or pictures) are of the last good design while an
/// entry is invalid, and lists what to fix (the results' note only).
#[component]
fn StaleNote(outcome: Memo<Outcome>, stale: Memo<bool>, what: &'static str) -> impl IntoView {
    move || {
        if !stale.get() {
            return None;
        }
        let lines = outcome.with(|o| o.as_ref().err().map(Problem::lines).unwrap_or_default());
        Some(if what == "results" {
            view! {
                <div class="missing stale-note" data-testid="missing" role="status">
                    <p data-testid="stale-note"><strong>"Not the form's design."</strong>" These results are of the last good design; fix these entries to update them:"</p>
                    <ul>{lines.into_iter().map(|l| view! { <li>{l}</li> }).collect_view()}</ul>
                </div>
            }
            .into_any()
        } else {
            view! {
                <p class="stale-note" data-testid="stale-pictures" role="status">
                    <strong>"Not the form's design:"</strong>" these pictures are of the last good design."
                </p>
            }
            .into_any()
        })
    }
}

/// At the top: a stored design that cannot be read (kept, with download and
/// discard), and the way back to the stored design a link replaced.
#[component]
fn StorageNotes(form: Form, held: RwSignal<Option<Held>>, replaced: RwSignal<bool>, status: RwSignal<Option<Status>>) -> impl IntoView {
    let download = move |_| {
        if let Some(h) = held.get_untracked() {
            if let Err(e) = browser::download("magwright-stored-design.json", "application/json", &h.text) {
                status.set(Status::err(format!("Could not download the stored design: {e}.")));
            }
        }
    };
    let discard = move |_| {
        persist::discard();
        held.set(None);
        // The design on screen is saved from now on (the effect sees `held`).
        status.set(Status::ok("Discarded the stored design; the design on screen is now saved in this browser."));
    };
    let back = move |_| {
        let kept = persist::before_link().and_then(|t| files::from_json(&t).ok());
        match kept {
            Some(d) => {
                form.set(&d);
                status.set(Status::ok("Back to the design you had in this browser before the link."));
            }
            None => status.set(Status::err("The design from before the link is no longer stored.")),
        }
        persist::forget_before_link();
        replaced.set(false);
    };
    let keep_link = move |_| {
        persist::forget_before_link();
        replaced.set(false);
    };
    view! {
        {move || held.get().map(|h| view! {
            <div class="storage-note bad" data-testid="storage-problem" role="alert">
                <p><strong>"The design saved in this browser could not be read"</strong>{format!(" ({}).", h.why)}
                    " It is kept untouched and nothing is saved over it: download it to keep it, or discard it. The page shows the demo meanwhile."</p>
                <button type="button" data-testid="stored-download" on:click=download>"Download the stored design"</button>
                <button type="button" data-testid="stored-discard" on:click=discard>"Discard it"</button>
            </div>
        })}
        {move || replaced.get().then(|| view! {
            <div class="storage-note" data-testid="link-note" role="status">
                <p>"This is the design from the link. The different design you had in this browser is kept."</p>
                <button type="button" data-testid="back-to-stored" on:click=back>"Back to my design"</button>
                <button type="button" data-testid="keep-link" on:click=keep_link>"Keep the link's design"</button>
            </div>
        })}
    }
}

/// Save, open, copy link, print, and their messages.
#[component]
fn FileActions(
    form: Form,
    spec: Memo<Result<Design, form::FieldErrors>>,
    status: RwSignal<Option<Status>>,
) -> impl IntoView {
    let file_input = NodeRef::<Input>::new();
    let link = RwSignal::new(None::<String>);
    let current = move || spec.get_untracked().ok().map(|s| files::to_json(&s));

    let save = move |_| match current() {
        Some(text) => match browser::download(FILE_NAME, "application/json", &text) {
            Ok(()) => status.set(Status::ok(format!("Saved the design as {FILE_NAME} (see your downloads)."))),
            Err(e) => status.set(Status::err(format!("Could not save: {e}."))),
        },
        None => {
            status.set(Status::err("Fix the marked entries first: a design with unreadable entries cannot be saved."))
        }
    };
    let choose = move |_| {
        if let Some(i) = file_input.get() {
            i.click();
        }
    };
    let opened = move |ev: leptos::ev::Event| {
        let Some(input) = ev.target().and_then(|t| t.dyn_into::<web_sys::HtmlInputElement>().ok()) else { return };
        let Some(file) = input.files().and_then(|l| l.get(0)) else { return };
        input.set_value(""); // choosing the same file again fires `change` again
        let name = file.name();
        spawn_local(async move {
            let result = browser::read_text(file, files::MAX_BYTES)
                .await
                .and_then(|text| files::from_json_noted(&text).map_err(|e| describe(&e)));
            match result {
                Ok((s, notes)) => {
                    form.set(&s);
                    status.set(Status::ok(files::with_notes(&format!("Opened {name}."), &notes)));
                }
                Err(m) => status.set(Status::err(format!("Could not open {name}: {m}. Nothing was changed."))),
            }
        });
    };
    let copy = move |_| match current() {
        Some(text) => {
            let url = format!("{}{}", browser::url_without_hash(), persist::fragment(&text));
            link.set(Some(url.clone()));
            spawn_local(async move {
                match browser::copy(&url).await {
                    Ok(()) => status
                        .set(Status::ok("Copied a link that holds this design. Anyone opening it sees this design.")),
                    Err(e) => status.set(Status::ok(format!("The link is below; copy it from there ({e})."))),
                }
            });
        }
        None => {
            status.set(Status::err("Fix the marked entries first: a design with unreadable entries cannot be shared."))
        }
    };
    let print = move |_| {
        if let Err(e) = browser::print() {
            status.set(Status::err(format!("Could not print: {e}.")));
        }
    };
    view! {
        <div class="actions" role="group" aria-label="Design file actions">
            <button type="button" data-testid="save" on:click=save>"Save design"</button>
            <button type="button" data-testid="open" on:click=choose>"Open design…"</button>
            <button type="button" data-testid="copy-link" on:click=copy>"Copy link"</button>
            <button type="button" data-testid="print" on:click=print>"Print build sheet"</button>
        </div>
        <input
            type="file"
            accept=".json,application/json"
            class="file-input"
            data-testid="open-file"
            tabindex="-1"
            aria-hidden="true"
            node_ref=file_input
            on:change=opened
        />
        <p
            class="status"
            class:bad=move || status.with(|s| s.as_ref().is_some_and(|s| !s.ok))
            data-testid="file-status"
            role="status"
            aria-live="polite"
        >
            {move || status.get().map(|s| s.text).unwrap_or_default()}
        </p>
        {move || {
            link.get().map(|url| view! {
                <label class="link-label" for="share-link">"Link to this design"</label>
                <input id="share-link" class="share-link" type="text" readonly data-testid="share-link" prop:value=url
                    on:focus:target=move |ev| ev.target().select() />
            })
        }}
    }
}
