//! The page: Leptos components only. They read and write the worksheet's
//! text through [`state::Sheet`] and show what [`crate::sheet`] computes.
//! No formula lives here.

pub mod editor;
pub mod fatal;
pub mod fields;
pub mod keep;
pub mod keep_views;
pub mod print;
pub mod results;
pub mod roster;
pub mod share;
pub mod shelf;
pub mod state;
pub mod system;

use leptos::prelude::*;

use crate::sheet::file::{SheetFile, System};
pub use crate::sheet::report::CAUTION;
use state::Sheet;

/// The root of the page: the worksheet, kept on this device and opened
/// from a shared link when the address carries one (after asking).
#[component]
pub fn App() -> impl IntoView {
    let notices = keep::Notices(RwSignal::new(Vec::new()));
    provide_context(notices);
    provide_context(OpenPanel(RwSignal::new("")));
    let keeper = keep::Keeper::start(notices);
    provide_context(keeper);
    // A new worksheet is a new `Sheet`: the whole desk is drawn again
    // around it, and only then is the old one disposed.
    move || view! { <Desk sheet=keeper.sheet.get()/> }
}

/// Calls `then` with what `promise` settles to. Every wait on a browser
/// promise goes through here, so the page's module holds one copy of the
/// future that awaits it (each `spawn_local` of its own future was one).
pub fn when_settled(
    promise: js_sys::Promise,
    then: Box<dyn FnOnce(Result<wasm_bindgen::JsValue, wasm_bindgen::JsValue>)>,
) {
    wasm_bindgen_futures::spawn_local(async move { then(wasm_bindgen_futures::JsFuture::from(promise).await) });
}

/// Which panel under the masthead is open ("" for none); kept across
/// worksheet switches, which redraw the desk.
#[derive(Clone, Copy)]
pub struct OpenPanel(pub RwSignal<&'static str>);

/// The page laid out around a given worksheet (tests mount it with their own).
// Over 60 lines on purpose: the page's layout, kept whole so it reads as the page does.
#[component]
pub fn Desk(
    /// The worksheet shown.
    sheet: Sheet,
) -> impl IntoView {
    provide_context(sheet);
    let notices = use_context::<keep::Notices>().unwrap_or_else(|| {
        let n = keep::Notices(RwSignal::new(Vec::new()));
        provide_context(n);
        n
    });
    let keeper = use_context::<keep::Keeper>();
    let stored = keeper.is_some();
    // The demo opens as a worksheet of its own when storage is in use, so
    // it never replaces anyone's work.
    let open_demo = move |text: &'static str| {
        if let Ok(demo) = SheetFile::from_json(text) {
            match &keeper {
                Some(k) => {
                    let _ = k.create(demo);
                }
                None => sheet.load(demo),
            }
        }
    };
    let panel = use_context::<OpenPanel>().map(|p| p.0).unwrap_or_else(|| RwSignal::new(""));
    let toggle = move |name: &'static str| move |_| panel.update(|p| *p = if *p == name { "" } else { name });
    let pressed = move |name: &'static str| move || if panel.get() == name { "true" } else { "false" };
    let system = move || sheet.units.get().system;
    view! {
        <header class="masthead screen-only">
            <div class="brand">
                <h1>"Headroom"</h1>
                <p class="tagline">"Pipe sizing worksheet · works offline"</p>
            </div>
            <div class="sheet-meta">
                <label>"Project"<input type="text" data-testid="project" prop:value=move || sheet.project.get()
                    on:input=move |ev| sheet.project.set(event_target_value(&ev))/></label>
                // A text field, not `type="date"`: a sheet's date is free text
                // (a file or link may carry any), and the first date field a
                // page draws costs 9-38 ms of the browser's setup at start (1x).
                <label>"Date"<input type="text" data-testid="date" placeholder="YYYY-MM-DD" autocomplete="off"
                    prop:value=move || sheet.date.get()
                    on:input=move |ev| sheet.date.set(event_target_value(&ev))/></label>
                <div class="system" role="group" aria-label="Unit system">
                    <button type="button" data-testid="units-si" aria-pressed=move || if system() == System::Si { "true" } else { "false" }
                        on:click=move |_| sheet.set_system(System::Si)>"SI"</button>
                    <button type="button" data-testid="units-us" aria-pressed=move || if system() == System::Us { "true" } else { "false" }
                        on:click=move |_| sheet.set_system(System::Us)>"US"</button>
                </div>
                <DesignBasis/>
                <button type="button" class="demo" data-testid="open-demo" on:click=move |_| open_demo(state::DEMO)>"Open the demo sheet"</button>
                <button type="button" class="demo" data-testid="open-demo-domestic" on:click=move |_| open_demo(state::DEMO_DOMESTIC)>"Domestic water demo"</button>
                {stored.then(|| view! {
                    <button type="button" data-testid="show-shelf" aria-pressed=pressed("shelf") on:click=toggle("shelf")>"Worksheets"</button>
                })}
                <button type="button" data-testid="show-share" aria-pressed=pressed("share") on:click=toggle("share")>"Share"</button>
                <button type="button" data-testid="show-files" aria-pressed=pressed("files") on:click=toggle("files")>"Files & print"</button>
            </div>
        </header>
        {keeper.map(|k| view! { <keep_views::HaltBanner keeper=k/><keep_views::LinkQuestion keeper=k/> })}
        <div class="notices screen-only" aria-live="polite" data-testid="notices">
            {move || notices.0.get().into_iter().enumerate().map(|(i, n)| view! {
                <p class="notice" data-testid="notice">
                    <span>{n}</span>
                    <button type="button" class="quiet" aria-label="dismiss" on:click=move |_| notices.0.update(|v| { if i < v.len() { v.remove(i); } })>"✕"</button>
                </p>
            }).collect_view()}
        </div>
        {move || match panel.get() {
            "shelf" if stored => view! { <div class="panels screen-only"><shelf::ShelfPanel/></div> }.into_any(),
            "share" => view! { <div class="panels screen-only"><share::SharePanel/></div> }.into_any(),
            "files" if stored => view! { <div class="panels screen-only"><share::FilesPanel/></div> }.into_any(),
            _ => ().into_any(),
        }}
        <main class="desk screen-only">
            <roster::Roster/>
            <section class="bench" aria-label="Selected line">
                {move || match sheet.current() {
                    Some(slot) => view! {
                        <editor::LineEditor line=slot.clone()/>
                        <results::LineResults line=slot/>
                    }.into_any(),
                    None => view! {
                        <div class="empty" data-testid="empty">
                            <h2>"Start a worksheet"</h2>
                            <p>"Add a line with “+ New line”, or open the demo sheet: an invented clinic's chilled-water plant."</p>
                        </div>
                    }.into_any(),
                }}
            </section>
        </main>
        // Under the worksheet, not above it: its text changes as the
        // browser answers (offline copy ready, storage kept), and above the
        // worksheet each change moved every control under a finger.
        {keeper.map(|k| view! { <keep_views::Status keeper=k/> })}
        // The selected line's answer and the caution stay at the bottom of
        // the screen together.
        <div class="dock screen-only">
            {move || sheet.current().map(|slot| view! { <results::AnswerBar line=slot/> })}
            <p class="caution" role="note" data-testid="caution">{CAUTION}</p>
        </div>
        <print::PrintSheet/>
    }
}

/// The sheet-wide design basis: open system or closed loop, the margin
/// above a glycol's freezing point, and whether rarely stocked sizes are
/// searched. Its fields are drawn only while it is open.
#[component]
fn DesignBasis() -> impl IntoView {
    use crate::hydraulics::demand::Method;
    use crate::hydraulics::line::Circuit;
    use crate::sheet::file::{ReturnRun, DEFAULT_FREEZE_MARGIN_K, MAX_FREEZE_MARGIN_K};
    let sheet = expect_context::<Sheet>();
    let basis = sheet.basis;
    let summary = move || match basis.get().circuit {
        Circuit::Open => "Basis: open system",
        Circuit::Closed => "Basis: closed loop",
    };
    // Folded when the page starts: its fields are drawn only once opened.
    let open = RwSignal::new(false);
    let details = NodeRef::<leptos::html::Details>::new();
    let fields = move || {
        open.get().then(|| view! {
            <label>"Circuit"
                <select data-testid="basis-circuit" on:change=move |ev| {
                    let v = event_target_value(&ev);
                    basis.update(|b| b.circuit = if v == "closed" { Circuit::Closed } else { Circuit::Open });
                }>
                    {Circuit::ALL.map(|c| view! { <option value=c.id() selected=move || basis.get().circuit == c>{c.label()}</option> }).collect_view()}
                </select>
            </label>
            <label>"Closed loop return run"
                <select data-testid="basis-return" on:change=move |ev| {
                    let v = event_target_value(&ev);
                    basis.update(|b| b.return_run = if v == "entered" { ReturnRun::Entered } else { ReturnRun::Mirrored });
                }>
                    <option value="mirrored" selected=move || basis.get().return_run == ReturnRun::Mirrored>"mirrors the flow run (pump head counts the index circuit twice)"</option>
                    <option value="entered" selected=move || basis.get().return_run == ReturnRun::Entered>"entered as lines of its own"</option>
                </select>
            </label>
            <label>"Fixtures to flow"
                <select data-testid="basis-demand" on:change=move |ev| {
                    if let Some(m) = Method::by_id(&event_target_value(&ev)) { basis.update(|b| b.demand = m) }
                }>
                    {Method::ALL.map(|m| view! { <option value=m.id() selected=move || basis.get().demand == m>{m.label()}</option> }).collect_view()}
                </select>
            </label>
            <label>"Glycol: keep above freezing by"
                <select data-testid="basis-freeze" on:change=move |ev| {
                    let v = event_target_value(&ev).parse::<u8>().ok().filter(|k| *k <= MAX_FREEZE_MARGIN_K);
                    basis.update(|b| b.freeze_margin_k = v.filter(|k| *k != DEFAULT_FREEZE_MARGIN_K));
                }>
                    {[0u8, 1, 2, 3, 4, 5, 6, 8, 10].map(|k| view! {
                        <option value=k.to_string() selected=move || basis.get().freeze_margin() == k>
                            {if k == DEFAULT_FREEZE_MARGIN_K { format!("{k} K (common practice 3–5 K)") } else { format!("{k} K") }}
                        </option>
                    }).collect_view()}
                </select>
            </label>
            <label class="check">
                <input type="checkbox" data-testid="basis-every-size" prop:checked=move || basis.get().every_size
                    on:change=move |ev| basis.update(|b| b.every_size = event_target_checked(&ev))/>
                "Search rarely stocked sizes too (by default they are left out: common practice)"
            </label>
    })
    };
    view! {
        <details class="basis" data-testid="basis" node_ref=details
            on:toggle=move |_| { if let Some(d) = details.get_untracked() { if d.open() != open.get_untracked() { open.set(d.open()) } } }>
            <summary>{summary}</summary>
            {fields}
        </details>
    }
}
