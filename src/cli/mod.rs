//! The command line: parse arguments, read files, call the library, render,
//! write, and map the outcome to an exit status (0 pass, 1 a design check
//! failed, 2 bad input or usage).

mod compare;
mod fit;
mod netlist;
mod spread;
mod sweep;
mod transient;

use clap::{Parser, Subcommand, ValueEnum};
use draftwire::render;
use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

/// Design calculator for airflow and draught detectors built around a
/// self-heated resistive element.
#[derive(Debug, Parser)]
#[command(
    name = "draftwire",
    version,
    about,
    long_about = None,
    after_help = "Exit status: 0 every check passed, 1 a design check failed, 2 bad input or usage.\nThe manual: `draftwire man` (roff); the design-file, CLI and model references are the docs/ folder of the source distribution."
)]
struct Cli {
    /// Write the result to this file instead of standard output.
    #[arg(short = 'o', long = "output", global = true, value_name = "FILE")]
    output: Option<PathBuf>,
    /// Override a design-file key: KEY=VALUE with the key dotted as in the
    /// file and the value as the file would hold it, without quotes
    /// (repeatable), e.g. --set 'detector.trip_airflow=0.4 m/s'.
    #[arg(long = "set", global = true, value_name = "KEY=VALUE")]
    set: Vec<String>,
    #[command(subcommand)]
    command: Command,
}

/// The `--set` overrides, parsed once.
static OVERRIDES: std::sync::OnceLock<Vec<draftwire::design::overrides::Override>> =
    std::sync::OnceLock::new();

/// Read a design with the command line's overrides.
fn parse_with_overrides(
    file: &str,
    source: &str,
) -> Result<draftwire::design::Design, Box<draftwire::design::Diagnostic>> {
    draftwire::design::parse_design_with(file, source, OVERRIDES.get().map_or(&[], |v| v))
}

/// Read a design file and parse it with the command line's overrides; on
/// failure the error is already written, and its exit status comes back.
fn load_design(
    path: &Path,
    file: &str,
    format: Format,
) -> Result<draftwire::design::Design, ExitCode> {
    let source = read(path).map_err(|e| input_error(format, &e, None))?;
    parse_with_overrides(file, &source)
        .map_err(|d| input_error(format, &format!("error: {d}"), Some(&d)))
}

/// Where results go: `-o FILE`, or standard output.
static OUTPUT: std::sync::OnceLock<Option<PathBuf>> = std::sync::OnceLock::new();

#[derive(Debug, Subcommand)]
enum Command {
    /// Size and check a design: operating points, trip point, bill of values, checks, cautions.
    Size {
        /// The design file (TOML).
        design: PathBuf,
        /// Output format.
        #[arg(long, value_enum, default_value_t = Format::Text)]
        format: Format,
        /// Which table to write with --format csv.
        #[arg(long, value_enum, default_value_t = CsvTable::Values)]
        table: CsvTable,
        /// Unit of airflow in the text report (JSON and CSV stay in m/s).
        #[arg(long = "airflow-unit", value_enum, default_value_t = AirUnit::MPerS)]
        airflow_unit: AirUnit,
    },
    /// Spread of the trip point over part tolerances, ambient and supply: worst case and a seeded Monte Carlo.
    Spread {
        /// The design file (TOML).
        design: PathBuf,
        /// Number of Monte Carlo trials.
        #[arg(long, default_value_t = draftwire::analysis::spread::DEFAULT_TRIALS)]
        trials: u64,
        /// Seed of the random streams (echoed in the report).
        #[arg(long, default_value_t = draftwire::analysis::spread::DEFAULT_SEED)]
        seed: u64,
        /// Output format.
        #[arg(long, value_enum, default_value_t = Format::Text)]
        format: Format,
        /// Also write every trial to this CSV file.
        #[arg(long = "trials-csv")]
        trials_csv: Option<PathBuf>,
    },
    /// Step a design-file key over a range (a second key makes a grid), sizing and checking each point.
    Sweep {
        /// The design file (TOML).
        design: PathBuf,
        /// KEY FROM TO, e.g. detector.trip_airflow "0.2 m/s" "0.6 m/s"; twice for a grid.
        #[arg(num_args = 3..=6, required = true)]
        spec: Vec<String>,
        /// Points per key (the last one is exactly TO).
        #[arg(long, default_value_t = 11)]
        points: usize,
        /// Geometric steps instead of equal ones.
        #[arg(long)]
        log: bool,
        /// Size the design once at its own values and sweep that built circuit.
        #[arg(long = "hold-values")]
        hold_values: bool,
        /// Output format.
        #[arg(long, value_enum, default_value_t = Format::Text)]
        format: Format,
    },
    /// Run the sized design in time: power-on from a cold element, a step of airflow, a puff, or a recorded airflow history.
    Transient {
        /// The design file (TOML).
        design: PathBuf,
        /// power-on, step or puff.
        #[arg(long)]
        scenario: Option<String>,
        /// Step: the airflow to step to, e.g. "0.5 m/s".
        #[arg(long)]
        to: Option<String>,
        /// Puff: its peak airflow, e.g. "1 m/s".
        #[arg(long)]
        peak: Option<String>,
        /// Puff: how long it lasts, e.g. "0.3 s".
        #[arg(long)]
        duration: Option<String>,
        /// Puff: rectangular or half-sine.
        #[arg(long, value_enum, default_value_t = PuffShape::Rectangular)]
        shape: PuffShape,
        /// An airflow history: CSV with columns time_s,airflow_m_per_s.
        #[arg(long = "airflow-file")]
        airflow_file: Option<PathBuf>,
        /// Also write the first run's time series to this CSV file.
        #[arg(long)]
        samples: Option<PathBuf>,
        /// Output format (csv: the events).
        #[arg(long, value_enum, default_value_t = Format::Text)]
        format: Format,
    },
    /// Fit the element's cooling to bench readings: King's law from airflow readings, or R0 and the still-air conductance from readings at two or more currents.
    Fit {
        /// The readings (CSV with a header; units in the column names).
        readings: PathBuf,
        /// The design whose element's resistance law turns resistance into temperature.
        #[arg(long)]
        design: PathBuf,
        /// Output format (csv: the residuals).
        #[arg(long, value_enum, default_value_t = Format::Text)]
        format: Format,
    },
    /// Write the sized circuit as a SPICE netlist (ngspice) or an SVG schematic.
    Netlist {
        /// The design file (TOML).
        design: PathBuf,
        /// Write a SPICE netlist (the default).
        #[arg(long, conflicts_with = "svg")]
        spice: bool,
        /// Write an SVG schematic instead.
        #[arg(long)]
        svg: bool,
        /// DC value of the airflow source VAIRFLOW, e.g. "0.5 m/s" (default: the trip airflow).
        #[arg(long)]
        airflow: Option<String>,
        /// Add a .control block that runs the analyses (otherwise they are comments).
        #[arg(long, conflicts_with = "svg")]
        analyses: bool,
    },
    /// Write a commented starter design (example values) that `size` accepts.
    New {
        /// The element it starts from.
        #[arg(long, value_enum, default_value_t = NewElement::Wire)]
        element: NewElement,
        /// The load it drives.
        #[arg(long, value_enum, default_value_t = NewLoad::Led)]
        load: NewLoad,
        /// Overwrite the file given with -o if it exists.
        #[arg(long)]
        force: bool,
    },
    /// Print shell completions for bash, zsh, fish, powershell or elvish.
    Completions {
        /// The shell.
        shell: clap_complete::Shell,
    },
    /// Print the manual page (roff), e.g. `draftwire man > draftwire.1`.
    Man,
    /// Compare candidate elements side by side in the design's drive and detector.
    Compare {
        /// The design file (TOML); its own element is the first candidate.
        design: PathBuf,
        /// Files of candidates: design files or files of [[candidate]] tables.
        #[arg(long = "candidates", num_args = 1..)]
        candidates: Vec<PathBuf>,
        /// Output format.
        #[arg(long, value_enum, default_value_t = Format::Text)]
        format: Format,
    },
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
enum PuffShape {
    /// Constant at the peak for the duration.
    Rectangular,
    /// Half a sine wave from the base to the peak and back.
    HalfSine,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
enum NewElement {
    /// A bare lamp filament (rating and cold resistance).
    Lamp,
    /// A fine metal wire (geometry cooling).
    Wire,
    /// A self-heated NTC thermistor (data-sheet constants).
    Thermistor,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
enum NewLoad {
    /// An indicator LED.
    Led,
    /// A DC buzzer.
    Buzzer,
    /// A relay coil.
    Relay,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
enum Format {
    /// Aligned text for people.
    Text,
    /// JSON, units in the key names.
    Json,
    /// CSV (for `size`, one table: see --table).
    Csv,
    /// An SVG picture (size: transfer curve and drift; spread: histogram;
    /// sweep: the swept outputs).
    Svg,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
enum AirUnit {
    /// Metres per second.
    #[value(name = "m/s")]
    MPerS,
    /// Feet per minute.
    #[value(name = "ft/min")]
    FtPerMin,
    /// Centimetres per second.
    #[value(name = "cm/s")]
    CmPerS,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
enum CsvTable {
    /// The bill of values.
    Values,
    /// The operating points.
    OperatingPoints,
    /// The checks.
    Checks,
    /// The trip-point drift.
    Drift,
    /// The connection list.
    Connections,
}

/// Exit status: every check passed.
const EXIT_PASS: u8 = 0;
/// Exit status: a design check failed.
const EXIT_DESIGN_FAIL: u8 = 1;
/// Exit status: bad input or usage.
const EXIT_INPUT: u8 = 2;

/// Write the result to `-o FILE` or to stdout; a closed pipe
/// (`draftwire … | head`) is a normal end.
fn emit(text: &str) -> bool {
    if let Some(Some(path)) = OUTPUT.get() {
        return match std::fs::write(path, text) {
            Ok(()) => true,
            Err(e) => {
                eprintln!("error: -o: cannot write {}: {e}", path.display());
                false
            }
        };
    }
    let stdout = std::io::stdout();
    let mut lock = stdout.lock();
    match lock.write_all(text.as_bytes()).and_then(|_| lock.flush()) {
        Ok(()) => true,
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => true,
        Err(e) => {
            eprintln!("error: cannot write output: {e}");
            false
        }
    }
}

/// Bad input: the message on stderr and exit 2; with `--format json` also a
/// JSON error object on stdout, so a script always gets JSON.
fn input_error(
    format: Format,
    message: &str,
    diag: Option<&draftwire::design::Diagnostic>,
) -> ExitCode {
    eprintln!("{message}");
    if format == Format::Json {
        let error = serde_json::json!({
            "kind": "input",
            "message": message.trim_start_matches("error: "),
            "file": diag.map(|d| d.file.clone()),
            "line": diag.and_then(|d| d.line),
            "column": diag.and_then(|d| d.column),
            "field": diag.and_then(|d| d.field.clone()),
        });
        let doc = serde_json::json!({
            "schema_version": draftwire::report::SCHEMA_VERSION,
            "tool_version": env!("CARGO_PKG_VERSION"),
            "passed": false,
            "error": error,
        });
        let _ = emit(&format!(
            "{}\n",
            serde_json::to_string_pretty(&doc).unwrap_or_default()
        ));
    }
    ExitCode::from(EXIT_INPUT)
}

/// The terminal's width for text reports: `COLUMNS` when it holds a
/// sensible number (40–400), else 100.
fn terminal_width() -> usize {
    std::env::var("COLUMNS")
        .ok()
        .and_then(|c| c.trim().parse::<usize>().ok())
        .filter(|w| (40..=400).contains(w))
        .unwrap_or(render::text::DEFAULT_WIDTH)
}

/// Exit 0 when the output was written, 2 when it could not be.
fn exit_after(written: bool) -> ExitCode {
    ExitCode::from(if written { EXIT_PASS } else { EXIT_INPUT })
}

/// Whether a path argument means standard input.
fn is_stdin(path: &Path) -> bool {
    path.as_os_str() == "-"
}

/// The name a file is shown by in messages and reports (`<stdin>` for `-`).
fn shown_name(path: &Path) -> String {
    if is_stdin(path) {
        "<stdin>".into()
    } else {
        path.display().to_string()
    }
}

/// Read a design or candidates file; `-` reads standard input.
fn read(path: &Path) -> Result<String, String> {
    if is_stdin(path) {
        let mut s = String::new();
        return std::io::Read::read_to_string(&mut std::io::stdin(), &mut s)
            .map(|_| s)
            .map_err(|e| format!("error: cannot read the design from standard input: {e}"));
    }
    let bytes = std::fs::read(path)
        .map_err(|e| format!("error: cannot read design file {}: {e}", path.display()))?;
    if bytes.len() > MAX_DESIGN_BYTES {
        return Err(format!(
            "error: {}: {} bytes is far larger than a design file (a few kilobytes); draftwire reads at most {MAX_DESIGN_BYTES} bytes",
            path.display(),
            bytes.len()
        ));
    }
    String::from_utf8(bytes).map_err(|e| {
        let at = e.utf8_error().valid_up_to();
        let good = &e.as_bytes()[..at];
        let line = good.iter().filter(|&&b| b == b'\n').count() + 1;
        let line_start = good.iter().rposition(|&b| b == b'\n').map_or(0, |i| i + 1);
        let column = String::from_utf8_lossy(&good[line_start..]).chars().count() + 1;
        format!(
            "error: {}:{line}:{column}: not UTF-8 text: invalid byte 0x{:02X} at byte offset {at}; save the design file as UTF-8",
            path.display(),
            e.as_bytes()[at]
        )
    })
}

/// Largest design file read, bytes: a design is a few kilobytes, and a
/// file thousands of times larger is a mistake that would only cost time
/// (draftwire's limit).
const MAX_DESIGN_BYTES: usize = 1 << 20;

/// Read a data file (readings, an airflow history) as UTF-8, with a
/// message that names it (no "error:" prefix: the caller adds one).
fn read_data(path: &Path, what: &str) -> Result<String, String> {
    let bytes = if is_stdin(path) {
        let mut b = Vec::new();
        std::io::Read::read_to_end(&mut std::io::stdin(), &mut b)
            .map_err(|e| format!("cannot read the {what} from standard input: {e}"))?;
        b
    } else {
        std::fs::read(path)
            .map_err(|e| format!("cannot read the {what} file {}: {e}", path.display()))?
    };
    String::from_utf8(bytes).map_err(|e| {
        format!(
            "{}: not UTF-8 text (invalid byte at offset {}): save the {what} as UTF-8 CSV",
            path.display(),
            e.utf8_error().valid_up_to()
        )
    })
}

/// Run the command line and return its exit status.
pub fn run() -> ExitCode {
    let cli = match Cli::try_parse() {
        Ok(c) => c,
        Err(e) => {
            let code = if e.use_stderr() {
                EXIT_INPUT
            } else {
                EXIT_PASS
            };
            let _ = e.print();
            return ExitCode::from(code);
        }
    };
    let _ = OUTPUT.set(cli.output.clone());
    let mut overrides = Vec::new();
    for arg in &cli.set {
        match draftwire::design::overrides::Override::parse(arg) {
            Ok(o) => overrides.push(o),
            Err(d) => return input_error(Format::Text, &format!("error: {d}"), Some(&d)),
        }
    }
    let _ = OVERRIDES.set(overrides);
    match cli.command {
        Command::Size {
            design,
            format,
            table,
            airflow_unit,
        } => size(&design, format, table, airflow_unit),
        Command::Compare {
            design,
            candidates,
            format,
        } => compare::run(&design, &candidates, format),
        Command::Sweep {
            design,
            spec,
            points,
            log,
            hold_values,
            format,
        } => sweep::run(&design, &spec, points, log, hold_values, format),
        Command::New {
            element,
            load,
            force,
        } => {
            use draftwire::starter::{starter_design, StarterElement, StarterLoad};
            if let Some(p) = cli.output.as_ref().filter(|p| p.exists() && !force) {
                eprintln!(
                    "error: {} exists: draftwire new does not overwrite a file unless --force is given",
                    p.display()
                );
                return ExitCode::from(EXIT_INPUT);
            }
            let e = match element {
                NewElement::Lamp => StarterElement::Lamp,
                NewElement::Wire => StarterElement::Wire,
                NewElement::Thermistor => StarterElement::Thermistor,
            };
            let l = match load {
                NewLoad::Led => StarterLoad::Led,
                NewLoad::Buzzer => StarterLoad::Buzzer,
                NewLoad::Relay => StarterLoad::Relay,
            };
            exit_after(emit(&starter_design(e, l)))
        }
        Command::Completions { shell } => {
            let mut cmd = <Cli as clap::CommandFactory>::command();
            let mut buf = Vec::new();
            clap_complete::generate(shell, &mut cmd, "draftwire", &mut buf);
            exit_after(emit(&String::from_utf8_lossy(&buf)))
        }
        Command::Man => {
            let cmd = <Cli as clap::CommandFactory>::command();
            let mut buf = Vec::new();
            match clap_mangen::Man::new(cmd).render(&mut buf) {
                Ok(()) => exit_after(emit(&String::from_utf8_lossy(&buf))),
                Err(e) => {
                    eprintln!("error: cannot render the manual: {e}");
                    ExitCode::from(EXIT_INPUT)
                }
            }
        }
        Command::Transient {
            design,
            scenario,
            to,
            peak,
            duration,
            shape,
            airflow_file,
            samples,
            format,
        } => transient::run(
            &design,
            transient::Ask {
                scenario: scenario.as_deref(),
                to: to.as_deref(),
                peak: peak.as_deref(),
                duration: duration.as_deref(),
                half_sine: shape == PuffShape::HalfSine,
                airflow_file: airflow_file.as_ref(),
                samples: samples.as_ref(),
            },
            format,
        ),
        Command::Netlist {
            design,
            spice: _,
            svg,
            airflow,
            analyses,
        } => netlist::run(
            &design,
            &netlist::Ask {
                svg,
                airflow,
                analyses,
            },
        ),
        Command::Fit {
            readings,
            design,
            format,
        } => fit::run(&readings, &design, format),
        Command::Spread {
            design,
            trials,
            seed,
            format,
            trials_csv,
        } => spread::run(
            &design,
            draftwire::analysis::spread::SpreadOptions { trials, seed },
            format,
            trials_csv.as_ref(),
        ),
    }
}

fn size(path: &Path, format: Format, table: CsvTable, unit: AirUnit) -> ExitCode {
    let file = shown_name(path);
    let design = match load_design(path, &file, format) {
        Ok(d) => d,
        Err(code) => return code,
    };
    // A design that cannot be sized still gets a full report whose one
    // failing check says why (and the reason on stderr).
    let report = match draftwire::analysis::size(&design) {
        Ok(r) => r,
        Err(e) => {
            eprintln!("design failed: {file}: {e}");
            draftwire::analysis::unsized_report(&design, &e)
        }
    };
    let text = match format {
        Format::Text => render::text::render_with(
            &report,
            &file,
            terminal_width(),
            match unit {
                AirUnit::MPerS => render::text::AirflowUnit::MetresPerSecond,
                AirUnit::FtPerMin => render::text::AirflowUnit::FeetPerMinute,
                AirUnit::CmPerS => render::text::AirflowUnit::CentimetresPerSecond,
            },
        ),
        Format::Json => render::json::render(&report),
        Format::Csv => render::csv::render(
            &report,
            match table {
                CsvTable::Values => render::csv::Table::Values,
                CsvTable::OperatingPoints => render::csv::Table::OperatingPoints,
                CsvTable::Checks => render::csv::Table::Checks,
                CsvTable::Drift => render::csv::Table::Drift,
                CsvTable::Connections => render::csv::Table::Connections,
            },
        ),
        Format::Svg => match draftwire::analysis::choice::size_resolved(&design) {
            Ok((choice, core)) => render::svg::transfer(&draftwire::analysis::plot::transfer_plot(
                &choice.design,
                &core,
            )),
            Err(e) => {
                eprintln!("design failed: {file}: {e}: nothing to draw");
                return ExitCode::from(EXIT_DESIGN_FAIL);
            }
        },
    };
    if !emit(&text) {
        return ExitCode::from(EXIT_INPUT);
    }
    ExitCode::from(if report.passed() {
        EXIT_PASS
    } else {
        EXIT_DESIGN_FAIL
    })
}
