//! The CLI's help text, in one place (argument parsing lives in `main`).

/// `magwright help` / `-h` / `--help`: every command, argument and option.
pub fn help() -> String {
    format!(
        "\
magwright: designs ferrite transformers for switch-mode converters from a design file (JSON).

usage: magwright COMMAND [ARGUMENTS]

commands:
  evaluate FILE|-                   evaluate a design file; prints the report (JSON)
  sweep FILE|- [FROM TO POINTS] [--as-wound] [--envelope] [--every-core] [--csv]
                                    loss against switching frequency, FROM to TO Hz in POINTS
                                    log-spaced steps (default 20k 1M 200); values take SI
                                    prefixes (200k, 1M). The design redesigned at each
                                    frequency (turns, gap, wire, stack-up redone). Points where
                                    the material's loss data do not hold are marked
                                    \"in_data\": false, never feasible, never the minimum;
                                    \"minimum_limits\" says when the minimum is held there
                                    by the data's end, a check or the range swept.
    --as-wound                      also this transformer as wound (turns, conductors and
                                    stack-up fixed) at each frequency: what a bench shows
    --envelope                      also the least loss over every library material at each
                                    frequency, the material named at each point
    --every-core                    the envelope over every library core of the design's
                                    family too (implies --envelope)
    --csv                           one curve as CSV instead of JSON: the redesigned one, or
                                    the one --as-wound or --envelope asks for
                                    JSON: the redesigned sweep alone, or with --as-wound or
                                    --envelope {{\"redesigned\", \"as_wound\", \"envelope\"}}
  flux-sweep FILE|- [POINTS]        loss against peak flux density at the design's frequency
                                    (default 60 points)
  optimise FILE|-                   the optimiser: every library core x material for the
                                    design's spec, ranked, with the Pareto front (JSON)
  stackup FILE|-                    the design's winding stack-up in its JSON schema
  demo [KIND]                       print a demo design file: forward (default), flyback,
                                    push-pull or inductor
  cores                             the core library (effective parameters, provenance)
  materials                         the material library (loss model, provenance)
  help, -h, --help                  this text

FILE is a design file (docs/design-file.md); - reads it from stdin. Older design-file
versions are converted on reading, with a note on stderr.
Output is JSON on stdout (CSV with sweep --csv). Bad input: a message on stderr naming
the field, and exit code 2.

Temperatures: the core temperature is the mean surface temperature of McLyman's
surface-dissipation model (Transformer and Inductor Design Handbook): total loss over
the exposed surface. The winding's hottest point runs higher; leave margin.

{}
",
        magwright_engine::topology::spec::STANDING_CAUTION
    )
}
