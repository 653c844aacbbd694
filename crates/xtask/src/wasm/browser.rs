//! `cargo xtask browser-test`: the web calculator in headless Chromium.

use std::path::Path;

use crate::process::Cmd;
use crate::setup;
use crate::target_dir;

const BROWSER_DIR: &str = "tests/browser";

/// The headless-browser test of the web calculator (tests/browser): serves
/// target/wasm/site on 127.0.0.1 with `python3 -m http.server`, drives Debian's Chromium
/// through playwright-core, and stops the server by its PID. Screenshots go to
/// target/wasm/screenshots.
pub fn run(root: &Path) -> Result<(), String> {
    setup::node(root)?;
    setup::apt_install(root, &["chromium"])?;
    let dir = root.join(BROWSER_DIR);
    if !dir.join("node_modules").join("playwright-core").exists() {
        Cmd::new("npm").args(["ci", "--no-audit", "--no-fund"]).dir(&dir).run()?;
    }
    let site = target_dir(root).join("wasm").join("site");
    if !site.join("index.html").exists() {
        return Err(format!("{} is missing: run `cargo xtask wasm` first", site.display()));
    }
    let port = {
        let listener =
            std::net::TcpListener::bind("127.0.0.1:0").map_err(|e| format!("no free port: {e}"))?;
        listener.local_addr().map_err(|e| format!("no free port: {e}"))?.port()
    };
    let mut server = Cmd::new("python3")
        .args(["-m", "http.server", &port.to_string(), "--bind", "127.0.0.1", "--directory"])
        .arg(&site)
        .spawn()?;
    let ready = (0..100).any(|_| {
        std::thread::sleep(std::time::Duration::from_millis(100));
        std::net::TcpStream::connect(("127.0.0.1", port)).is_ok()
    });
    let result = if ready {
        let shots = target_dir(root).join("wasm").join("screenshots");
        let url = format!("http://127.0.0.1:{port}/index.html");
        Cmd::new("node")
            .arg(dir.join("calculator.test.mjs"))
            .arg(&url)
            .arg(shots)
            .arg(root.join("tests").join("vectors"))
            .dir(root)
            .run()
    } else {
        Err(format!("the static server on 127.0.0.1:{port} did not start"))
    };
    // Stopped by its own PID, whatever the test did.
    let _ = server.kill();
    let _ = server.wait();
    result
}
