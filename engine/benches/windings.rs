//! Benchmark (not a test): windings. Prints the time per call.
//! Run with `cargo bench -p magwright-engine --bench windings`.

fn main() {
    println!("windings: no workloads yet");
}
