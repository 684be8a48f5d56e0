//! Every refusal of a design file names the full path of the offending
//! value (issue 14): a table of mutated files, each with the path its error
//! must name, and a sweep that puts a misspelt key into every object of
//! files that use every kind of entry. The paths are those of the file's
//! own schema (docs/design-file.md); no outside source.

use magwright_engine::design::Design;
use magwright_engine::material::library as materials;
use serde_json::{json, Value};

fn base(which: &str) -> Value {
    let d = match which {
        "forward" => Design::demo_forward(),
        "flyback" => Design::demo_flyback(),
        _ => Design::demo_push_pull(),
    };
    serde_json::from_str(&d.to_json()).unwrap()
}

/// Designs that between them hold every kind of entry: own core (by
/// parameters, by shape), own material, fixed turns, fixed wires of each
/// kind, a custom order, an AC input with each kind of bulk, each flyback
/// ratio, an insulation margin.
fn full_designs() -> Vec<Value> {
    let mut out = Vec::new();
    let mut a = base("forward");
    a["core"] = json!({"from": "effective", "designation": "mine", "parameters": {
        "family": "E", "ae": 97e-6, "le": 78.6e-3, "window_area": 171e-6, "winding_breadth": 20.8e-3,
        "winding_height": 6.6e-3, "turn_length_inner": 53e-3, "surface_area": 5.2e-3, "ve": 7.64e-6,
        "amin": 91e-6, "window_height": 23.6e-3, "mass": 40e-3}});
    let m = serde_json::to_value(materials::find("MnZn-200k").unwrap()).unwrap();
    a["material"] = json!({"from": "custom", "material": m});
    a["choices"]["turns"] = json!({"rule": "primary", "turns": 9});
    a["choices"]["wires"] = json!([
        {"winding": "primary", "wire": {"kind": "round", "awg": 24, "parallel": 2}},
        {"winding": "secondary 1", "wire": {"kind": "foil", "thickness": 0.1e-3}}]);
    a["choices"]["interleave"] = json!("custom");
    a["choices"]["section_order"] = json!([{"winding": "primary", "turns": 4}, {"winding": "secondary 1"}, {"winding": "primary"}]);
    a["choices"]["insulation"]["margin"] = json!(2e-3);
    out.push(a);
    let mut b = base("flyback");
    b["core"] = json!({"from": "shape", "designation": "ring", "shape": {"family": "ring", "outer_diameter": 25e-3, "inner_diameter": 15e-3, "height": 10e-3}});
    b["choices"]["wires"] = json!([
        {"winding": "primary", "wire": {"kind": "litz", "strands": 40, "strand_awg": 40}},
        {"winding": "secondary 1", "wire": {"kind": "triple_insulated", "awg": 24, "parallel": 1}}]);
    b["spec"]["flyback"]["ratio"] = json!({"kind": "turns_ratio", "value": 8.0});
    out.push(b);
    let mut c = base("flyback");
    c["spec"]["input"]["bulk"] = json!({"kind": "ripple_ratio", "ratio": 0.3});
    c["spec"]["flyback"]["ratio"] = json!({"kind": "reflected_voltage", "value": 100.0});
    c["choices"]["turns"] = json!({"rule": "fewest_turns"});
    out.push(c);
    out.push(base("push-pull"));
    out
}

fn load(v: &Value) -> Result<Design, magwright_engine::Error> {
    Design::load(&serde_json::to_string_pretty(v).unwrap())
}

#[test]
fn full_designs_load() {
    for v in full_designs() {
        load(&v).unwrap_or_else(|e| panic!("{e}\n{v:#}"));
    }
}

/// Every object of every file, given a misspelt key: refused, the error
/// names the key by its full path and its line, and (where one is near)
/// suggests the valid key it was likely meant to be.
#[test]
fn a_misspelt_key_is_refused_at_every_level() {
    fn objects(v: &Value, path: String, out: &mut Vec<(String, Vec<String>)>) {
        match v {
            Value::Object(m) => {
                out.push((path.clone(), m.keys().cloned().collect()));
                for (k, x) in m {
                    objects(x, if path.is_empty() { k.clone() } else { format!("{path}.{k}") }, out);
                }
            }
            Value::Array(a) => {
                for (i, x) in a.iter().enumerate() {
                    objects(x, format!("{path}[{i}]"), out);
                }
            }
            _ => {}
        }
    }
    fn at<'a>(v: &'a mut Value, path: &str) -> &'a mut Value {
        let mut cur = v;
        for seg in path.split('.').filter(|s| !s.is_empty()) {
            let (key, idx) = match seg.find('[') {
                Some(i) => (&seg[..i], Some(seg[i + 1..seg.len() - 1].parse::<usize>().unwrap())),
                None => (seg, None),
            };
            cur = &mut cur[key];
            if let Some(i) = idx {
                cur = &mut cur[i];
            }
        }
        cur
    }
    let mut levels = 0;
    for v in full_designs() {
        let mut objs = Vec::new();
        objects(&v, String::new(), &mut objs);
        for (path, keys) in objs {
            // A misspelling of a real key (a letter doubled) where there is
            // one other than the tag, else an invented key.
            let real = keys.iter().find(|k| !matches!(k.as_str(), "kind" | "from" | "rule" | "family") && k.len() > 3);
            let bogus = real.map_or("zzqx_unknown".to_string(), |k| format!("{k}{}", &k[k.len() - 1..]));
            let mut w = v.clone();
            at(&mut w, &path).as_object_mut().unwrap().insert(bogus.clone(), json!(1));
            let text = serde_json::to_string_pretty(&w).unwrap();
            let e = Design::load(&text).expect_err(&format!("{path}.{bogus} accepted"));
            let want = if path.is_empty() { bogus.clone() } else { format!("{path}.{bogus}") };
            assert_eq!(e.field(), Some(want.as_str()), "{e}");
            let line = 1 + text.lines().position(|l| l.contains(&format!("\"{bogus}\""))).unwrap();
            assert!(e.message().contains(&format!("(line {line})")), "{want}: {e}");
            if let Some(k) = real {
                assert!(e.message().contains(&format!("did you mean \"{k}\"")), "{want}: {e}");
            }
            levels += 1;
        }
    }
    assert!(levels > 30, "{levels}");
}

#[test]
fn every_refusal_names_its_path() {
    // (design, JSON pointer, new value or None to remove, expected path)
    let bad_out = json!([{"voltage": 12.0, "current": 10.0, "rectifier_drop": 0.5}, {"voltage": 5.0, "current": "x", "rectifier_drop": 0.5}]);
    let many: Vec<Value> = (0..1000).map(|_| json!({"voltage": 5.0, "current": 1.0, "rectifier_drop": 0.5})).collect();
    let table: Vec<(usize, &str, Option<Value>, &str)> = vec![
        (0, "/spec/input/min", Some(json!("a")), "spec.input.min"),
        (0, "/spec/input/min", Some(json!(-5.0)), "spec.input.min"),
        (0, "/spec/input/max", None, "spec.input.max"),
        (0, "/spec/input/kind", Some(json!("dcc")), "spec.input.kind"),
        (0, "/spec/frequency", None, "spec.frequency"),
        (0, "/spec/frequency", Some(json!("200k")), "spec.frequency"),
        (0, "/spec/frequency", Some(json!(0.0)), "spec.frequency"),
        (0, "/spec/duty_max", Some(json!(0.99)), "spec.duty_max"),
        (0, "/spec/topology", Some(json!("flybak")), "spec.topology"),
        (0, "/spec/isolation", Some(json!(3)), "spec.isolation"),
        (0, "/spec/outputs", Some(Value::Array(many)), "spec.outputs"),
        (0, "/spec/outputs", Some(json!([])), "spec.outputs"),
        (0, "/spec/outputs/0/voltage", Some(json!(0.0)), "spec.outputs[0].voltage"),
        (0, "/spec/outputs/0/current", Some(json!(null)), "spec.outputs[0].current"),
        (0, "/spec/outputs", Some(bad_out), "spec.outputs[1].current"),
        (1, "/spec/input/bulk/farads", Some(json!("x")), "spec.input.bulk.farads"),
        (1, "/spec/input/bulk/farads", Some(json!(-1.0)), "spec.input.bulk.farads"),
        (1, "/spec/input/vac_min", Some(json!(true)), "spec.input.vac_min"),
        (1, "/spec/input/bridge_drop", None, "spec.input.bridge_drop"),
        (1, "/spec/flyback/ratio/value", Some(json!("x")), "spec.flyback.ratio.value"),
        (1, "/spec/flyback/ratio/value", Some(json!(-8.0)), "spec.flyback.ratio"),
        (1, "/spec/flyback/ripple_ratio", Some(json!(-1.0)), "spec.flyback.ripple_ratio"),
        (0, "/choices/turns", Some(json!({"rule": "primary", "turns": -3})), "choices.turns.turns"),
        (0, "/choices/turns", Some(json!({"rule": "primary", "turns": 2.5})), "choices.turns.turns"),
        (0, "/choices/turns", Some(json!({"rule": "primary", "turns": 0})), "choices.turns.turns"),
        (0, "/choices/turns", Some(json!({"rule": "primary"})), "choices.turns.turns"),
        (0, "/choices/turns", Some(json!({"rule": "fewest_turn"})), "choices.turns.rule"),
        (0, "/choices/saturation_margin", Some(json!("x")), "choices.saturation_margin"),
        (0, "/choices/saturation_margin", Some(json!(2.0)), "choices.saturation_margin"),
        (0, "/choices/edge_time", Some(json!("fast")), "choices.edge_time"),
        (0, "/choices/insulation/section_wraps", Some(json!(-1)), "choices.insulation.section_wraps"),
        (0, "/choices/insulation/section_wraps", Some(json!(1.5)), "choices.insulation.section_wraps"),
        (0, "/choices/insulation/outer_wraps", Some(json!(50)), "choices.insulation.outer_wraps"),
        (0, "/choices/insulation/tape_thickness", Some(json!(0.0)), "choices.insulation.tape_thickness"),
        (1, "/choices/wires/1/wire/awg", Some(json!("x")), "choices.wires[1].wire.awg"),
        (1, "/choices/wires/1/wire/awg", Some(json!(99)), "choices.wires[1].wire.awg"),
        (0, "/choices/wires/0/wire/parallel", Some(json!(0)), "choices.wires[0].wire.parallel"),
        (0, "/choices/wires/0/wire/parallel", Some(json!(-2)), "choices.wires[0].wire.parallel"),
        (0, "/choices/wires/1/wire", Some(json!({"kind": "foil", "thickness": 1.0})), "choices.wires[1].wire.thickness"),
        (0, "/choices/wires/1/wire", Some(json!({"kind": "litz", "strands": 0, "strand_awg": 40})), "choices.wires[1].wire.strands"),
        (0, "/choices/wires/1/wire", Some(json!({"kind": "litz", "strands": 9, "strand_awg": 99})), "choices.wires[1].wire.strand_awg"),
        (0, "/choices/wires/1/wire", Some(json!({"kind": "lits", "strands": 9, "strand_awg": 40})), "choices.wires[1].wire.kind"),
        (0, "/choices/wires/1/winding", Some(json!(7)), "choices.wires[1].winding"),
        (0, "/choices/section_order/0/turns", Some(json!(-1)), "choices.section_order[0].turns"),
        (0, "/core/parameters/ae", Some(json!("x")), "core.parameters.ae"),
        (0, "/core/parameters/ae", Some(json!(0.0)), "core.parameters.ae"),
        (0, "/core/parameters/le", None, "core.parameters.le"),
        (0, "/core/parameters/mass", Some(json!(-1.0)), "core.parameters.mass"),
        (1, "/core/shape/outer_diameter", Some(json!("x")), "core.shape.outer_diameter"),
        (1, "/core/shape/family", Some(json!("rign")), "core.shape.family"),
        (0, "/core/from", Some(json!("efective")), "core.from"),
        (2, "/core/designation", Some(json!("no such core")), "core.designation"),
        (2, "/material/name", Some(json!("no such material")), "material.name"),
        (0, "/material/material/bsat_25", Some(json!("x")), "material.material.bsat_25"),
        (0, "/material/material/mu_i", Some(json!(0.0)), "material.material.mu_i"),
        (0, "/material/material/bsat_100", Some(json!(0.0)), "material.material.bsat_100"),
        (0, "/material/material/steinmetz/alpha", Some(json!("x")), "material.material.steinmetz.alpha"),
        (0, "/material/material/steinmetz/k", Some(json!(-1.0)), "material.material.steinmetz.k"),
        (0, "/material/material/temp_factor/curvature", None, "material.material.temp_factor.curvature"),
        (0, "/material/material/temp_factor/curvature", Some(json!(-1e-4)), "material.material.temp_factor.curvature"),
        (0, "/material/material/temp_factor/least_loss_c", Some(json!(400.0)), "material.material.temp_factor.least_loss_c"),
        (2, "/version", Some(json!(99)), "version"),
        (2, "/schema", Some(json!("other")), "schema"),
        (2, "/name", Some(json!(5)), "name"),
    ];
    let designs = full_designs();
    let mut wrong = Vec::new();
    for (i, ptr, new, want) in &table {
        let mut v = designs[*i].clone();
        match new {
            Some(x) => *v.pointer_mut(ptr).unwrap_or_else(|| panic!("{ptr}")) = x.clone(),
            None => {
                let (parent, key) = ptr.rsplit_once('/').unwrap();
                v.pointer_mut(parent).unwrap().as_object_mut().unwrap().remove(key).unwrap();
            }
        }
        match load(&v) {
            Ok(_) => wrong.push(format!("{ptr} = {new:?}: accepted")),
            Err(e) if e.field() != Some(*want) => wrong.push(format!("{ptr}: want {want}, got {e}")),
            Err(_) => {}
        }
    }
    assert!(wrong.is_empty(), "{} of {} wrong:\n{}", wrong.len(), table.len(), wrong.join("\n"));
}

/// The stack-up file (docs/stackup.md): a misspelt key in any of its objects
/// is refused with its path and the key it was likely meant to be.
#[test]
fn stackup_misspelt_key_at_every_level() {
    let r = magwright_engine::design::evaluate(&Design::demo_forward()).unwrap();
    let good: Value = serde_json::from_str(&r.stackup_json).unwrap();
    fn objects(v: &Value, path: String, out: &mut Vec<(String, Vec<String>)>) {
        match v {
            Value::Object(m) => {
                out.push((path.clone(), m.keys().cloned().collect()));
                for (k, x) in m {
                    objects(x, if path.is_empty() { k.clone() } else { format!("{path}.{k}") }, out);
                }
            }
            Value::Array(a) => a.iter().enumerate().for_each(|(i, x)| objects(x, format!("{path}[{i}]"), out)),
            _ => {}
        }
    }
    let mut objs = Vec::new();
    objects(&good, String::new(), &mut objs);
    assert!(objs.len() > 5);
    for (path, keys) in objs {
        let Some(k) = keys.iter().find(|k| k.len() > 4 && k.as_str() != "schema") else { continue };
        let bogus = format!("{k}{}", &k[k.len() - 1..]);
        let mut w = good.clone();
        let ptr = format!("/{}", path.replace(['.', '['], "/").replace(']', ""));
        let obj = if path.is_empty() { &mut w } else { w.pointer_mut(&ptr).unwrap() };
        obj.as_object_mut().unwrap().insert(bogus.clone(), json!(1));
        let e = magwright_engine::winding::stackup::from_json(&w.to_string()).expect_err(&bogus);
        let want = if path.is_empty() { bogus.clone() } else { format!("{path}.{bogus}") };
        assert_eq!(e.field(), Some(want.as_str()), "{e}");
        assert!(e.message().contains(&format!("did you mean \"{k}\"")), "{e}");
    }
}
