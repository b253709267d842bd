//! The bare Leptos page (`benches/bare`) carrying Headroom's core: a text
//! box, a button and what the core answers. The button reads the box as a
//! sheet file and does what the page asks of the core — every line sized,
//! the system's lines, the CSV, the printed review sheet, the sheet file,
//! a link written and read (the deflate is the browser's, as in the page).
//!
//! No view of Headroom's is here: `tests/dist_budget.rs` weighs this page
//! beside `dist/` to tell how much of the size goal the core and Leptos
//! take before a single field of the worksheet is drawn. Built like
//! Headroom (same toolchain, release profile and wasm-opt settings).

#[cfg(target_arch = "wasm32")]
fn main() {
    use headroom::sheet::file::SheetFile;
    use headroom::sheet::review::{review_sheet, Review};
    use headroom::sheet::{link, report};
    use leptos::prelude::*;

    fn run(text: &str) -> String {
        let sheet = match SheetFile::from_json(text) {
            Ok(s) => s,
            Err(e) => return e.to_string(),
        };
        let reports = report::evaluate(&sheet);
        let system = report::system_lines(&sheet, &reports);
        let tree = report::tree_lines(&sheet, &reports);
        let circuit = sheet.units.resolve().map(|u| report::circuit_note(&u)).unwrap_or_default();
        let mut out = report::csv(&sheet, &reports);
        out.push_str(&review_sheet(&Review {
            project: &sheet.project,
            date: &sheet.date,
            circuit,
            lines: &sheet.lines,
            reports: &reports,
            tree: &tree,
            system: &system,
            plot: None,
        }));
        out.push_str(&sheet.to_json());
        let fragment = link::wrap(sheet.to_compact_json().as_bytes());
        if let Ok(again) = link::unwrap(&fragment).and_then(link::open) {
            out.push_str(&again.to_json());
        }
        out
    }

    leptos::mount::mount_to_body(|| {
        let text = RwSignal::new(String::new());
        let answer = RwSignal::new(String::new());
        view! {
            <main>
                <h1>"A bare Leptos page with Headroom's core"</h1>
                <textarea aria-label="sheet file" on:input=move |ev| text.set(event_target_value(&ev))></textarea>
                <button type="button" data-testid="ready" on:click=move |_| answer.set(text.with(|t| run(t)))>"Size"</button>
                <pre>{move || answer.get()}</pre>
            </main>
        }
    });
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("headroom-core-page is a web page: build it with trunk (scripts/test build)");
}
