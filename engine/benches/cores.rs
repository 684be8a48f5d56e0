//! Benchmark (not a test): cores. Prints the time per call.
//! Run with `cargo bench -p magwright-engine --bench cores`.

fn main() {
    println!("cores: no workloads yet");
}
