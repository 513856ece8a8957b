//! The `acidsite` command line. Library errors are typed; anyhow lives here only.

fn main() {
    eprintln!("acidsite: command line not built yet");
    std::process::exit(2);
}
