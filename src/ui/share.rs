//! Sharing: the worksheet's link (copy, the system share sheet, a QR code)
//! and its files (sheet JSON in and out, results CSV, the printed review).

use leptos::prelude::*;
use wasm_bindgen::JsCast;

use super::keep::{download, file_stem, Keeper, Notices};
use super::state::Sheet;
use crate::sheet::file::SheetFile;
use crate::sheet::link::{self, LinkError};
use crate::sheet::report;

/// The address of the page itself, to which a link's fragment is added.
fn page_address() -> String {
    web_sys::window()
        .map(|w| {
            let l = w.location();
            l.origin().unwrap_or_default() + &l.pathname().unwrap_or_default()
        })
        .unwrap_or_default()
}

/// The fragment (without `#`) of a link to `file`: [`link`]'s format, the
/// compact JSON deflated by the browser's own Compression Streams (so the
/// page's module carries no deflate of its own). `None` when this browser
/// has no Compression Streams.
pub async fn fragment_of(file: &SheetFile) -> Option<String> {
    Some(link::wrap(&deflated(file.to_compact_json().as_bytes()).await?))
}

/// `bytes` as raw DEFLATE, by the browser; `None` when it has no
/// Compression Streams.
pub async fn deflated(bytes: &[u8]) -> Option<Vec<u8>> {
    through(bytes, false, usize::MAX).await.ok()
}

/// Reads a link's fragment as the native `link::decode` does: the same
/// checks before inflating ([`link::unwrap`]), the same limit on what it
/// inflates to, the same reading of the sheet ([`link::open`]).
///
/// # Errors
/// A [`LinkError`], never a panic.
pub async fn read_fragment(fragment: String) -> Result<SheetFile, LinkError> {
    let packed = link::unwrap(&fragment)?;
    link::open(through(&packed, true, link::MAX_INFLATED_BYTES).await?)
}

/// Raw DEFLATE (RFC 1951) out of or into `bytes` through the browser's
/// Compression Streams, read a chunk at a time: more than `cap` bytes
/// out is [`LinkError::TooBig`] (the rest is never inflated), a stream
/// that fails is [`LinkError::BadData`].
async fn through(bytes: &[u8], inflate: bool, cap: usize) -> Result<Vec<u8>, LinkError> {
    // Looked up by name (web-sys offers these classes only behind its
    // unstable-API switch): a browser without them cannot make or read links.
    let class = js_sys::Reflect::get(
        &js_sys::global(),
        &if inflate { "DecompressionStream" } else { "CompressionStream" }.into(),
    )
    .ok()
    .and_then(|c| c.dyn_into::<js_sys::Function>().ok())
    .ok_or(LinkError::Unsupported)?;
    let pair = js_sys::Reflect::construct(&class, &js_sys::Array::of1(&"deflate-raw".into()))
        .map_err(|_| LinkError::Unsupported)?;
    let parts = js_sys::Array::of1(&js_sys::Uint8Array::from(bytes));
    let blob = web_sys::Blob::new_with_u8_array_sequence(&parts).map_err(|_| LinkError::BadData)?;
    let out = blob.stream().pipe_through(pair.unchecked_ref());
    let reader = web_sys::ReadableStreamDefaultReader::new(&out).map_err(|_| LinkError::BadData)?;
    let mut got = Vec::new();
    loop {
        let step = wasm_bindgen_futures::JsFuture::from(reader.read()).await.map_err(|_| LinkError::BadData)?;
        let field = |name: &str| js_sys::Reflect::get(&step, &name.into()).unwrap_or_default();
        if field("done").as_bool() != Some(false) {
            return Ok(got);
        }
        let chunk: js_sys::Uint8Array = field("value").unchecked_into();
        let (at, n) = (got.len(), chunk.length() as usize);
        if at + n > cap {
            let _ = reader.cancel();
            return Err(LinkError::TooBig);
        }
        got.resize(at + n, 0);
        chunk.copy_to(&mut got[at..]);
    }
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
    // Made when the panel is drawn and again whenever the worksheet
    // changes: the browser deflates it a moment later, so "" until then
    // (and when this browser cannot); only the latest edit's link is kept.
    let url = RwSignal::new(String::new());
    let made = RwSignal::new(true);
    let asked = StoredValue::new(0u32);
    Effect::new(move |_| {
        sheet.project.track();
        sheet.date.track();
        sheet.units.track();
        sheet.basis.track();
        sheet.system.track();
        sheet.lines.track();
        sheet.edited.track();
        let file = sheet.to_file();
        let n = asked.get_value().wrapping_add(1);
        asked.set_value(n);
        wasm_bindgen_futures::spawn_local(async move {
            let fragment = fragment_of(&file).await;
            // The panel may be gone by now (closed, or another worksheet
            // opened): its values with it, so only looked at if still there.
            if asked.try_get_value() == Some(n) {
                made.set(fragment.is_some());
                url.set(fragment.map(|f| format!("{}#{f}", page_address())).unwrap_or_default());
            }
        });
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
        let link = url.get_untracked();
        if link.is_empty() {
            return;
        }
        let promise = w.navigator().clipboard().write_text(&link);
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
        if url.with_untracked(String::is_empty) {
            return;
        }
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
                <span class="hint">{move || url.with(|u| if u.is_empty() { String::new() } else { format!("{} characters", u.len()) })}</span>
            </div>
            {(!can_copy || !can_share).then(|| view! {
                <p class="hint" data-testid="share-fallback">{match (can_copy, can_share) {
                    (false, false) => "This browser offers neither copying nor sharing from here: select the link above and copy it by hand, or scan the QR code.",
                    (false, true) => "This browser does not let the page copy: use Share…, select the link and copy it by hand, or scan the QR code.",
                    _ => "To send it, copy the link into a message, or scan the QR code with another device.",
                }}</p>
            })}
            {move || (!made.get()).then(|| view! {
                <p class="warn" data-testid="link-unsupported">"This browser cannot make a worksheet link: it lacks the Compression Streams every current browser has. Save a sheet file instead (Files & print)."</p>
            })}
            {move || url.with(|u| if u.is_empty() { None } else { Some(qr_path(u)) }).map(|qr| match qr {
                Some((d, n)) => view! {
                    <svg class="qr" data-testid="qr" viewBox=format!("0 0 {n} {n}") role="img" aria-label="QR code of the link" shape-rendering="crispEdges">
                        <rect width=n height=n fill="#fff"/>
                        <path d=d fill="#000"/>
                    </svg>
                }.into_any(),
                None => view! { <p class="warn" data-testid="qr-too-long">"This worksheet is too big for a QR code: copy or share the link instead."</p> }.into_any(),
            })}
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
