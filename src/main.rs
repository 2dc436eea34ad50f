//! The `draftwire` binary: all it does is run the command line.

mod cli;

fn main() -> std::process::ExitCode {
    cli::run()
}
