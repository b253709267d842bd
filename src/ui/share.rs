//! Sharing: the worksheet's link (copy, the system share sheet, a QR code)
//! and its files (sheet JSON in and out, results CSV, the printed review).

use leptos::prelude::*;
use wasm_bindgen::JsCast;

use super::keep::{download, file_stem, Keeper, Notices};
use super::state::Sheet;
use crate::sheet::file::SheetFile;
use crate::sheet::{link, report};

/// The whole link for the open worksheet.
fn share_url(sheet: &Sheet) -> String {
    let base = web_sys::window()
        .map(|w| {
            let l = w.location();
            l.origin().unwrap_or_default() + &l.pathname().unwrap_or_default()
        })
        .unwrap_or_default();
    format!("{base}#{}", link::encode(&sheet.to_file()))
}

/// SVG path of a QR code for `text`, with its size in modules (quiet zone
/// included); `None` when the text is too long for any QR code.
pub fn qr_path(text: &str) -> Option<(String, usize)> {
    let code = qrcode::QrCode::with_error_correction_level(text.as_bytes(), qrcode::EcLevel::L).ok()?;
    let w = code.width();
    let colors = code.to_colors();
    let mut d = String::new();
    for y in 0..w {
        let mut x = 0;
        while x < w {
            if colors[y * w + x] == qrcode::Color::Dark {
                let start = x;
                while x < w && colors[y * w + x] == qrcode::Color::Dark {
                    x += 1;
                }
                d.push_str(&format!("M{} {}h{}v1h-{}z", start + 4, y + 4, x - start, x - start));
            } else {
                x += 1;
            }
        }
    }
    Some((d, w + 8))
}

/// The share panel.
// Over 60 lines on purpose: the markup of one panel, kept whole so its layout reads in one place.
#[component]
pub fn SharePanel() -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let notices = expect_context::<Notices>();
    // Recomputed when the panel is drawn and whenever the worksheet changes.
    let url = Memo::new(move |_| {
        sheet.project.track();
        sheet.date.track();
        sheet.units.track();
        sheet.basis.track();
        sheet.system.track();
        sheet.lines.track();
        sheet.edited.track();
        share_url(&sheet)
    });
    let copied = RwSignal::new(false);
    // The clipboard needs a secure context and a browser that offers it.
    let can_copy = web_sys::window()
        .map(|w| {
            js_sys::Reflect::get(&w.navigator(), &"clipboard".into()).is_ok_and(|c| !c.is_undefined() && !c.is_null())
        })
        .unwrap_or(false);
    let copy = move |_| {
        let Some(w) = web_sys::window() else { return };
        let promise = w.navigator().clipboard().write_text(&url.get_untracked());
        super::when_settled(
            promise,
            Box::new(move |r| match r {
                Ok(_) => copied.set(true),
                Err(_) => notices.say("The link could not be copied here; select it and copy it by hand."),
            }),
        );
    };
    let can_share = web_sys::window()
        .map(|w| js_sys::Reflect::has(&w.navigator(), &"share".into()).unwrap_or(false))
        .unwrap_or(false);
    let share = move |_| {
        let Some(w) = web_sys::window() else { return };
        let data = web_sys::ShareData::new();
        data.set_title(&format!("Headroom worksheet: {}", sheet.project.get_untracked()));
        data.set_url(&url.get_untracked());
        let promise = w.navigator().share_with_data(&data);
        super::when_settled(promise, Box::new(|_| {}));
    };
    view! {
        <section class="panel share" aria-label="Share this worksheet" data-testid="share-panel">
            <h2>"Share this worksheet"</h2>
            <p class="hint">"The whole worksheet travels inside the link, after the #: it is never sent to a server. Anyone who opens it gets a copy beside their own worksheets."</p>
            <label for="share-link">"Link"</label>
            <input id="share-link" data-testid="share-link" type="text" readonly prop:value=move || url.get()/>
            <div class="row">
                {can_copy.then(|| view! { <button type="button" data-testid="copy-link" on:click=copy>{move || if copied.get() { "Copied ✓" } else { "Copy link" }}</button> })}
                {can_share.then(|| view! { <button type="button" data-testid="system-share" on:click=share>"Share…"</button> })}
                <span class="hint">{move || format!("{} characters", url.get().len())}</span>
            </div>
            {(!can_copy || !can_share).then(|| view! {
                <p class="hint" data-testid="share-fallback">{match (can_copy, can_share) {
                    (false, false) => "This browser offers neither copying nor sharing from here: select the link above and copy it by hand, or scan the QR code.",
                    (false, true) => "This browser does not let the page copy: use Share…, select the link and copy it by hand, or scan the QR code.",
                    _ => "To send it, copy the link into a message, or scan the QR code with another device.",
                }}</p>
            })}
            {move || match qr_path(&url.get()) {
                Some((d, n)) => view! {
                    <svg class="qr" data-testid="qr" viewBox=format!("0 0 {n} {n}") role="img" aria-label="QR code of the link" shape-rendering="crispEdges">
                        <rect width=n height=n fill="#fff"/>
                        <path d=d fill="#000"/>
                    </svg>
                }.into_any(),
                None => view! { <p class="warn" data-testid="qr-too-long">"This worksheet is too big for a QR code: copy or share the link instead."</p> }.into_any(),
            }}
        </section>
    }
}

/// Files in and out, and printing.
// Over 60 lines on purpose: the markup of one panel, kept whole so its layout reads in one place.
#[component]
pub fn FilesPanel() -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let notices = expect_context::<Notices>();
    let keeper = expect_context::<Keeper>();
    let export_json = move |_| {
        let file = sheet.to_file();
        download(&format!("{}.headroom.json", file_stem(&file.project)), "application/json", &file.to_json());
    };
    let export_csv = move |_| {
        let file = sheet.to_file();
        // Each line's result is already computed: number them, solve nothing.
        let reports: Vec<report::LineReport> = sheet.lines.with_untracked(|v| {
            v.iter()
                .enumerate()
                .map(|(i, s)| report::LineReport { number: i + 1, ..s.report.get_untracked() })
                .collect()
        });
        download(&format!("{}-results.csv", file_stem(&file.project)), "text/csv", &report::csv(&file, &reports));
    };
    let import = move |ev: web_sys::Event| {
        let Some(input) = ev.target().and_then(|t| t.dyn_into::<web_sys::HtmlInputElement>().ok()) else { return };
        let Some(file) = input.files().and_then(|f| f.get(0)) else { return };
        input.set_value("");
        if file.size() > crate::sheet::file::MAX_FILE_BYTES as f64 {
            notices.say("That file is too large to be a Headroom worksheet.");
            return;
        }
        let text = file.text();
        super::when_settled(
            text,
            Box::new(move |text| {
                match SheetFile::from_json(&text.ok().and_then(|t| t.as_string()).unwrap_or_default()) {
                    Ok(s) => {
                        let name = if s.project.is_empty() { file.name() } else { s.project.clone() };
                        if keeper.create(s).is_ok() {
                            notices.say(format!("Imported “{name}” as a new worksheet."));
                        }
                    }
                    Err(e) => notices.say(format!("{} could not be imported: {e}.", file.name())),
                }
            }),
        );
    };
    let print = move |_| {
        if let Some(w) = web_sys::window() {
            let _ = w.print();
        }
    };
    view! {
        <section class="panel files" aria-label="Files and printing" data-testid="files-panel">
            <h2>"Files and printing"</h2>
            <div class="row">
                <button type="button" data-testid="export-json" on:click=export_json>"Save as a sheet file (.json)"</button>
                <label class="button-like">
                    "Open a sheet file…"
                    <input type="file" class="sr" data-testid="import-json" accept=".json,application/json" on:change=import/>
                </label>
                <button type="button" data-testid="export-csv" on:click=export_csv>"Results as CSV"</button>
                <button type="button" data-testid="print" on:click=print>"Print the review sheet"</button>
            </div>
            <p class="hint">"The sheet file is the one the headroom-batch command reads."</p>
        </section>
    }
}
