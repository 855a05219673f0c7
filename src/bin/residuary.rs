//! The `residuary` command line: a thin shell over `residuary::api`.

use std::io::Read;

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    match args.first().map(String::as_str) {
        Some("json") => {
            let mut text = String::new();
            if let Err(e) = std::io::stdin().read_to_string(&mut text) {
                eprintln!("residuary: could not read standard input: {e}");
                std::process::exit(2);
            }
            let (out, is_error) = residuary::api::run_json_text(&text);
            println!("{out}");
            if is_error {
                std::process::exit(2);
            }
        }
        _ => {
            println!("usage: residuary json < request.json");
        }
    }
}
