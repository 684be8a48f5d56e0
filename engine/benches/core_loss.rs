//! Benchmark (not a test): core_loss. Prints the time per call.
//! Run with `cargo bench -p magwright-engine --bench core_loss`.

fn main() {
    println!("core_loss: no workloads yet");
}
