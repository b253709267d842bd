//! Headroom's first screen (an empty worksheet, as a first visit shows it)
//! drawn by Leptos with no program behind it: the same elements, texts and
//! style sheet (`www/style.css`), every text fixed, and one click handler.
//! The start test (`tests/e2e.rs`, `start_time_beside_a_bare_leptos_page`)
//! times it beside the bare page and Headroom, to tell what drawing this
//! screen costs from what the program adds; `first_screen_alone_matches`
//! fails when Headroom's first screen changes and this copy does not.
//!
//! Made from the page itself: the release build's `document.body` on a
//! first visit at 1024 × 768, its elements and texts written out as a
//! `view!` (the `<noscript>` and Leptos's empty markers left out).

#[cfg(target_arch = "wasm32")]
fn main() {
    use leptos::prelude::*;
    leptos::mount::mount_to_body(|| {
        let lines = RwSignal::new(0u32);
        view! {
            <header class="masthead screen-only">
              <div class="brand">
                <h1>
                  "Headroom"
                </h1>
                <p class="tagline">
                  "Pipe sizing worksheet · works offline"
                </p>
              </div>
              <div class="sheet-meta">
                <label>
                  "Project"
                  <input type="text" data-testid="project"/>
                </label>
                <label>
                  "Date"
                  <input type="text" data-testid="date" placeholder="YYYY-MM-DD" autocomplete="off"/>
                </label>
                <div class="system" role="group" aria-label="Unit system">
                  <button type="button" data-testid="units-si" aria-pressed="true">
                    "SI"
                  </button>
                  <button type="button" data-testid="units-us" aria-pressed="false">
                    "US"
                  </button>
                </div>
                <details class="basis" data-testid="basis">
                  <summary>
                    "Basis: open system"
                  </summary>
                </details>
                <button class="demo" type="button" data-testid="open-demo">
                  "Open the demo sheet"
                </button>
                <button class="demo" type="button" data-testid="open-demo-domestic">
                  "Domestic water demo"
                </button>
                <button type="button" data-testid="show-shelf" aria-pressed="false">
                  "Worksheets"
                </button>
                <button type="button" data-testid="show-share" aria-pressed="false">
                  "Share"
                </button>
                <button type="button" data-testid="show-files" aria-pressed="false">
                  "Files & print"
                </button>
              </div>
            </header>
            <div class="notices screen-only" aria-live="polite" data-testid="notices">
            </div>
            <main class="desk screen-only">
              <section class="roster" aria-labelledby="roster-title">
                <div class="roster-head">
                  <h2 id="roster-title">
                    "Lines"
                  </h2>
                  <div class="add">
                    <label for="add-service" class="sr">
                      "Service for the new line"
                    </label>
                    <select id="add-service" data-testid="add-service">
                      <option value="chilled">
                        "Chilled water"
                      </option>
                      <option value="heating">
                        "Heating water"
                      </option>
                      <option value="domestic-cold">
                        "Domestic cold water"
                      </option>
                      <option value="domestic-hot">
                        "Domestic hot water"
                      </option>
                      <option value="process">
                        "Process water"
                      </option>
                      <option value="compressed-air">
                        "Compressed air"
                      </option>
                      <option value="fuel-gas-low">
                        "Natural gas, low pressure"
                      </option>
                      <option value="steam-saturated">
                        "Steam, saturated"
                      </option>
                      <option value="steam-superheated">
                        "Steam, superheated"
                      </option>
                    </select>
                    <button type="button" data-testid="add-line" on:click=move |_| lines.update(|n| *n += 1)>
                      "+ New line"
                    </button>
                  </div>
                </div>
                <div class="roster-box">
                  <ol class="roster-list" data-testid="roster" data-lines="0">
                  </ol>
                </div>
                <p class="path-total" data-testid="path-total" aria-live="polite">
                  "Tick lines to add up their drops along a path (for a pump-head estimate)."
                </p>
              </section>
              <section class="bench" aria-label="Selected line">
                <div class="empty" data-testid="empty">
                  <h2>
                    "Start a worksheet"
                  </h2>
                  <p>
                    "Add a line with “+ New line”, or open the demo sheet: an invented clinic's chilled-water plant."
                  </p>
                </div>
              </section>
            </main>
            <p class="status screen-only" data-testid="status">
              <span data-testid="offline-status">
                "Not yet ready offline: keep this page open once while online."
              </span>
              " "
              <span data-testid="storage-status">
                "This browser may clear Headroom's storage when space runs low: export worksheets you need as files (Files & print)."
              </span>
            </p>
            <div class="dock screen-only">
              <p class="caution" role="note" data-testid="caution">
                "Design guidance only. Check every result against the governing code, manufacturer data and the judgement of a licensed professional before anything is built."
              </p>
            </div>
            <article class="print-sheet" data-testid="print-sheet" aria-hidden="true">
            </article>
        }
    });
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("headroom-first-screen is a web page: build it with trunk (scripts/test build)");
}
