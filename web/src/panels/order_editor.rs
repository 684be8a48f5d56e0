//! The custom winding order: the sections bobbin outward, moved, split,
//! removed and added by keyboard or pointer, seeded from the stack-up as
//! wound so choosing "custom" changes nothing until an edit.

use super::windings::css_colour;
use crate::form::{Form, Outcome, Problem, Report};
use leptos::prelude::*;
use magwright_engine::design::file::{Interleave, SectionTurns};
use magwright_engine::winding::stackup::Item;

/// The sections of a report's stack-up as a custom order, bobbin outward,
/// each sharing its winding's turns (so the order gives the same stack-up).
pub(super) fn order_of(r: &Report) -> Vec<SectionTurns> {
    r.stackup
        .items
        .iter()
        .filter_map(|it| match it {
            Item::Section(s) => Some(SectionTurns {
                winding: s.winding.clone(),
                turns: None,
            }),
            _ => None,
        })
        .collect()
}

/// Whether `order` names exactly the windings `names` (each at least once).
pub(super) fn order_suits(order: &[SectionTurns], names: &[String]) -> bool {
    !order.is_empty()
        && order.iter().all(|o| names.contains(&o.winding))
        && names.iter().all(|n| order.iter().any(|o| &o.winding == n))
}

/// "primary section 2": a section by its winding and its place, bobbin
/// outward, among that winding's sections.
fn section_name(order: &[SectionTurns], i: usize) -> String {
    match order.get(i) {
        Some(s) => {
            let k = order.iter().take(i).filter(|o| o.winding == s.winding).count() + 1;
            format!("{} section {k}", s.winding)
        }
        None => String::new(),
    }
}

/// One edit of a custom order.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Edit {
    Up(usize),
    Down(usize),
    /// Two sections in place of one, both sharing the winding's turns.
    Split(usize),
    Remove(usize),
}

/// Applies `e` to `order`; the index of the section the edit leaves in
/// the user's hands (to keep the keyboard focus on it), if any.
fn apply(order: &mut Vec<SectionTurns>, e: Edit) -> Option<usize> {
    let n = order.len();
    match e {
        Edit::Up(i) if i > 0 && i < n => {
            order.swap(i - 1, i);
            Some(i - 1)
        }
        Edit::Down(i) if i + 1 < n => {
            order.swap(i, i + 1);
            Some(i + 1)
        }
        Edit::Split(i) if i < n => {
            let s = SectionTurns {
                winding: order[i].winding.clone(),
                turns: None,
            };
            order[i].turns = None;
            order.insert(i + 1, s);
            Some(i)
        }
        Edit::Remove(i) if i < n => {
            order.remove(i);
            (!order.is_empty()).then(|| i.min(order.len() - 1))
        }
        _ => None,
    }
}

/// Focuses the element `id` once the view has followed the last edit.
fn focus_later(id: String) {
    use wasm_bindgen::JsCast;
    leptos::prelude::request_animation_frame(move || {
        if let Some(el) = document()
            .get_element_by_id(&id)
            .and_then(|e| e.dyn_into::<web_sys::HtmlElement>().ok())
        {
            let _ = el.focus();
        }
    });
}

/// The custom winding order: the sections bobbin outward, each movable,
/// splittable and removable, and a section of any winding added at the
/// outside. The engine's complaints about the order are shown here, the
/// section it names outlined.
#[component]
pub(super) fn OrderEditor(form: Form, outcome: Memo<Outcome>, names: Memo<Vec<String>>) -> impl IntoView {
    let order_error = move || {
        outcome.with(|o| match o {
            Err(Problem::Engine(e)) => e
                .field()
                .filter(|f| f.starts_with("choices.section_order"))
                .map(|f| {
                    let at = f
                        .strip_prefix("choices.section_order[")
                        .and_then(|r| r.split(']').next())
                        .and_then(|k| k.parse::<usize>().ok());
                    (at, e.message().to_string())
                }),
            _ => None,
        })
    };
    let edit = move |e: Edit| {
        let mut keep = None;
        form.section_order.update(|o| keep = apply(o, e));
        let len = form.section_order.with_untracked(|o| o.len());
        let id = match (e, keep) {
            (Edit::Remove(_), Some(i)) => format!("order-remove-{i}"),
            (Edit::Split(_), Some(i)) => format!("order-split-{i}"),
            (Edit::Up(_) | Edit::Down(_), Some(i)) if i == 0 => "order-down-0".to_string(),
            (Edit::Up(_), Some(i)) => format!("order-up-{i}"),
            (Edit::Down(_), Some(i)) if i + 1 == len => format!("order-up-{i}"),
            (Edit::Down(_), Some(i)) => format!("order-down-{i}"),
            _ => "f-order-add".to_string(),
        };
        focus_later(id);
    };
    // Turns of each section as the engine wound them, when the report is
    // of this very order.
    let wound = move || {
        outcome.with(|o| {
            o.as_ref().ok().and_then(|r| {
                let t: Vec<u32> = r
                    .stackup
                    .items
                    .iter()
                    .filter_map(|it| match it {
                        Item::Section(s) => Some(s.turns),
                        _ => None,
                    })
                    .collect();
                let same = form.section_order.with(|ord| {
                    ord.len() == t.len() && ord.iter().zip(order_of(r)).all(|(a, b)| a.winding == b.winding)
                });
                (same && form.interleave.get() == Interleave::Custom).then_some(t)
            })
        })
    };
    let rows = move || {
        let order = form.section_order.get();
        let wound = wound();
        let bad = order_error().and_then(|e| e.0);
        let n = order.len();
        let all = names.get();
        order
            .iter()
            .enumerate()
            .map(|(i, s)| {
                let name = section_name(&order, i);
                let ci = all.iter().position(|w| w == &s.winding).unwrap_or(0);
                let turns = match (s.turns, wound.as_ref().and_then(|t| t.get(i))) {
                    (Some(t), _) => format!("{t} turns (fixed)"),
                    (None, Some(t)) => format!("{t} turns (shared)"),
                    (None, None) => "shares the turns".to_string(),
                };
                let cap = {
                    let mut c = name.clone();
                    if let Some(f) = c.get_mut(0..1) {
                        f.make_ascii_uppercase();
                    }
                    c
                };
                view! {
                    <li data-testid=format!("order-edit-{i}") class:bad=bad == Some(i)>
                        <span class="pos" aria-hidden="true">{format!("{}.", i + 1)}</span>
                        <span class="sec"><span class="swatch" style=css_colour(ci)></span>{cap}</span>
                        <span class="share">{turns}</span>
                        <button type="button" class="small" id=format!("order-up-{i}") disabled={i == 0}
                            aria-label=format!("Move {name} up") title=format!("Move {name} up (towards the bobbin)")
                            on:click=move |_| edit(Edit::Up(i))>"↑"</button>
                        <button type="button" class="small" id=format!("order-down-{i}") disabled={i + 1 >= n}
                            aria-label=format!("Move {name} down") title=format!("Move {name} down (away from the bobbin)")
                            on:click=move |_| edit(Edit::Down(i))>"↓"</button>
                        <button type="button" class="small" id=format!("order-split-{i}")
                            aria-label=format!("Split {name} in two") title=format!("Split {name} in two sections sharing its turns")
                            on:click=move |_| edit(Edit::Split(i))>"Split"</button>
                        <button type="button" class="small" id=format!("order-remove-{i}")
                            aria-label=format!("Remove {name}") title=format!("Remove {name}")
                            on:click=move |_| edit(Edit::Remove(i))>"Remove"</button>
                    </li>
                }
            })
            .collect_view()
    };
    let add_pick = RwSignal::new(0usize);
    let add = move |_| {
        let all = names.get_untracked();
        if let Some(w) = all.get(add_pick.get_untracked()).or(all.first()) {
            let w = w.clone();
            form.section_order.update(|o| {
                o.push(SectionTurns {
                    winding: w,
                    turns: None,
                })
            });
        }
    };
    view! {
        <fieldset data-testid="order-editor" class:hidden=move || form.interleave.get() != Interleave::Custom>
            <legend>"Custom order, bobbin outward"</legend>
            {move || order_error().map(|(_, m)| view! {
                <div class="wind-error" role="alert" data-testid="order-error">
                    <strong>"The engine refused this order:"</strong>{m}
                </div>
            })}
            <ol class="order-edit" data-testid="order-edit">{rows}</ol>
            <div class="order-add">
                <div class="field">
                    <label for="f-order-add">"Add a section of"</label>
                    <select id="f-order-add" on:change:target=move |ev| {
                        if let Ok(i) = ev.target().value().parse::<usize>() { add_pick.set(i) }
                    }>
                        {move || names.get().into_iter().enumerate().map(|(i, n)| {
                            view! { <option value=i.to_string() prop:selected=move || add_pick.get() == i>{n}</option> }
                        }).collect_view()}
                    </select>
                </div>
                <button type="button" class="small" data-testid="order-add" on:click=add
                    aria-label=move || format!("Add a section of {} at the outside", names.get().get(add_pick.get()).cloned().unwrap_or_default())>
                    "Add at the outside"
                </button>
            </div>
            <p class="core-note">"Sections of one winding share its turns equally; the order is kept when the turns change."</p>
        </fieldset>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn st(w: &str) -> SectionTurns {
        SectionTurns {
            winding: w.into(),
            turns: None,
        }
    }

    #[test]
    fn order_edits_move_split_and_remove() {
        let mut o = vec![st("primary"), st("secondary 1"), st("primary")];
        assert_eq!(section_name(&o, 2), "primary section 2");
        assert_eq!(apply(&mut o, Edit::Up(1)), Some(0));
        assert_eq!(o, vec![st("secondary 1"), st("primary"), st("primary")]);
        assert_eq!(apply(&mut o, Edit::Up(0)), None, "the first cannot go up");
        assert_eq!(apply(&mut o, Edit::Down(2)), None, "the last cannot go down");
        let mut fixed = st("secondary 1");
        fixed.turns = Some(3);
        o[0] = fixed;
        assert_eq!(apply(&mut o, Edit::Split(0)), Some(0));
        assert_eq!(o[..2], [st("secondary 1"), st("secondary 1")], "both halves share");
        assert_eq!(apply(&mut o, Edit::Remove(3)), Some(2));
        assert_eq!(o.len(), 3);
        assert_eq!(apply(&mut o, Edit::Remove(9)), None);
        let names = vec!["primary".to_string(), "secondary 1".to_string()];
        assert!(order_suits(&o, &names));
        assert!(!order_suits(&o[..2], &names), "no primary");
        assert!(!order_suits(&[], &names));
    }
}
