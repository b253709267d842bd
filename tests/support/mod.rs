//! End-to-end harness: serves `dist/` on 127.0.0.1, starts chromedriver on a
//! free loopback port, and drives headless Chromium through WebDriver.
//!
//! Every test that uses it should end with [`Harness::finish`], which fails
//! the test on any console error the page logged.

#![allow(dead_code)]

use std::net::{TcpListener, TcpStream};
use std::path::{Component, Path, PathBuf};
use std::process::{Child, Command, Stdio};
use std::sync::{Arc, Mutex};
use std::thread;
use std::time::{Duration, Instant};

use fantoccini::wd::{Capabilities, WebDriverCompatibleCommand};
use fantoccini::{Client, ClientBuilder, Locator};
use serde_json::{json, Value};

/// The release build the tests drive.
pub fn dist_dir() -> PathBuf {
    std::env::var_os("HEADROOM_DIST")
        .map(PathBuf::from)
        .unwrap_or_else(|| Path::new(env!("CARGO_MANIFEST_DIR")).join("dist"))
}

/// Where screenshots and other artifacts go (under target/, never committed).
pub fn artifact_dir() -> PathBuf {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("target/e2e-artifacts");
    std::fs::create_dir_all(&dir).expect("create target/e2e-artifacts");
    dir
}

fn free_port() -> u16 {
    TcpListener::bind("127.0.0.1:0").and_then(|l| l.local_addr()).map(|a| a.port()).expect("a free loopback port")
}

fn content_type(path: &Path) -> &'static str {
    match path.extension().and_then(|e| e.to_str()) {
        Some("html") => "text/html; charset=utf-8",
        Some("js") => "text/javascript; charset=utf-8",
        Some("wasm") => "application/wasm",
        Some("css") => "text/css; charset=utf-8",
        Some("svg") => "image/svg+xml",
        Some("json") | Some("webmanifest") => "application/manifest+json",
        Some("png") => "image/png",
        _ => "application/octet-stream",
    }
}

/// A static file server for one folder, on a loopback port of its own.
pub struct StaticServer {
    server: Arc<tiny_http::Server>,
    thread: Option<thread::JoinHandle<()>>,
    pub port: u16,
    /// Every path the browser asked for, in order.
    pub requests: Arc<Mutex<Vec<String>>>,
}

impl StaticServer {
    pub fn start(root: PathBuf) -> Self {
        Self::serve(root, false)
    }

    /// As a static host serves the page: each file gzip -9 (what
    /// `tests/dist_budget.rs` counts) to a browser that accepts it.
    pub fn start_gzip(root: PathBuf) -> Self {
        Self::serve(root, true)
    }

    fn serve(root: PathBuf, gzip: bool) -> Self {
        let server = Arc::new(tiny_http::Server::http("127.0.0.1:0").expect("bind 127.0.0.1"));
        let port = server.server_addr().to_ip().expect("an IP address").port();
        let requests = Arc::new(Mutex::new(Vec::new()));
        let (srv, log) = (Arc::clone(&server), Arc::clone(&requests));
        let thread = thread::spawn(move || {
            for request in srv.incoming_requests() {
                let url = request.url().to_owned();
                log.lock().unwrap().push(url.clone());
                let path = url.split(['?', '#']).next().unwrap_or("/");
                let relative = path.trim_start_matches('/');
                let relative = if relative.is_empty() { "index.html" } else { relative };
                let safe = Path::new(relative).components().all(|c| matches!(c, Component::Normal(_)));
                let file = root.join(relative);
                let accepts_gzip = request.headers().iter().any(|h| {
                    h.field.equiv("Accept-Encoding")
                        && h.value.as_str().split(',').any(|e| e.trim().starts_with("gzip"))
                });
                let response = match std::fs::read(&file) {
                    Ok(bytes) if safe => {
                        let header = tiny_http::Header::from_bytes("Content-Type", content_type(&file)).unwrap();
                        if gzip && accepts_gzip {
                            use std::io::Write;
                            let mut z = flate2::write::GzEncoder::new(Vec::new(), flate2::Compression::best());
                            z.write_all(&bytes).unwrap();
                            let encoding = tiny_http::Header::from_bytes("Content-Encoding", "gzip").unwrap();
                            tiny_http::Response::from_data(z.finish().unwrap())
                                .with_header(header)
                                .with_header(encoding)
                                .boxed()
                        } else {
                            tiny_http::Response::from_data(bytes).with_header(header).boxed()
                        }
                    }
                    _ => tiny_http::Response::from_string("not found").with_status_code(404).boxed(),
                };
                let _ = request.respond(response);
            }
        });
        StaticServer { server, thread: Some(thread), port, requests }
    }

    pub fn url(&self, path: &str) -> String {
        format!("http://127.0.0.1:{}{}", self.port, path)
    }
}

impl Drop for StaticServer {
    fn drop(&mut self) {
        self.server.unblock();
        if let Some(t) = self.thread.take() {
            let _ = t.join();
        }
    }
}

/// chromedriver as a child process; killed on drop.
pub struct Driver {
    child: Child,
    pub port: u16,
}

impl Driver {
    pub fn start() -> Self {
        let binary = std::env::var("CHROMEDRIVER").unwrap_or_else(|_| "/usr/bin/chromedriver".into());
        let port = free_port();
        let child = Command::new(&binary)
            .arg(format!("--port={port}"))
            .stdout(Stdio::null())
            .stderr(Stdio::null())
            .spawn()
            .unwrap_or_else(|e| panic!("cannot start {binary}: {e} (scripts/test installs it)"));
        let deadline = Instant::now() + Duration::from_secs(30);
        while TcpStream::connect(("127.0.0.1", port)).is_err() {
            assert!(Instant::now() < deadline, "chromedriver did not listen on {port} within 30 s");
            thread::sleep(Duration::from_millis(100));
        }
        Driver { child, port }
    }
}

impl Drop for Driver {
    fn drop(&mut self) {
        let _ = self.child.kill();
        let _ = self.child.wait();
    }
}

/// A log since the last call (chromedriver's `se/log`): "browser" is the
/// console, "performance" the DevTools events (every network request).
#[derive(Debug)]
struct Log(&'static str);

impl WebDriverCompatibleCommand for Log {
    fn endpoint(&self, base: &url::Url, session: Option<&str>) -> Result<url::Url, url::ParseError> {
        base.join(&format!("session/{}/se/log", session.unwrap_or_default()))
    }

    fn method_and_body(&self, _: &url::Url) -> (http::Method, Option<String>) {
        (http::Method::POST, Some(json!({"type": self.0}).to_string()))
    }
}

/// A DevTools protocol command through chromedriver (`goog/cdp/execute`).
#[derive(Debug)]
struct Cdp(Value);

impl WebDriverCompatibleCommand for Cdp {
    fn endpoint(&self, base: &url::Url, session: Option<&str>) -> Result<url::Url, url::ParseError> {
        base.join(&format!("session/{}/goog/cdp/execute", session.unwrap_or_default()))
    }

    fn method_and_body(&self, _: &url::Url) -> (http::Method, Option<String>) {
        (http::Method::POST, Some(self.0.to_string()))
    }
}

/// A served `dist/` (or the page at `HEADROOM_BASE_URL`), a chromedriver and
/// one browser session.
pub struct Harness {
    /// `None` when the tests drive a page someone else serves.
    pub server: Option<StaticServer>,
    base_url: String,
    pub client: Client,
    _driver: Driver,
    console: Vec<Value>,
    requests: Vec<String>,
    /// Console errors a test provoked on purpose, matched by substring.
    pub expected_errors: Vec<&'static str>,
}

impl Harness {
    /// Starts everything with the browser window at `width`×`height`.
    pub async fn start(width: u32, height: u32) -> Self {
        Self::start_serving(width, height, dist_dir()).await
    }

    /// As [`Harness::start`], serving `dist` instead of the release build.
    pub async fn start_serving(width: u32, height: u32, dist: PathBuf) -> Self {
        // HEADROOM_BASE_URL points the tests at a running `scripts/serve`.
        let (server, base_url) = match std::env::var("HEADROOM_BASE_URL") {
            Ok(url) => (None, url.trim_end_matches('/').to_owned()),
            Err(_) => {
                assert!(
                    dist.join("index.html").is_file(),
                    "{} has no index.html: run `trunk build --release` (scripts/test does)",
                    dist.display()
                );
                let server = StaticServer::start(dist);
                let base = server.url("");
                (Some(server), base)
            }
        };
        let driver = Driver::start();
        let mut caps = Capabilities::new();
        caps.insert(
            "goog:chromeOptions".into(),
            json!({
                "binary": std::env::var("CHROMIUM").unwrap_or_else(|_| "/usr/bin/chromium".into()),
                "args": [
                    "--headless=new", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage",
                    "--disable-background-networking", "--disable-component-update",
                    "--disable-sync", "--no-first-run", "--disable-quic",
                    format!("--window-size={width},{height}"),
                ]
            }),
        );
        caps.insert("goog:loggingPrefs".into(), json!({"browser": "ALL", "performance": "ALL"}));
        let client = ClientBuilder::new(hyper_util::client::legacy::connect::HttpConnector::new())
            .capabilities(caps)
            .connect(&format!("http://127.0.0.1:{}", driver.port))
            .await
            .expect("a WebDriver session with headless Chromium");
        Harness {
            server,
            base_url,
            client,
            _driver: driver,
            console: Vec::new(),
            requests: Vec::new(),
            expected_errors: Vec::new(),
        }
    }

    pub fn url(&self, path: &str) -> String {
        format!("{}{}", self.base_url, path)
    }

    /// Opens `path` and waits until the app has mounted `ready_testid`.
    pub async fn open(&mut self, path: &str, ready_testid: &str) {
        self.client.goto(&self.url(path)).await.expect("navigate");
        self.wait_for(ready_testid).await;
    }

    pub async fn wait_for(&self, testid: &str) -> fantoccini::elements::Element {
        if in_answer_panel(testid) {
            self.show_answer_panel().await;
        }
        self.client
            .wait()
            .at_most(Duration::from_secs(30))
            .for_element(Locator::Css(&format!("[data-testid=\"{testid}\"]")))
            .await
            .unwrap_or_else(|e| panic!("[data-testid={testid}] never appeared: {e}"))
    }

    /// Scrolls the answer panel into view, as a person does to read it, and
    /// waits two frames: the panel is written only while it is on or near
    /// the screen (`src/ui/results.rs`), so what it shows elsewhere may be
    /// an earlier answer, hidden.
    pub async fn show_answer_panel(&self) {
        self.client
            .execute_async(
                r#"const done = arguments[arguments.length - 1];
                   const panel = document.getElementById('answer-panel');
                   if (!panel) return done();
                   const r = panel.getBoundingClientRect();
                   if (r.bottom < 0 || r.top > innerHeight) panel.scrollIntoView({block: 'start'});
                   requestAnimationFrame(() => requestAnimationFrame(() => setTimeout(done, 0)));"#,
                vec![],
            )
            .await
            .expect("scroll to the answer panel");
    }

    /// The element's text as shown (a part of the answer panel is read on
    /// the screen: see [`Harness::show_answer_panel`]).
    pub async fn text(&self, testid: &str) -> String {
        self.wait_for(testid).await.text().await.expect("element text")
    }

    /// Replaces an input's text by typing, as a person would.
    pub async fn type_into(&self, testid: &str, text: &str) {
        let input = self.wait_for(testid).await;
        input.clear().await.expect("clear input");
        input.send_keys(text).await.expect("type into input");
    }

    /// Clicks an element, first scrolled to the middle of the screen as a
    /// person would (the answer bar and the caution stay at the bottom of
    /// the screen, so a control near the bottom edge is under them until
    /// the page is scrolled).
    pub async fn click(&self, testid: &str) {
        let el = self.wait_for(testid).await;
        self.client
            .execute("arguments[0].scrollIntoView({block: 'center'})", vec![serde_json::to_value(&el).unwrap()])
            .await
            .unwrap_or_else(|e| panic!("scroll to {testid}: {e}"));
        el.click().await.unwrap_or_else(|e| panic!("click {testid}: {e}"));
    }

    /// Picks an option of a `<select>` by value.
    pub async fn select(&self, testid: &str, value: &str) {
        self.wait_for(testid)
            .await
            .select_by_value(value)
            .await
            .unwrap_or_else(|e| panic!("select {value} in {testid}: {e}"));
    }

    /// An input's current value.
    pub async fn value(&self, testid: &str) -> String {
        self.wait_for(testid).await.prop("value").await.unwrap().unwrap_or_default()
    }

    /// Polls until the element's text contains `part` (parts of the page
    /// that follow a frame later, like the system), and returns the text.
    pub async fn text_containing(&self, testid: &str, part: &str) -> String {
        let deadline = Instant::now() + Duration::from_secs(10);
        loop {
            let got = self.text(testid).await;
            if got.contains(part) {
                return got;
            }
            assert!(Instant::now() < deadline, "[data-testid={testid}] shows {got:?}, without {part:?}");
            tokio::time::sleep(Duration::from_millis(50)).await;
        }
    }

    /// Polls until the element's text equals `expected` (reactive updates are
    /// fast, but WebDriver round trips are not synchronous with them).
    pub async fn expect_text(&self, testid: &str, expected: &str) {
        let deadline = Instant::now() + Duration::from_secs(10);
        loop {
            let got = self.text(testid).await;
            if got == expected {
                return;
            }
            assert!(Instant::now() < deadline, "[data-testid={testid}] shows {got:?}, expected {expected:?}");
            tokio::time::sleep(Duration::from_millis(50)).await;
        }
    }

    pub async fn screenshot(&self, name: &str) -> PathBuf {
        let png = self.client.screenshot().await.expect("screenshot");
        let path = artifact_dir().join(name);
        std::fs::write(&path, png).expect("write screenshot");
        path
    }

    /// Collects console entries logged so far (the driver hands each out once).
    pub async fn drain_console(&mut self) -> &[Value] {
        let log = self.client.issue_cmd(Log("browser")).await.expect("read the browser log");
        if let Value::Array(entries) = log {
            self.console.extend(entries);
        }
        &self.console
    }

    /// Collects the URL of every network request the browser started so far.
    pub async fn drain_requests(&mut self) -> &[String] {
        let log = self.client.issue_cmd(Log("performance")).await.expect("read the performance log");
        if let Value::Array(entries) = log {
            for e in entries {
                let Some(msg) = e["message"].as_str().and_then(|m| serde_json::from_str::<Value>(m).ok()) else {
                    continue;
                };
                if msg["message"]["method"] == "Network.requestWillBeSent" {
                    if let Some(u) = msg["message"]["params"]["request"]["url"].as_str() {
                        self.requests.push(u.to_owned());
                    }
                }
            }
        }
        &self.requests
    }

    /// Runs a DevTools protocol command.
    pub async fn cdp(&self, cmd: &str, params: Value) -> Value {
        self.client.issue_cmd(Cdp(json!({"cmd": cmd, "params": params}))).await.unwrap_or_else(|e| panic!("{cmd}: {e}"))
    }

    /// Stops serving `dist/`: from now on only the browser's own copy exists.
    pub fn stop_server(&mut self) {
        self.server = None;
    }

    /// Fails on any console error and on any request that left the page's
    /// origin, then ends the session.
    pub async fn finish(mut self) {
        self.drain_console().await;
        self.drain_requests().await;
        for entry in &self.console {
            eprintln!("console: {entry}");
        }
        let errors: Vec<&Value> = self
            .console
            .iter()
            .filter(|e| e["level"] == "SEVERE")
            .filter(|e| {
                let m = e["message"].as_str().unwrap_or_default();
                !self.expected_errors.iter().any(|x| m.contains(x))
            })
            .collect();
        let origin = self.base_url.clone();
        let foreign: Vec<&String> = self
            .requests
            .iter()
            .filter(|u| {
                !(u.starts_with(&format!("{origin}/"))
                    || *u == &origin
                    || u.starts_with("data:")
                    || u.starts_with("blob:"))
            })
            .collect();
        let client = self.client.clone();
        let _ = client.close().await;
        assert!(errors.is_empty(), "the page logged console errors: {errors:#?}");
        assert!(!self.requests.is_empty(), "the performance log recorded no requests at all");
        assert!(foreign.is_empty(), "requests left the origin {origin}: {foreign:#?}");
    }
}

/// Whether the element with this `data-testid` is part of the answer panel
/// (`src/ui/results.rs`; the answer bar is not: it stays on the screen).
fn in_answer_panel(testid: &str) -> bool {
    testid == "results"
        || testid == "proposed-size"
        || (testid.starts_with("answer") && testid != "answer-bar")
        || ["size-", "explain", "moody"].iter().any(|p| testid.starts_with(p))
}
