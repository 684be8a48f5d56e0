//! The conductor of one winding, fixed by the user or left to the solver:
//! the kind (automatic, round, triple-insulated, litz, foil), its size and
//! the number in hand, typed and checked here only for form; the engine
//! judges whether it fits and what it loses.

use super::windings::{css_colour, slug};
use crate::form::{self, Form};
use leptos::prelude::*;
use magwright_engine::design::file::{WireChoice, WireOverride};
use magwright_engine::notation;

/// The kinds of conductor a winding can be fixed to.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum WireKind {
    Auto,
    Round,
    Litz,
    Foil,
    TripleInsulated,
}

const KINDS: [(WireKind, &str); 5] = [
    (WireKind::Auto, "automatic"),
    (WireKind::Round, "round enamelled"),
    (WireKind::Litz, "litz"),
    (WireKind::Foil, "foil"),
    (WireKind::TripleInsulated, "triple-insulated"),
];

fn kind_of(w: Option<&WireChoice>) -> WireKind {
    match w {
        None => WireKind::Auto,
        Some(WireChoice::Round { .. }) => WireKind::Round,
        Some(WireChoice::Litz { .. }) => WireKind::Litz,
        Some(WireChoice::Foil { .. }) => WireKind::Foil,
        Some(WireChoice::TripleInsulated { .. }) => WireKind::TripleInsulated,
    }
}

/// A starting point when a kind is first chosen (common sizes, no source).
fn default_of(k: WireKind) -> Option<WireChoice> {
    match k {
        WireKind::Auto => None,
        WireKind::Round => Some(WireChoice::Round { awg: 24, parallel: 1 }),
        WireKind::Litz => Some(WireChoice::Litz {
            strands: 60,
            strand_awg: 38,
        }),
        WireKind::Foil => Some(WireChoice::Foil { thickness: 0.1e-3 }),
        WireKind::TripleInsulated => Some(WireChoice::TripleInsulated { awg: 24, parallel: 1 }),
    }
}

/// The labels of the two entries of a kind.
fn labels_of(k: WireKind) -> (&'static str, &'static str, &'static str) {
    match k {
        WireKind::Round | WireKind::TripleInsulated => ("AWG", "In hand", ""),
        WireKind::Litz => ("Strands", "Strand AWG", ""),
        WireKind::Foil => ("Thickness", "", "m"),
        WireKind::Auto => ("", "", ""),
    }
}

fn texts_of(w: &WireChoice) -> (String, String) {
    match *w {
        WireChoice::Round { awg, parallel } | WireChoice::TripleInsulated { awg, parallel } => {
            (awg.to_string(), parallel.to_string())
        }
        WireChoice::Litz { strands, strand_awg } => (strands.to_string(), strand_awg.to_string()),
        WireChoice::Foil { thickness } => (form::text_of(thickness, true), String::new()),
    }
}

fn whole(t: &str, what: &str) -> Result<i64, String> {
    match notation::parse(t, "") {
        Ok(v) if v.fract() == 0.0 && v.abs() <= 1e6 => Ok(v as i64),
        Ok(_) => Err(format!("{what}: a whole number")),
        Err(e) => Err(format!("{what}: {e}")),
    }
}

/// The conductor the two entries describe (ranges are the engine's to check).
fn read(k: WireKind, a: &str, b: &str) -> Result<Option<WireChoice>, String> {
    let count =
        |t: &str, what: &str| whole(t, what).and_then(|v| u32::try_from(v).map_err(|_| format!("{what}: not below 0")));
    Ok(match k {
        WireKind::Auto => None,
        WireKind::Round => Some(WireChoice::Round {
            awg: whole(a, "AWG")? as i32,
            parallel: count(b, "In hand")?,
        }),
        WireKind::TripleInsulated => Some(WireChoice::TripleInsulated {
            awg: whole(a, "AWG")? as i32,
            parallel: count(b, "In hand")?,
        }),
        WireKind::Litz => Some(WireChoice::Litz {
            strands: count(a, "Strands")?,
            strand_awg: whole(b, "Strand AWG")? as i32,
        }),
        WireKind::Foil => Some(WireChoice::Foil {
            thickness: notation::parse(a, "m").map_err(|e| format!("Thickness: {e}"))?,
        }),
    })
}

/// Sets (or with `None` removes) the fixed conductor of `name`, keeping
/// the other overrides in their order.
fn set_override(form: Form, name: &str, wire: Option<WireChoice>) {
    form.wires
        .update(|ws| match (ws.iter().position(|o| o.winding == name), wire) {
            (Some(i), Some(w)) => ws[i].wire = w,
            (Some(i), None) => {
                ws.remove(i);
            }
            (None, Some(w)) => ws.push(WireOverride {
                winding: name.to_string(),
                wire: w,
            }),
            (None, None) => {}
        });
}

/// One winding's conductor: automatic or fixed, with its entries.
#[component]
pub(super) fn WireRow(form: Form, name: String, index: usize) -> impl IntoView {
    let s = slug(&name);
    let (id_k, id_a, id_b) = (format!("f-wire-{s}"), format!("f-wire-{s}-a"), format!("f-wire-{s}-b"));
    let name = StoredValue::new(name);
    let current = Memo::new(move |_| {
        form.wires.with(|ws| {
            ws.iter()
                .find(|o| name.with_value(|n| &o.winding == n))
                .map(|o| o.wire.clone())
        })
    });
    let kind = Memo::new(move |_| current.with(|w| kind_of(w.as_ref())));
    let (a, b) = (RwSignal::new(String::new()), RwSignal::new(String::new()));
    let msg = RwSignal::new(None::<String>);
    // The entries follow the form when it changes from elsewhere (a file
    // opened, a kind chosen); text the user is typing is left alone.
    Effect::new(move |_| {
        if let Some(w) = current.get() {
            let typed = read(kind_of(Some(&w)), &a.get_untracked(), &b.get_untracked());
            if typed.as_ref().ok().and_then(|t| t.as_ref()) != Some(&w) {
                let (ta, tb) = texts_of(&w);
                a.set(ta);
                b.set(tb);
                msg.set(None);
            }
        }
    });
    let pick = move |ev: leptos::ev::Event| {
        let v = event_target_value(&ev);
        if let Some((k, _)) = v.parse::<usize>().ok().and_then(|i| KINDS.get(i)) {
            msg.set(None);
            name.with_value(|n| set_override(form, n, default_of(*k)));
        }
    };
    let typed = move || match read(kind.get_untracked(), &a.get_untracked(), &b.get_untracked()) {
        Ok(w) => {
            msg.set(None);
            name.with_value(|n| set_override(form, n, w));
        }
        Err(m) => msg.set(Some(format!("{m} (not applied)"))),
    };
    let auto = move || kind.get() == WireKind::Auto;
    let one_entry = move || matches!(kind.get(), WireKind::Auto | WireKind::Foil);
    view! {
        <div class="wire-row" data-testid=format!("wire-row-{s}")>
            <div class="field">
                <label for=id_k.clone()><span class="swatch" style=css_colour(index)></span>{name.get_value()}</label>
                <select id=id_k on:change=pick>
                    {KINDS.iter().enumerate().map(|(i, (k, l))| {
                        let k = *k;
                        view! { <option value=i.to_string() prop:selected=move || kind.get() == k>{*l}</option> }
                    }).collect_view()}
                </select>
                <div class="msg" role="alert">{move || msg.get().unwrap_or_default()}</div>
            </div>
            <div class="field" class:hidden=auto>
                <label for=id_a.clone()>{move || labels_of(kind.get()).0}</label>
                <div class="entry">
                    <input id=id_a type="text" inputmode="decimal" autocomplete="off" spellcheck="false"
                        prop:value=move || a.get()
                        on:input:target=move |ev| { a.set(ev.target().value()); typed(); } />
                    <span class="unit">{move || labels_of(kind.get()).2}</span>
                </div>
            </div>
            <div class="field" class:hidden=one_entry>
                <label for=id_b.clone()>{move || labels_of(kind.get()).1}</label>
                <div class="entry">
                    <input id=id_b type="text" inputmode="decimal" autocomplete="off" spellcheck="false"
                        prop:value=move || b.get()
                        on:input:target=move |ev| { b.set(ev.target().value()); typed(); } />
                </div>
            </div>
        </div>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn entries_read_back_as_the_override() {
        for w in [
            WireChoice::Round { awg: 22, parallel: 3 },
            WireChoice::Litz {
                strands: 120,
                strand_awg: 40,
            },
            WireChoice::Foil { thickness: 0.15e-3 },
            WireChoice::TripleInsulated { awg: 26, parallel: 2 },
        ] {
            let (a, b) = texts_of(&w);
            assert_eq!(read(kind_of(Some(&w)), &a, &b), Ok(Some(w.clone())));
        }
        assert!(read(WireKind::Round, "22.5", "1").is_err());
        assert!(read(WireKind::Round, "22", "-1").is_err());
        assert_eq!(read(WireKind::Auto, "", ""), Ok(None));
        assert_eq!(slug("secondary 1 B"), "secondary-1-b");
    }
}
