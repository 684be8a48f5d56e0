//! The core half of the panel: the library drop-down, the data of the core
//! in use, the browser over the whole library and the user's own core by
//! effective parameters (see the parent module for the whole panel).

use super::*;
/// The core drop-down and the library browser's button.
#[component]
pub(super) fn CorePick(form: Form, outcome: Memo<Outcome>, browsing: RwSignal<bool>) -> impl IntoView {
    let core_err = field_error(outcome, "core");
    let library_now = move || match form.core.get() {
        CoreChoice::Library { designation } => Some(designation),
        _ => None,
    };
    let own = move || match form.core.get() {
        CoreChoice::Library { .. } => None,
        CoreChoice::Shape { designation, .. } | CoreChoice::Effective { designation, .. } => Some(designation),
    };
    let options = cores::all()
        .iter()
        .map(|c| {
            let d = c.designation.as_str();
            view! { <option value=d prop:selected=move || library_now().as_deref() == Some(d)>{d}</option> }
        })
        .collect_view();
    let browse_button = NodeRef::<Button>::new();
    // Focus back on the button when the browser closes.
    Effect::new(move |was_open: Option<bool>| {
        let open = browsing.get();
        if was_open == Some(true) && !open {
            if let Some(b) = browse_button.get() {
                let _ = b.focus();
            }
        }
        open
    });
    view! {
        <div class="field" class:invalid=move || core_err.get().is_some()>
            <label for="f-core">"Core"</label>
            <select
                id="f-core"
                on:change:target=move |ev| {
                    let v = ev.target().value();
                    if !v.is_empty() {
                        form.core.set(CoreChoice::Library { designation: v });
                    }
                }
            >
                {move || own().map(|d| view! { <option value="" selected>{format!("Your own: {d}")}</option> })}
                {options}
            </select>
            <div class="msg" id="e-core" role="alert">{move || core_err.get().unwrap_or_default()}</div>
        </div>
        <div class="row-buttons">
            <button type="button" class="small" data-testid="browse-cores" node_ref=browse_button
                aria-haspopup="dialog" on:click=move |_| browsing.set(true)>"Browse the core library…"</button>
        </div>
    }
}

/// The data of the core in use.
#[component]
pub(super) fn CoreData(form: Form) -> impl IntoView {
    let core = Memo::new(move |_| core_of(&form.core.get()));
    move || match core.get() {
        Err(e) => view! { <p class="bad" data-testid="core-data-error">{e.message().to_string()}</p> }.into_any(),
        Ok(c) => {
            let title = if c.family.is_empty() {
                c.designation.clone()
            } else {
                format!("{} ({})", c.designation, c.family)
            };
            view! {
                <table class="data" data-testid="core-data" aria-label="Data of the core in use">
                    <tr><th scope="row">"Core"</th><td class="text" data-testid="core-designation">{title}</td></tr>
                    {figure("core-ae", "Ae", c.ae, 1e-6, "mm²")}
                    {figure("core-le", "le", c.le, 1e-3, "mm")}
                    {figure("core-ve", "Ve", c.ve, 1e-6, "cm³")}
                    {figure("core-amin", "Amin", c.amin, 1e-6, "mm²")}
                    {figure("core-wa", "Window area Wa", c.window_area, 1e-6, "mm²")}
                    {figure("core-g", "Window height", c.window_height, 1e-3, "mm")}
                    <tr>
                        <th scope="row">"Bobbin breadth × height"</th>
                        <td>
                            <span data-testid="core-breadth" data-si=si_attr(c.winding_breadth)>{sig(c.winding_breadth * 1e3, 3)}</span>
                            " × "
                            <span data-testid="core-height" data-si=si_attr(c.winding_height)>{sig(c.winding_height * 1e3, 3)}</span>
                            " mm"
                        </td>
                    </tr>
                    {figure("core-mlt", "Mean turn length on the bobbin", c.turn_length_inner, 1e-3, "mm")}
                    {figure("core-surface", "Outer surface", c.surface_area, 1e-4, "cm²")}
                    {figure("core-mass", "Mass (set)", c.mass, 1e-3, "g")}
                </table>
                {agreement_note(&c)}
                <p class="prov" data-testid="core-provenance">{c.provenance.clone()}</p>
            }
            .into_any()
        }
    }
}

/// How the browser orders the cores.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(super) enum Order {
    Library,
    VeUp,
    VeDown,
    AeUp,
    WaUp,
}

pub(super) const ORDERS: [(Order, &str); 5] = [
    (Order::Library, "Library order (family, size)"),
    (Order::VeUp, "Ve, smallest first"),
    (Order::VeDown, "Ve, largest first"),
    (Order::AeUp, "Ae, smallest first"),
    (Order::WaUp, "Window area, smallest first"),
];

/// Designation contains the search text (case and spaces ignored).
pub(super) fn matches(designation: &str, search: &str) -> bool {
    let norm = |s: &str| {
        s.chars()
            .filter(|c| !c.is_whitespace())
            .flat_map(char::to_lowercase)
            .collect::<String>()
    };
    norm(designation).contains(&norm(search))
}

/// The library cores that pass the filters, in the chosen order (indices
/// into [`cores::all`]).
pub(super) fn select(family: &str, search: &str, order: Order) -> Vec<usize> {
    let all = cores::all();
    let mut v: Vec<usize> = (0..all.len())
        .filter(|&i| family.is_empty() || all[i].family == family)
        .filter(|&i| matches(&all[i].designation, search))
        .collect();
    let key = |i: &usize| -> f64 {
        let c = &all[*i];
        match order {
            Order::Library => *i as f64,
            Order::VeUp => c.ve,
            Order::VeDown => -c.ve,
            Order::AeUp => c.ae,
            Order::WaUp => c.window_area,
        }
    };
    v.sort_by(|a, b| key(a).total_cmp(&key(b)));
    v
}

/// The whole library in one table, over the page; picking a core uses it.
#[component]
pub(super) fn CoreBrowser(form: Form, open: RwSignal<bool>) -> impl IntoView {
    let family = RwSignal::new(String::new());
    let search = RwSignal::new(String::new());
    let order = RwSignal::new(Order::Library);
    let shown = Memo::new(move |_| select(&family.get(), &search.get(), order.get()));
    let search_box = NodeRef::<Input>::new();
    Effect::new(move |_| {
        if open.get() {
            if let Some(i) = search_box.get() {
                let _ = i.focus();
            }
        }
    });
    let current = move || match form.core.get() {
        CoreChoice::Library { designation } => Some(designation),
        _ => None,
    };
    let pick = move |d: &str| {
        form.core.set(CoreChoice::Library {
            designation: d.to_string(),
        });
        open.set(false);
    };
    let rows = move || {
        let all = cores::all();
        shown
            .get()
            .into_iter()
            .filter_map(|i| all.get(i))
            .map(|c| {
                let d = c.designation.as_str();
                let is_current = move || current().as_deref() == Some(d);
                let cell = |v: f64, scale: f64, n: i32| view! { <td data-si=si_attr(v)>{sig(v / scale, n)}</td> };
                view! {
                    <tr data-designation=d class:current=is_current aria-current=move || is_current().then_some("true")>
                        <td class="text"><button type="button" class="small" data-testid="use-core"
                            aria-label=format!("Use {d}") on:click=move |_| pick(d)>"Use"</button></td>
                        <th scope="row" class="text" title=c.provenance.clone()>{d}</th>
                        <td class="text">{c.family.clone()}</td>
                        {cell(c.ae, 1e-6, 3)}
                        {cell(c.le, 1e-3, 3)}
                        {cell(c.ve, 1e-6, 3)}
                        {cell(c.amin, 1e-6, 3)}
                        {cell(c.window_area, 1e-6, 3)}
                        {cell(c.window_height, 1e-3, 3)}
                        <td data-si=si_attr(c.winding_breadth)>{format!("{} × {}", sig(c.winding_breadth * 1e3, 3), sig(c.winding_height * 1e3, 3))}</td>
                        {cell(c.turn_length_inner, 1e-3, 3)}
                        {cell(c.surface_area, 1e-4, 3)}
                        {cell(c.mass, 1e-3, 3)}
                        <td class="src text" class:unconfirmed=is_unconfirmed(c) title=c.provenance.clone()>{short_source(&c.provenance).to_string()}</td>
                    </tr>
                }
            })
            .collect_view()
    };
    let families = cores::families();
    view! {
        <div class="lib-overlay" class:hidden=move || !open.get() data-testid="core-browser"
            on:keydown=move |ev: leptos::ev::KeyboardEvent| if ev.key() == "Escape" { open.set(false) }
            on:click=move |ev: leptos::ev::MouseEvent| {
                // A click on the shade outside the dialog closes it.
                let outside = ev.target().zip(ev.current_target()).is_some_and(|(t, c)| t == c);
                if outside { open.set(false) }
            }>
            <div class="lib-dialog" role="dialog" aria-modal="true" aria-labelledby="core-browser-h">
                <h3 id="core-browser-h">"Core library"</h3>
                <div class="filters">
                    <div>
                        <label for="lib-family">"Family"</label>
                        <select id="lib-family" on:change:target=move |ev| family.set(ev.target().value())>
                            <option value="">"All families"</option>
                            {families.into_iter().map(|f| view! { <option value=f>{f}</option> }).collect_view()}
                        </select>
                    </div>
                    <div>
                        <label for="lib-search">"Designation contains"</label>
                        <input id="lib-search" type="search" autocomplete="off" spellcheck="false" node_ref=search_box
                            placeholder="e.g. 34 or PQ 26" prop:value=move || search.get()
                            on:input:target=move |ev| search.set(ev.target().value()) />
                    </div>
                    <div>
                        <label for="lib-order">"Order"</label>
                        <select id="lib-order" on:change:target=move |ev| {
                            if let Some((o, _)) = ev.target().value().parse::<usize>().ok().and_then(|i| ORDERS.get(i)) {
                                order.set(*o);
                            }
                        }>
                            {ORDERS.iter().enumerate().map(|(i, (_, l))| view! { <option value=i.to_string()>{*l}</option> }).collect_view()}
                        </select>
                    </div>
                    <span class="count" data-testid="browser-count" role="status">
                        {move || { let n = shown.with(Vec::len); format!("{n} core{}", if n == 1 { "" } else { "s" }) }}
                    </span>
                    <button type="button" data-testid="close-browser" on:click=move |_| open.set(false)>"Close"</button>
                </div>
                <div class="scroll">
                    <table data-testid="core-table">
                        <thead>
                            <tr>
                                <th scope="col" class="text"><span class="hidden">"Pick"</span></th>
                                <th scope="col" class="text">"Core"</th>
                                <th scope="col" class="text">"Family"</th>
                                <th scope="col">"Ae mm²"</th>
                                <th scope="col">"le mm"</th>
                                <th scope="col">"Ve cm³"</th>
                                <th scope="col">"Amin mm²"</th>
                                <th scope="col">"Wa mm²"</th>
                                <th scope="col">"Window height mm"</th>
                                <th scope="col">"Bobbin b × h mm"</th>
                                <th scope="col">"Turn on bobbin mm"</th>
                                <th scope="col">"Surface cm²"</th>
                                <th scope="col">"Mass g"</th>
                                <th scope="col" class="text">"Source"</th>
                            </tr>
                        </thead>
                        <tbody>{rows}</tbody>
                    </table>
                </div>
                <p class="note">"Every value is computed by the engine from nominal dimensions recalled from memory (IEC 60205 method); use your supplier's data for a real design."</p>
            </div>
        </div>
    }
}

/// One entry of the custom core.
pub(super) struct Def {
    /// Element key: the input's id is `f-<key>`.
    pub(super) key: &'static str,
    /// The engine's name for the field ([`Core::from_effective`] errors).
    pub(super) engine: &'static str,
    pub(super) label: &'static str,
    pub(super) dim: Dim,
    pub(super) optional: bool,
    pub(super) help: &'static str,
}

pub(super) const CUSTOM: [Def; 10] = [
    Def {
        key: "cc-ae",
        engine: "ae",
        label: "Ae",
        dim: Dim::Area,
        optional: false,
        help: "Effective area (IEC 60205)",
    },
    Def {
        key: "cc-le",
        engine: "le",
        label: "le",
        dim: Dim::Length,
        optional: false,
        help: "Effective magnetic path length (IEC 60205)",
    },
    Def {
        key: "cc-amin",
        engine: "amin",
        label: "Amin",
        dim: Dim::Area,
        optional: true,
        help: "Smallest section; empty: Ae",
    },
    Def {
        key: "cc-wa",
        engine: "window_area",
        label: "Window area",
        dim: Dim::Area,
        optional: false,
        help: "Core window area, one side",
    },
    Def {
        key: "cc-g",
        engine: "window_height",
        label: "Window height",
        dim: Dim::Length,
        optional: true,
        help: "Core window height along the centre leg; empty: the bobbin breadth",
    },
    Def {
        key: "cc-breadth",
        engine: "winding_breadth",
        label: "Bobbin breadth",
        dim: Dim::Length,
        optional: false,
        help: "Winding breadth of the bobbin, along the centre leg",
    },
    Def {
        key: "cc-height",
        engine: "winding_height",
        label: "Bobbin height",
        dim: Dim::Length,
        optional: false,
        help: "Radial build the bobbin allows",
    },
    Def {
        key: "cc-mlt",
        engine: "turn_length_inner",
        label: "Mean turn length on the bobbin",
        dim: Dim::Length,
        optional: false,
        help: "Mean turn length (MLT) of a turn laid on the bare bobbin",
    },
    Def {
        key: "cc-surface",
        engine: "surface_area",
        label: "Outer surface",
        dim: Dim::Surface,
        optional: false,
        help: "Outer surface of the assembled set (cooling)",
    },
    Def {
        key: "cc-mass",
        engine: "mass",
        label: "Mass (set)",
        dim: Dim::Mass,
        optional: true,
        help: "Empty: Ve × a typical ferrite density",
    },
];

/// The custom core's texts in display units, from a core.
pub(super) fn texts_of(c: &Core) -> [String; 10] {
    let e = effective_of(c);
    let vals = [
        Some(e.ae),
        Some(e.le),
        e.amin,
        Some(e.window_area),
        e.window_height,
        Some(e.winding_breadth),
        Some(e.winding_height),
        Some(e.turn_length_inner),
        Some(e.surface_area),
        e.mass,
    ];
    std::array::from_fn(|i| vals[i].map(|v| sig(v / CUSTOM[i].dim.scale(), 4)).unwrap_or_default())
}

/// What the custom-core entries say: messages per entry, or the core.
#[derive(Debug, Clone, PartialEq)]
pub(super) struct CoreCheck {
    /// (entry key, message).
    pub(super) errors: Vec<(&'static str, String)>,
    /// A message about no single entry.
    pub(super) general: Option<String>,
    /// The designation and parameters the engine accepted.
    pub(super) ok: Option<(String, Effective)>,
}

/// Reads the custom-core entries and has the engine check them.
pub(super) fn check_core(name: &str, family: &str, texts: &[String; 10]) -> CoreCheck {
    let mut errors = Vec::new();
    let mut vals = [None; 10];
    for (i, d) in CUSTOM.iter().enumerate() {
        match parse_dim(&texts[i], d.dim) {
            Ok(Some((v, _))) => vals[i] = Some(v),
            Ok(None) if d.optional => {}
            Ok(None) => errors.push((d.key, "enter a value".to_string())),
            Err(m) => errors.push((d.key, m)),
        }
    }
    if name.trim().is_empty() {
        errors.push(("cc-name", "give the core a name".to_string()));
    }
    if !errors.is_empty() {
        return CoreCheck {
            errors,
            general: None,
            ok: None,
        };
    }
    let req = |i: usize| vals[i].unwrap_or(0.0);
    let p = Effective {
        family: family.trim().to_string(),
        ae: req(0),
        le: req(1),
        ve: None,
        amin: vals[2],
        window_area: req(3),
        window_height: vals[4],
        winding_breadth: req(5),
        winding_height: req(6),
        turn_length_inner: req(7),
        surface_area: req(8),
        mass: vals[9],
    };
    match Core::from_effective(name, &p) {
        Ok(_) => CoreCheck {
            errors,
            general: None,
            ok: Some((name.trim().to_string(), p)),
        },
        Err(e) => {
            let at = e.field().and_then(|f| {
                if f == "designation" {
                    Some("cc-name")
                } else {
                    CUSTOM.iter().find(|d| d.engine == f).map(|d| d.key)
                }
            });
            match at {
                Some(k) => CoreCheck {
                    errors: vec![(k, e.message().to_string())],
                    general: None,
                    ok: None,
                },
                None => CoreCheck {
                    errors,
                    general: Some(e.message().to_string()),
                    ok: None,
                },
            }
        }
    }
}

/// No message (for entries the engine never names).
pub(super) fn none() -> Signal<Option<String>> {
    Signal::derive(|| None)
}

/// A text entry with a unit, a message, and an echo of what was read.
#[component]
pub(super) fn Entry(
    key: &'static str,
    #[prop(into)] label: String,
    unit: &'static str,
    text: RwSignal<String>,
    #[prop(into)] error: Signal<Option<String>>,
    #[prop(into)] echo: Signal<Option<String>>,
    #[prop(optional)] help: &'static str,
) -> impl IntoView {
    let id = format!("f-{key}");
    let err_id = format!("e-{key}");
    let invalid = move || error.get().is_some();
    view! {
        <div class="field" class:invalid=invalid>
            <label for=id.clone() title=help>{label}</label>
            <div class="entry">
                <input id=id type="text" autocomplete="off" spellcheck="false"
                    aria-invalid=move || if invalid() { "true" } else { "false" }
                    aria-describedby=err_id.clone()
                    prop:value=move || text.get()
                    on:input:target=move |ev| text.set(ev.target().value()) />
                <span class="unit">{unit}</span>
            </div>
            <div class="entry-echo">{move || echo.get().unwrap_or_default()}</div>
            <div class="msg" id=err_id role="alert">{move || error.get().unwrap_or_default()}</div>
        </div>
    }
}

/// The user's own core by effective parameters.
#[component]
pub(super) fn CustomCore(form: Form) -> impl IntoView {
    let start = core_of(&form.core.get_untracked()).ok();
    let name = RwSignal::new(match form.core.get_untracked() {
        CoreChoice::Effective { designation, .. } => designation,
        _ => "My core".to_string(),
    });
    let family = RwSignal::new(start.as_ref().map(|c| c.family.clone()).unwrap_or_default());
    let texts: [RwSignal<String>; 10] = {
        let t = start.as_ref().map(texts_of).unwrap_or_default();
        std::array::from_fn(|i| RwSignal::new(t[i].clone()))
    };
    let check = Memo::new(move |_| {
        let t: [String; 10] = std::array::from_fn(|i| texts[i].get());
        check_core(&name.get(), &family.get(), &t)
    });
    let error_at = move |key: &'static str| {
        Signal::derive(move || check.with(|c| c.errors.iter().find(|e| e.0 == key).map(|e| e.1.clone())))
    };
    let copy_current = move |_| {
        if let Ok(c) = core_of(&form.core.get_untracked()) {
            let t = texts_of(&c);
            for (s, v) in texts.iter().zip(t) {
                s.set(v);
            }
            family.set(c.family.clone());
            name.set(format!("{} (edited)", c.designation));
        }
    };
    let applied = RwSignal::new(false);
    let use_it = move |_| {
        if let Some((designation, parameters)) = check.get_untracked().ok {
            form.core.set(CoreChoice::Effective {
                designation,
                parameters,
            });
            applied.set(true);
        }
    };
    let in_use = move || {
        check.with(|c| match (&c.ok, form.core.get()) {
            (
                Some((d, p)),
                CoreChoice::Effective {
                    designation,
                    parameters,
                },
            ) => *d == designation && *p == parameters,
            _ => false,
        })
    };
    let fields = CUSTOM
        .iter()
        .enumerate()
        .map(|(i, d)| {
            let text = texts[i];
            let dim = d.dim;
            let echo = Signal::derive(move || match parse_dim(&text.get(), dim) {
                Ok(Some((v, true))) => Some(format!("= {} {}", sig(v / dim.scale(), 4), dim.unit())),
                _ => None,
            });
            let unit = d.dim.unit();
            let label = if d.optional {
                format!("{} (optional)", d.label)
            } else {
                d.label.to_string()
            };
            view! { <Entry key=d.key label=label unit=unit text=text error=error_at(d.key) echo=echo help=d.help /> }
        })
        .collect_view();
    view! {
        <details data-testid="custom-core">
            <summary>"Your own core, by effective parameters"</summary>
            <p class="note">"Numbers are in the unit shown unless you type one (mm, cm, m; mm², cm², m²; g, kg). SI prefixes work (1.2k)."</p>
            <div class="row-buttons">
                <button type="button" class="small" data-testid="copy-core" on:click=copy_current>"Start from the core in use"</button>
            </div>
            <div class="fields">
                <Entry key="cc-name" label="Name" unit="" text=name error=error_at("cc-name") echo=none() />
                <Entry key="cc-family" label="Family (optional)" unit="" text=family error=none() echo=none() />
                {fields}
            </div>
            <p class="bad" role="alert" data-testid="custom-core-error">{move || check.with(|c| c.general.clone()).unwrap_or_default()}</p>
            <button type="button" data-testid="use-custom-core" disabled=move || check.with(|c| c.ok.is_none())
                on:click=use_it>"Use this core"</button>
            <span class="note" role="status" data-testid="custom-core-state">
                {move || if in_use() { " In use." } else if applied.get() { " Changed since used: press again to use." } else { "" }}
            </span>
        </details>
    }
}
