//! Per-trial cost of `draftwire spread` (issue 9): a batch of Monte Carlo
//! trials on a King's-law example and on a geometry-cooled wire, worst case
//! included. The figure per trial is the median over the batch size; the
//! whole-process timings are in docs/performance.md. Run with `cargo bench`.

use draftwire::analysis::size::{size_core, SizedCore};
use draftwire::analysis::spread::{spread, SpreadOptions};
use draftwire::design::model::Design;

fn main() {
    divan::main();
}

fn sized(example: &str) -> (Design, SizedCore) {
    let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("examples")
        .join(example);
    let text = std::fs::read_to_string(path).expect("example");
    let design = draftwire::design::parse_design(example, &text).expect("design");
    let design = draftwire::analysis::choice::resolve(&design).design;
    let core = size_core(&design).expect("sized");
    (design, core)
}

fn run(bencher: divan::Bencher, example: &str, trials: u64) {
    let (design, core) = sized(example);
    bencher
        .counter(divan::counter::ItemsCount::new(trials))
        .bench(|| {
            spread(
                &design,
                &core,
                SpreadOptions { trials, seed: 1 },
                &|_| {},
                None,
            )
        });
}

/// 64 000 trials of the King's-law server-cabinet example (2 threads).
#[divan::bench(sample_count = 5)]
fn spread_kings_law_64k_trials(bencher: divan::Bencher) {
    run(bencher, "server-cabinet-airflow.toml", 64_000);
}

/// 2 000 trials of the geometry-cooled duct wire (2 threads).
#[divan::bench(sample_count = 5)]
fn spread_geometry_2k_trials(bencher: divan::Bencher) {
    run(bencher, "duct-platinum-wire.toml", 2_000);
}
