//! Benchmark (not a test): design. Prints the time per call.
//! Run with `cargo bench -p magwright-engine --bench design`.

fn main() {
    println!("design: no workloads yet");
}
