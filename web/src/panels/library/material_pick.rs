//! The material half of the panel: the library drop-down, the data of the
//! grade in use, the user's own material field by field, and one fitted to
//! pasted measurements (see the parent module for the whole panel).

use super::*;
/// The material drop-down.
#[component]
pub(super) fn MaterialPick(form: Form, outcome: Memo<Outcome>) -> impl IntoView {
    let mat_err = field_error(outcome, "material");
    let library_now = move || match form.material.get() {
        MaterialChoice::Library { name } => Some(name),
        MaterialChoice::Custom { .. } => None,
    };
    let own = move || match form.material.get() {
        MaterialChoice::Custom { material } => Some(material.name),
        MaterialChoice::Library { .. } => None,
    };
    let options = materials::materials()
        .into_iter()
        .map(|m| {
            let n = m.name;
            let v = n.clone();
            let s = n.clone();
            view! { <option value=v prop:selected=move || library_now().as_deref() == Some(s.as_str())>{n}</option> }
        })
        .collect_view();
    view! {
        <div class="field" class:invalid=move || mat_err.get().is_some()>
            <label for="f-material">"Material"</label>
            <select
                id="f-material"
                on:change:target=move |ev| {
                    let v = ev.target().value();
                    if !v.is_empty() {
                        form.material.set(MaterialChoice::Library { name: v });
                    }
                }
            >
                {move || own().map(|n| view! { <option value="" selected>{format!("Your own: {n}")}</option> })}
                {options}
            </select>
            <div class="msg" id="e-material" role="alert">{move || mat_err.get().unwrap_or_default()}</div>
        </div>
    }
}

/// The loss coefficients of a material (or a fit), as table rows.
pub(super) fn steinmetz_rows(prefix: &'static str, m: &magwright_engine::material::Steinmetz) -> impl IntoView {
    let id = |s: &str| format!("{prefix}-{s}");
    view! {
        <tr>
            <th scope="row" title="Pv = k·f^α·B^β, W/m³ with f in Hz and B peak in T (sinusoid)">"Steinmetz k"</th>
            <td data-testid=id("k") data-si=si_attr(m.k)>{coef(m.k)}</td>
        </tr>
        <tr><th scope="row">"α (frequency)"</th><td data-testid=id("alpha") data-si=si_attr(m.alpha)>{sig(m.alpha, 4)}</td></tr>
        <tr><th scope="row">"β (flux)"</th><td data-testid=id("beta") data-si=si_attr(m.beta)>{sig(m.beta, 4)}</td></tr>
        <tr>
            <th scope="row">"Fitted over f"</th>
            <td data-testid=id("f-range")>{format!("{} – {}", notation::format(m.f_min, "Hz", 3), notation::format(m.f_max, "Hz", 3))}</td>
        </tr>
        <tr>
            <th scope="row">"Fitted over B peak"</th>
            <td data-testid=id("b-range")>{format!("{} – {}", notation::format(m.b_min, "T", 3), notation::format(m.b_max, "T", 3))}</td>
        </tr>
    }
}

/// The data of the material in use.
#[component]
pub(super) fn MaterialData(form: Form) -> impl IntoView {
    let material = Memo::new(move |_| material_of(&form.material.get()));
    move || match material.get() {
        Err(e) => view! { <p class="bad" data-testid="material-data-error">{e.message().to_string()}</p> }.into_any(),
        Ok(m) => {
            let t_ref = m.reference_temperature();
            view! {
                <table class="data" data-testid="material-data" aria-label="Data of the material in use">
                    <tr><th scope="row">"Material"</th><td class="text" data-testid="mat-name">{m.name.clone()}</td></tr>
                    <tr><td class="text" colspan="2">{m.description.clone()}</td></tr>
                    <tr><th scope="row">"μi"</th><td data-testid="mat-mu" data-si=si_attr(m.mu_i)>{sig(m.mu_i, 4)}</td></tr>
                    {figure_n("mat-bsat25", "Bsat at 25 °C", m.bsat_25, 1e-3, "mT", 3)}
                    {figure_n("mat-bsat100", "Bsat at 100 °C", m.bsat_100, 1e-3, "mT", 3)}
                    {figure_n("mat-curie", "Curie temperature", m.curie_c, 1.0, "°C", 3)}
                    {steinmetz_rows("mat", &m.steinmetz)}
                    <tr>
                        <th scope="row" title="The temperature of least loss Tm: k holds here; Pv(T) = Pv(Tm)·(1 + c·(T − Tm)²)">"Least loss at (k holds)"</th>
                        <td data-testid="mat-tref" data-si=t_ref.map(si_attr).unwrap_or_default()>
                            {match t_ref { Some(t) => format!("{} °C", sig(t, 3)), None => "any temperature (flat)".into() }}
                        </td>
                    </tr>
                    <tr>
                        <th scope="row" title="The loss rises as 1 + c·(T − Tm)² either side of Tm (1e-4 /K²: +25 % at 50 K away)">"Curvature c"</th>
                        <td data-testid="mat-curvature" data-si=si_attr(m.temp_factor.curvature)>
                            {if m.temp_factor.is_flat() { "0 (flat)".to_string() } else { format!("{} /K²", coef(m.temp_factor.curvature)) }}
                        </td>
                    </tr>
                    {figure_n("mat-resistivity", "Resistivity", m.resistivity, 1.0, "Ω·m", 3)}
                    {figure_n("mat-density", "Density", m.density, 1.0, "kg/m³", 3)}
                </table>
                <p class="prov" data-testid="mat-provenance">{m.provenance.clone()}</p>
            }
            .into_any()
        }
    }
}

/// One entry of the user's own material.
pub(super) struct MatDef {
    /// Element key: the input's id is `f-<key>`.
    pub(super) key: &'static str,
    /// The field [`Material::validate`] names in its errors.
    pub(super) engine: &'static [&'static str],
    pub(super) label: &'static str,
    /// Unit symbol that may follow the number (and is shown beside it).
    pub(super) unit: &'static str,
    pub(super) help: &'static str,
}

/// Index of the loss-minimum temperature and of the curvature in [`OWN`]
/// (skipped when the temperature factor is flat).
pub(super) const T_REF: usize = 11;
pub(super) const CURVE: usize = 12;

pub(super) const OWN: [MatDef; 15] = [
    MatDef { key: "cm-mu", engine: &["material.mu_i"], label: "μi", unit: "", help: "Initial relative permeability" },
    MatDef { key: "cm-bsat25", engine: &["material.bsat_25"], label: "Bsat at 25 °C", unit: "T", help: "Saturation flux density at 25 °C, tesla (490m = 490 mT)" },
    MatDef { key: "cm-bsat100", engine: &["material.bsat_100"], label: "Bsat at 100 °C", unit: "T", help: "Saturation flux density at 100 °C, tesla (390m = 390 mT)" },
    MatDef { key: "cm-curie", engine: &["material.curie_c"], label: "Curie temperature", unit: "°C", help: "Where the ferrite stops being magnetic" },
    MatDef { key: "cm-k", engine: &["material.steinmetz.k"], label: "Steinmetz k", unit: "", help: "Pv = k·f^α·B^β in W/m³ with f in Hz and B peak in T (sinusoid), at the loss minimum" },
    MatDef { key: "cm-alpha", engine: &["material.steinmetz.alpha"], label: "α (frequency)", unit: "", help: "Frequency exponent of the Steinmetz law" },
    MatDef { key: "cm-beta", engine: &["material.steinmetz.beta"], label: "β (flux)", unit: "", help: "Flux exponent of the Steinmetz law" },
    MatDef { key: "cm-fmin", engine: &["material.steinmetz.f_min"], label: "Fitted from f", unit: "Hz", help: "Lowest frequency k, α, β hold at" },
    MatDef { key: "cm-fmax", engine: &["material.steinmetz.f_max"], label: "Fitted to f", unit: "Hz", help: "Highest frequency k, α, β hold at" },
    MatDef { key: "cm-bmin", engine: &["material.steinmetz.b_min"], label: "Fitted from B peak", unit: "T", help: "Lowest peak flux density k, α, β hold at" },
    MatDef { key: "cm-bmax", engine: &["material.steinmetz.b_max"], label: "Fitted to B peak", unit: "T", help: "Highest peak flux density k, α, β hold at" },
    MatDef { key: "cm-tref", engine: &["material.temp_factor.least_loss_c"], label: "Loss minimum at", unit: "°C", help: "The temperature where the loss is least; k holds there" },
    MatDef { key: "cm-curve", engine: &["material.temp_factor.curvature"], label: "Curvature c", unit: "/K²", help: "The loss rises as 1 + c·(T − Tm)² either side of the minimum (1e-4: +25 % at 50 °C away)" },
    MatDef { key: "cm-rho", engine: &["material.resistivity"], label: "Resistivity", unit: "Ω·m", help: "Bulk DC resistivity" },
    MatDef { key: "cm-density", engine: &["material.density"], label: "Density", unit: "kg/m³", help: "For the core mass" },
];

/// `v` as short text that reads back exactly: with an SI prefix where the
/// unit takes one ("490m" T, "20k" Hz), else plain or with an exponent.
pub(super) fn exact_text(v: f64, prefixed: bool) -> String {
    if !v.is_finite() {
        return String::new();
    }
    let reads_back = |t: &str| notation::parse(t, "").is_ok_and(|r| r == v);
    if prefixed && v != 0.0 {
        // Shortest digits of v, the decimal point moved by the prefix.
        let e = format!("{v:e}");
        if let Some((digits, exp)) = e.split_once('e').and_then(|(d, x)| x.parse::<i32>().ok().map(|x| (d, x))) {
            for (p, shift) in [("m", -3), ("", 0), ("k", 3), ("M", 6)] {
                if let Ok(m) = format!("{digits}e{}", exp - shift).parse::<f64>() {
                    let t = format!("{m}{p}");
                    if (1.0..1000.0).contains(&m.abs()) && reads_back(&t) {
                        return t;
                    }
                }
            }
        }
    }
    let plain = format!("{v}");
    if plain.len() <= 10 && reads_back(&plain) {
        plain
    } else {
        format!("{v:e}")
    }
}

/// The own-material entries' texts from a material, and whether its
/// temperature factor is flat.
pub(super) fn material_texts(m: &Material) -> ([String; 15], bool) {
    let s = &m.steinmetz;
    let t_ref = m.reference_temperature();
    let vals = [
        m.mu_i,
        m.bsat_25,
        m.bsat_100,
        m.curie_c,
        s.k,
        s.alpha,
        s.beta,
        s.f_min,
        s.f_max,
        s.b_min,
        s.b_max,
        t_ref.unwrap_or(100.0),
        if t_ref.is_some() { m.temp_factor.curvature } else { 1e-4 },
        m.resistivity,
        m.density,
    ];
    let texts = std::array::from_fn(|i| exact_text(vals[i], matches!(OWN[i].unit, "T" | "Hz")));
    (texts, t_ref.is_none())
}

/// What the own-material entries say: messages per entry, or the material.
#[derive(Debug, Clone, PartialEq)]
pub(super) struct MatCheck {
    /// (entry key, message).
    pub(super) errors: Vec<(&'static str, String)>,
    /// A message about no single entry.
    pub(super) general: Option<String>,
    pub(super) ok: Option<Material>,
}

/// Reads the own-material entries into a [`Material`] and has the engine
/// check it ([`Material::validate`]); its message lands at the entry of
/// the field it names.
pub(super) fn check_material(name: &str, texts: &[String; 15], flat: bool) -> MatCheck {
    let mut errors = Vec::new();
    let mut v = [0.0; 15];
    for (i, d) in OWN.iter().enumerate() {
        if flat && (i == T_REF || i == CURVE) {
            continue;
        }
        match notation::parse(&texts[i], d.unit) {
            Ok(x) => v[i] = x,
            Err(e) => errors.push((d.key, e.to_string())),
        }
    }
    if !errors.is_empty() {
        return MatCheck { errors, general: None, ok: None };
    }
    let m = Material {
        name: name.trim().to_string(),
        description: "Your own material, entered from its data".into(),
        mu_i: v[0],
        bsat_25: v[1],
        bsat_100: v[2],
        curie_c: v[3],
        steinmetz: Steinmetz { k: v[4], alpha: v[5], beta: v[6], f_min: v[7], f_max: v[8], b_min: v[9], b_max: v[10] },
        temp_factor: if flat { TempFactor::flat() } else { TempFactor::with_minimum(v[T_REF], v[CURVE]) },
        resistivity: v[13],
        density: v[14],
        provenance: "your own data".into(),
        bsat_rise_intended: false,
    };
    match m.validate() {
        Ok(()) => MatCheck { errors, general: None, ok: Some(m) },
        Err(e) => {
            let at = e.field().and_then(|f| {
                if f == "material.name" {
                    Some("cm-name")
                } else {
                    OWN.iter().find(|d| d.engine.contains(&f)).map(|d| d.key)
                }
            });
            match at {
                Some(k) => MatCheck { errors: vec![(k, e.message().to_string())], general: None, ok: None },
                None => MatCheck { errors, general: Some(e.message().to_string()), ok: None },
            }
        }
    }
}

/// The user's own material, entered field by field from its data.
#[component]
pub(super) fn OwnMaterial(form: Form) -> impl IntoView {
    let start = material_of(&form.material.get_untracked()).ok();
    let (t0, flat0) = start.as_ref().map(material_texts).unwrap_or_default();
    let name = RwSignal::new(match form.material.get_untracked() {
        MaterialChoice::Custom { material } => material.name,
        MaterialChoice::Library { .. } => "My material".to_string(),
    });
    let texts: [RwSignal<String>; 15] = std::array::from_fn(|i| RwSignal::new(t0[i].clone()));
    let flat = RwSignal::new(flat0);
    let check = Memo::new(move |_| {
        let t: [String; 15] = std::array::from_fn(|i| texts[i].get());
        check_material(&name.get(), &t, flat.get())
    });
    let error_at = move |key: &'static str| {
        Signal::derive(move || check.with(|c| c.errors.iter().find(|e| e.0 == key).map(|e| e.1.clone())))
    };
    let copy_current = move |_| {
        if let Ok(m) = material_of(&form.material.get_untracked()) {
            let (t, f) = material_texts(&m);
            for (s, v) in texts.iter().zip(t) {
                s.set(v);
            }
            flat.set(f);
            name.set(format!("{} (edited)", m.name));
        }
    };
    let applied = RwSignal::new(false);
    let use_it = move |_| {
        if let Some(material) = check.get_untracked().ok {
            form.material.set(MaterialChoice::Custom { material });
            applied.set(true);
        }
    };
    let in_use = move || {
        check.with(|c| match (&c.ok, form.material.get()) {
            (Some(m), MaterialChoice::Custom { material }) => *m == material,
            _ => false,
        })
    };
    let entry = move |i: usize| {
        let d = &OWN[i];
        let text = texts[i];
        let unit = d.unit;
        // What a typed prefix or unit was read as.
        let echo = Signal::derive(move || {
            let t = text.get();
            let plain = t.trim().parse::<f64>().is_ok();
            match notation::parse(&t, unit) {
                Ok(v) if !plain => Some(format!("= {} {unit}", exact_text(v, false)).trim_end().to_string()),
                _ => None,
            }
        });
        view! { <Entry key=d.key label=d.label unit=unit text=text error=error_at(d.key) echo=echo help=d.help /> }
    };
    view! {
        <details data-testid="own-material">
            <summary>"Your own material, by its data"</summary>
            <p class="note">"Numbers in the unit shown; SI prefixes work (490m T = 490 mT, 20k Hz, 1e-4). Steinmetz k, α, β for a sinusoid, at the loss minimum."</p>
            <div class="row-buttons">
                <button type="button" class="small" data-testid="copy-material" on:click=copy_current>"Start from the material in use"</button>
            </div>
            <div class="fields">
                <Entry key="cm-name" label="Name" unit="" text=name error=error_at("cm-name") echo=none() />
                {(0..T_REF).map(entry).collect_view()}
            </div>
            <div class="check">
                <input type="checkbox" id="f-cm-flat" prop:checked=move || flat.get()
                    on:change:target=move |ev| flat.set(ev.target().checked()) />
                <label for="f-cm-flat">"Loss does not depend on temperature (flat)"</label>
            </div>
            <div class="fields">
                <Show when=move || !flat.get()>{move || (T_REF..=CURVE).map(entry).collect_view()}</Show>
                {(CURVE + 1..OWN.len()).map(entry).collect_view()}
            </div>
            <p class="bad" role="alert" data-testid="own-material-error">{move || check.with(|c| c.general.clone()).unwrap_or_default()}</p>
            <button type="button" data-testid="use-own-material" disabled=move || check.with(|c| c.ok.is_none())
                on:click=use_it>"Use this material"</button>
            <span class="note" role="status" data-testid="own-material-state">
                {move || if in_use() { " In use." } else if applied.get() { " Changed since used: press again to use." } else { "" }}
            </span>
        </details>
    }
}

/// The example shown in the empty text box.
pub(super) const PLACEHOLDER: &str = "f  B  T  Pv\n100k 0.1 100 80k\n200k 0.1 100 195k\n100k 0.2 100 480k";

/// The user's own material: loss fitted to pasted measurements.
#[component]
pub(super) fn FittedMaterial(form: Form) -> impl IntoView {
    let text = RwSignal::new(String::new());
    let name = RwSignal::new("My fitted material".to_string());
    let pasted = Memo::new(move |_| parse_points(&text.get()));
    let result: Memo<Option<Result<(LossFit, usize), String>>> = Memo::new(move |_| {
        pasted.with(|p| match p {
            Err(m) => Some(Err(m.clone())),
            Ok(p) if p.points.is_empty() => None,
            Ok(p) => Some(
                fit::fit(&p.points)
                    .map(|f| (f, p.points.len()))
                    .map_err(|e| point_error(&e, &p.lines)),
            ),
        })
    });
    let base = Memo::new(move |_| material_of(&form.material.get()));
    let status = RwSignal::new(None::<Result<String, String>>);
    // A new fit or a new base clears the last message.
    Effect::new(move |_| {
        result.track();
        status.set(None);
    });
    let use_it = move |_| {
        let Some(Ok((lf, n))) = result.get_untracked() else {
            return;
        };
        let base = match base.get_untracked() {
            Ok(b) => b,
            Err(e) => return status.set(Some(Err(e.message().to_string()))),
        };
        let s = &lf.steinmetz;
        let outcome = lf.apply_to(&base).map(|mut m| {
            m.name = if name.get_untracked().trim().is_empty() { "Fitted material".into() } else { name.get_untracked().trim().to_string() };
            m.description = format!(
                "Loss fitted to {n} measured points ({} – {}, {} – {}); μi, saturation, Curie point, resistivity and density from {}",
                notation::format(s.f_min, "Hz", 3),
                notation::format(s.f_max, "Hz", 3),
                notation::format(s.b_min, "T", 3),
                notation::format(s.b_max, "T", 3),
                base.name
            );
            m.provenance = format!("loss from your measurements; other values from {}: {}", base.name, base.provenance);
            m
        });
        match outcome {
            Ok(m) => {
                let msg = format!("Using {} (based on {}).", m.name, base.name);
                form.material.set(MaterialChoice::Custom { material: m });
                status.set(Some(Ok(msg)));
            }
            Err(e) => status.set(Some(Err(format!("This fit cannot be used: {}", e.message())))),
        }
    };
    let shown = move || match result.get() {
        None => view! { <p class="note">"Paste measured points to fit k, α and β."</p> }.into_any(),
        Some(Err(m)) => view! { <p class="bad" role="alert" data-testid="fit-error">{m}</p> }.into_any(),
        Some(Ok((lf, n))) => {
            let temps = lf
                .temperatures
                .iter()
                .map(|t| format!("{} °C", sig(*t, 3)))
                .collect::<Vec<_>>()
                .join(", ");
            view! {
                <table class="data" data-testid="fit-result" aria-label="The fitted loss model">
                    <tr><th scope="row">"Points"</th><td data-testid="fit-n" data-si=n.to_string()>{n}</td></tr>
                    {steinmetz_rows("fit", &lf.steinmetz)}
                    {figure_n("fit-tref", "k holds at", lf.reference_temperature, 1.0, "°C", 3)}
                    <tr><th scope="row">"Temperatures"</th><td class="text">{temps}</td></tr>
                    <tr><th scope="row">"Largest error"</th><td data-testid="fit-max-err" data-si=si_attr(lf.max_error_pct)>{pct(lf.max_error_pct)}</td></tr>
                    <tr><th scope="row">"RMS error"</th><td data-testid="fit-rms-err" data-si=si_attr(lf.rms_error_pct)>{pct(lf.rms_error_pct)}</td></tr>
                </table>
                <ul class="notes" data-testid="fit-notes">{lf.notes.iter().map(|n| view! { <li>{n.clone()}</li> }).collect_view()}</ul>
            }
            .into_any()
        }
    };
    let base_name = move || base.get().map(|b| b.name).unwrap_or_else(|e| e.message().to_string());
    view! {
        <details data-testid="fit-material">
            <summary>"Your own material, fitted to measured loss"</summary>
            <label for="f-fit-points" class="note">
                "One measured point per line: f (Hz), B peak (T), temperature (°C), Pv (W/m³), sinusoidal flux. "
                "SI prefixes work (100k 0.1 100 80k); spaces, tabs, commas or semicolons separate; a header line is skipped."
            </label>
            <textarea id="f-fit-points" data-testid="fit-points" spellcheck="false" placeholder=PLACEHOLDER
                prop:value=move || text.get() on:input:target=move |ev| text.set(ev.target().value())></textarea>
            {shown}
            <div class="fields">
                <Entry key="fit-name" label="Name" unit="" text=name error=none() echo=none() />
            </div>
            <p class="note">"μi, saturation, Curie point, resistivity and density come from "<strong>{base_name}</strong>", the material in use."</p>
            <button type="button" data-testid="fit-use" disabled=move || !matches!(result.get(), Some(Ok(_)))
                on:click=use_it>"Use this material"</button>
            <p role="status" data-testid="fit-status" class:bad=move || matches!(status.get(), Some(Err(_)))>
                {move || match status.get() { Some(Ok(m)) | Some(Err(m)) => m, None => String::new() }}
            </p>
        </details>
    }
}
