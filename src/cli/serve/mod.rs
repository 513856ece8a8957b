//! `acidsite serve [--port N] [--bind ADDR]`: the local web page.
//!
//! One binary serves the page (HTML, CSS and JavaScript written for it and
//! embedded with `include_str!`: nothing is fetched from the network) and a
//! small JSON API behind it (`api.rs`) that returns the same records as
//! `scan --json` and `annotate`.
//!
//! Safe by default: bound to 127.0.0.1 unless `--bind` says otherwise (a
//! warning is printed then); the Host header must name the loopback
//! interface unless `--bind` was given (a guard against DNS rebinding);
//! API requests from another origin are refused (Origin and Sec-Fetch-Site);
//! every response carries a Content-Security-Policy without inline script;
//! request bodies are limited; no request reaches the file system; Ctrl-C
//! (or SIGTERM) ends the server cleanly after the requests in flight.

mod api;

use super::Outcome;
use anyhow::Context;
use axum::extract::{Request, State};
use axum::http::{header, HeaderMap, HeaderValue, Method, StatusCode};
use axum::middleware::Next;
use axum::response::{IntoResponse, Response};
use axum::routing::get;
use axum::Router;
use std::io::Write;
use std::net::{IpAddr, Ipv4Addr, SocketAddr};

#[derive(clap::Args, Debug)]
pub struct Args {
    /// Port to listen on (0: any free port, printed at start).
    #[arg(long, default_value_t = 8686, value_name = "N")]
    pub port: u16,
    /// Address to listen on. The default 127.0.0.1 is reachable from this
    /// machine only; another address makes the page reachable from the
    /// network (a warning is printed; there is no login).
    #[arg(long, value_name = "ADDR")]
    pub bind: Option<IpAddr>,
}

/// What the request guard needs to know.
#[derive(Clone, Debug)]
struct Guard {
    /// Accept any Host header (`--bind` given).
    any_host: bool,
}

const CSP: &str =
    "default-src 'none'; script-src 'self'; style-src 'self'; img-src 'self' data: blob:; \
connect-src 'self'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'";

const INDEX_HTML: &str = include_str!("assets/index.html");
const UTIL_JS: &str = include_str!("assets/util.js");
const APP_JS: &str = include_str!("assets/app.js");
const LIST_JS: &str = include_str!("assets/list.js");
const STYLE_CSS: &str = include_str!("assets/style.css");

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    // Fail early (exit 2) if the embedded data does not validate.
    acidsite::advice::catalogue()
        .map_err(|e| anyhow::anyhow!("the embedded base catalogue is invalid: {e}"))?;
    acidsite::sites::rule_set()
        .map_err(|e| anyhow::anyhow!("the embedded rule set is invalid: {e}"))?;
    let rt = tokio::runtime::Builder::new_multi_thread()
        .worker_threads(2)
        .enable_all()
        .build()
        .context("cannot start the server runtime")?;
    rt.block_on(serve(args))?;
    Ok(Outcome::AllFine)
}

async fn serve(args: Args) -> anyhow::Result<()> {
    let ip = args.bind.unwrap_or(IpAddr::V4(Ipv4Addr::LOCALHOST));
    let listener = tokio::net::TcpListener::bind(SocketAddr::new(ip, args.port))
        .await
        .with_context(|| format!("cannot listen on {ip} port {}", args.port))?;
    let addr = listener.local_addr()?;
    // Signal handlers are in place before the address is printed, so a
    // stop request right after start-up is a clean stop.
    let stop = Stop::install();
    let app = router(Guard {
        any_host: args.bind.is_some(),
    });
    {
        let mut out = std::io::stdout().lock();
        let shown = match addr {
            SocketAddr::V6(a) => format!("[{}]:{}", a.ip(), a.port()),
            SocketAddr::V4(a) => a.to_string(),
        };
        writeln!(out, "acidsite serve: listening on http://{shown}/")?;
        match bind_warning(ip, addr.port()) {
            Some(w) => {
                let _ = writeln!(std::io::stderr(), "acidsite serve: {w}");
            }
            None => writeln!(
                out,
                "acidsite serve: open that address in your browser; Ctrl-C stops the server"
            )?,
        }
        out.flush()?;
    }
    let stopping = std::sync::Arc::new(tokio::sync::Notify::new());
    let told = stopping.clone();
    let server = axum::serve(listener, app).with_graceful_shutdown(async move {
        stop.wait().await;
        // Whatever still runs (a long analysis on the blocking pool, which
        // the runtime waits for when it shuts down), the process ends soon
        // after a stop request.
        std::thread::spawn(|| {
            std::thread::sleep(std::time::Duration::from_secs(15));
            let _ = writeln!(std::io::stderr(), "acidsite serve: stopped (forced)");
            std::process::exit(0);
        });
        told.notify_one();
    });
    // Open connections get a few seconds to finish after a stop request;
    // then the server stops regardless (an idle or stalled client cannot
    // keep it alive).
    tokio::select! {
        r = server => r.context("the server stopped with an error")?,
        _ = async {
            stopping.notified().await;
            tokio::time::sleep(std::time::Duration::from_secs(5)).await;
        } => {}
    }
    let _ = writeln!(std::io::stderr(), "acidsite serve: stopped");
    Ok(())
}

/// The warning printed when the server listens beyond the loopback
/// interface (None on loopback).
fn bind_warning(ip: IpAddr, port: u16) -> Option<String> {
    (!ip.is_loopback()).then(|| {
        format!(
            "warning: listening on {ip}, not on the loopback interface: anyone who can reach \
             this machine on port {port} can use the page and the API (there is no login); \
             stop with Ctrl-C"
        )
    })
}

/// Ctrl-C and (on Unix) SIGTERM, registered when created (before the
/// address is printed, so a stop request right after start-up is caught).
struct Stop {
    #[cfg(unix)]
    term: Option<tokio::signal::unix::Signal>,
    #[cfg(unix)]
    int: Option<tokio::signal::unix::Signal>,
}

impl Stop {
    fn install() -> Stop {
        Stop {
            #[cfg(unix)]
            term: tokio::signal::unix::signal(tokio::signal::unix::SignalKind::terminate()).ok(),
            #[cfg(unix)]
            int: tokio::signal::unix::signal(tokio::signal::unix::SignalKind::interrupt()).ok(),
        }
    }

    /// Resolves at the first Ctrl-C or SIGTERM.
    async fn wait(self) {
        #[cfg(unix)]
        let ctrl_c = async move {
            match self.int {
                Some(mut s) => {
                    s.recv().await;
                }
                None => {
                    let _ = tokio::signal::ctrl_c().await;
                }
            }
        };
        #[cfg(not(unix))]
        let ctrl_c = async {
            let _ = tokio::signal::ctrl_c().await;
        };
        #[cfg(unix)]
        let term = async move {
            match self.term {
                Some(mut s) => {
                    s.recv().await;
                }
                None => std::future::pending::<()>().await,
            }
        };
        #[cfg(not(unix))]
        let term = std::future::pending::<()>();
        tokio::select! {
            _ = ctrl_c => {},
            _ = term => {},
        }
    }
}

fn router(guard: Guard) -> Router {
    Router::new()
        .route(
            "/",
            get(|| async { asset(INDEX_HTML, "text/html; charset=utf-8") }),
        )
        .route(
            "/util.js",
            get(|| async { asset(UTIL_JS, "text/javascript; charset=utf-8") }),
        )
        .route(
            "/app.js",
            get(|| async { asset(APP_JS, "text/javascript; charset=utf-8") }),
        )
        .route(
            "/list.js",
            get(|| async { asset(LIST_JS, "text/javascript; charset=utf-8") }),
        )
        .route(
            "/style.css",
            get(|| async { asset(STYLE_CSS, "text/css; charset=utf-8") }),
        )
        .merge(api::routes())
        .fallback(|| async {
            api::error(
                StatusCode::NOT_FOUND,
                "not_found",
                "no such page or API route",
            )
        })
        .layer(axum::middleware::from_fn_with_state(guard, guard_layer))
}

fn asset(text: &'static str, kind: &'static str) -> Response {
    (
        [
            (header::CONTENT_TYPE, kind),
            (header::CACHE_CONTROL, "no-cache"),
        ],
        text,
    )
        .into_response()
}

/// Host and origin checks before every route; security headers after.
async fn guard_layer(State(g): State<Guard>, req: Request, next: Next) -> Response {
    let headers = req.headers();
    let host = headers
        .get(header::HOST)
        .and_then(|h| h.to_str().ok())
        .unwrap_or("")
        .to_string();
    let mut resp = if !g.any_host && !is_loopback_host(&host) {
        api::error(
            StatusCode::FORBIDDEN,
            "host",
            "this server answers only to localhost, 127.0.0.1 or [::1] (start it with --bind to serve other names)",
        )
    } else if let Some(why) = cross_origin(req.method(), req.uri().path(), headers, &host) {
        api::error(StatusCode::FORBIDDEN, "origin", why)
    } else {
        next.run(req).await
    };
    let h = resp.headers_mut();
    h.insert(
        header::CONTENT_SECURITY_POLICY,
        HeaderValue::from_static(CSP),
    );
    h.insert(
        header::X_CONTENT_TYPE_OPTIONS,
        HeaderValue::from_static("nosniff"),
    );
    h.insert(
        header::REFERRER_POLICY,
        HeaderValue::from_static("no-referrer"),
    );
    h.insert(header::X_FRAME_OPTIONS, HeaderValue::from_static("DENY"));
    h.insert(
        "cross-origin-opener-policy",
        HeaderValue::from_static("same-origin"),
    );
    h.insert(
        "cross-origin-resource-policy",
        HeaderValue::from_static("same-origin"),
    );
    resp
}

/// `localhost`, `127.x.y.z` or `[::1]`, with or without a port.
fn is_loopback_host(host: &str) -> bool {
    let name = if let Some(rest) = host.strip_prefix('[') {
        match rest.split_once(']') {
            Some((inside, port)) if port.is_empty() || port.starts_with(':') => inside,
            _ => return false,
        }
    } else {
        host.rsplit_once(':').map_or(host, |(h, _)| h)
    };
    if name.eq_ignore_ascii_case("localhost") {
        return true;
    }
    name.parse::<IpAddr>().is_ok_and(|ip| ip.is_loopback())
}

/// Why a request is refused as cross-origin (None: allowed). API routes and
/// every method other than GET/HEAD must come from the page itself (same
/// origin) or from a client that sends no Origin (curl, scripts); plain page
/// loads (a shared link opened from mail or chat) are allowed from anywhere.
fn cross_origin(
    method: &Method,
    path: &str,
    headers: &HeaderMap,
    host: &str,
) -> Option<&'static str> {
    let page_load = (method == Method::GET || method == Method::HEAD) && !path.starts_with("/api/");
    if page_load {
        return None;
    }
    if let Some(origin) = headers.get(header::ORIGIN) {
        let same = origin
            .to_str()
            .ok()
            .and_then(|o| o.strip_prefix("http://"))
            .is_some_and(|o| o.eq_ignore_ascii_case(host));
        if !same {
            return Some("cross-origin request refused: the API answers the page it serves only");
        }
    }
    if let Some(site) = headers.get("sec-fetch-site").and_then(|v| v.to_str().ok()) {
        if site != "same-origin" && site != "none" {
            return Some("cross-site request refused: the API answers the page it serves only");
        }
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn is_loopback_host_given_names_ports_and_others() {
        for ok in [
            "localhost",
            "localhost:8686",
            "127.0.0.1:1",
            "127.0.0.2",
            "[::1]:8686",
            "[::1]",
            "LOCALHOST",
        ] {
            assert!(is_loopback_host(ok), "{ok}");
        }
        for bad in [
            "",
            "example.com",
            "evil.localhost.example:8686",
            "10.0.0.1:8686",
            "[::2]:80",
            "localhost.:80",
            "[::1]x",
        ] {
            assert!(!is_loopback_host(bad), "{bad}");
        }
    }

    #[test]
    fn bind_warning_given_loopback_and_open_addresses() {
        assert!(bind_warning(IpAddr::V4(Ipv4Addr::LOCALHOST), 8686).is_none());
        assert!(bind_warning("::1".parse().unwrap(), 8686).is_none());
        let w = bind_warning("0.0.0.0".parse().unwrap(), 8686).unwrap();
        assert!(
            w.contains("0.0.0.0") && w.contains("8686") && w.contains("no login"),
            "{w}"
        );
        assert!(bind_warning("192.168.1.20".parse().unwrap(), 1).is_some());
    }

    #[test]
    fn cross_origin_given_origins_and_fetch_sites() {
        let mut h = HeaderMap::new();
        assert!(cross_origin(&Method::POST, "/api/scan", &h, "localhost:1").is_none());
        h.insert(
            header::ORIGIN,
            HeaderValue::from_static("http://localhost:1"),
        );
        assert!(cross_origin(&Method::POST, "/api/scan", &h, "localhost:1").is_none());
        h.insert(
            header::ORIGIN,
            HeaderValue::from_static("http://evil.example"),
        );
        assert!(cross_origin(&Method::POST, "/api/scan", &h, "localhost:1").is_some());
        assert!(cross_origin(&Method::GET, "/", &h, "localhost:1").is_none());
        let mut h = HeaderMap::new();
        h.insert("sec-fetch-site", HeaderValue::from_static("cross-site"));
        assert!(cross_origin(&Method::GET, "/api/options", &h, "localhost:1").is_some());
    }
}
