//! `cargo xtask browser-test`: the web calculator in headless Chromium.

use std::path::Path;

use crate::process::Cmd;
use crate::setup;
use crate::target_dir;

const BROWSER_DIR: &str = "tests/browser";

/// The headless-browser test of the web calculator (tests/browser): serves
/// target/wasm/site on 127.0.0.1, drives Debian's Chromium through playwright-core.
/// Screenshots go to target/wasm/screenshots.
pub fn run(root: &Path) -> Result<(), String> {
    setup::node(root)?;
    let site = target_dir(root).join("wasm").join("site");
    if !site.join("index.html").exists() {
        return Err(format!("{} is missing: run `cargo xtask wasm` first", site.display()));
    }
    serve(root, &site, |port, _| {
        let shots = target_dir(root).join("wasm").join("screenshots");
        Cmd::new("node")
            .arg(root.join(BROWSER_DIR).join("calculator.test.mjs"))
            .arg(format!("http://127.0.0.1:{port}/index.html"))
            .arg(shots)
            .arg(root.join("tests").join("vectors"))
            .dir(root)
            .run()
    })
}

/// Installs Debian's Chromium and playwright-core (tests/browser, `npm ci`) when missing,
/// serves `dir` on a free port of 127.0.0.1 with `python3 -m http.server`, and runs
/// `test(port, playwright-core's directory)`; the server is stopped by its own PID,
/// whatever the test did.
pub(super) fn serve<T>(
    root: &Path,
    dir: &Path,
    test: impl FnOnce(u16, &Path) -> Result<T, String>,
) -> Result<T, String> {
    setup::apt_install(root, &["chromium"])?;
    let playwright = root.join(BROWSER_DIR);
    if !playwright.join("node_modules").join("playwright-core").exists() {
        Cmd::new("npm").args(["ci", "--no-audit", "--no-fund"]).dir(&playwright).run()?;
    }
    let port = {
        let listener =
            std::net::TcpListener::bind("127.0.0.1:0").map_err(|e| format!("no free port: {e}"))?;
        listener.local_addr().map_err(|e| format!("no free port: {e}"))?.port()
    };
    let mut server = Cmd::new("python3")
        .args(["-m", "http.server", &port.to_string(), "--bind", "127.0.0.1", "--directory"])
        .arg(dir)
        .spawn()?;
    let ready = (0..100).any(|_| {
        std::thread::sleep(std::time::Duration::from_millis(100));
        std::net::TcpStream::connect(("127.0.0.1", port)).is_ok()
    });
    let result = if ready {
        test(port, &playwright.join("node_modules").join("playwright-core"))
    } else {
        Err(format!("the static server on 127.0.0.1:{port} did not start"))
    };
    let _ = server.kill();
    let _ = server.wait();
    result
}
