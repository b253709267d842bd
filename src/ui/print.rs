//! The printed review sheet: hidden on screen; the only thing printed. Its
//! content is written by [`crate::sheet::review`].

use leptos::prelude::*;

use super::state::{listen, Sheet};
use crate::sheet::library::display_name;
use crate::sheet::report::circuit_note;
use crate::sheet::review::{review_sheet, Review};

/// The review sheet, shown only when printing. Nothing of it is written
/// until the browser is about to print (`beforeprint`, which printing to
/// PDF fires too); it is written then from the worksheet as it stands and
/// dropped after (`afterprint`). So it costs nothing when the page starts
/// and nothing on a keystroke.
#[component]
pub fn PrintSheet() -> impl IntoView {
    let sheet = expect_context::<Sheet>();
    let armed = RwSignal::new(false);
    if let Some(w) = web_sys::window() {
        // `try_`: a print event may arrive after this desk was replaced by
        // another worksheet's, when this signal is gone.
        listen(&w, "beforeprint", move |_| {
            armed.try_set(true);
        });
        listen(&w, "afterprint", move |_| {
            armed.try_set(false);
        });
    }
    let text = move || match armed.get() {
        true => untrack(|| printed(sheet)),
        false => String::new(),
    };
    view! { <article class="print-sheet" data-testid="print-sheet" aria-hidden="true" inner_html=text></article> }
}

/// The review sheet's markup, read from the worksheet as it is.
fn printed(sheet: Sheet) -> String {
    // One copy of the lines, for the records and the tree alike.
    let file = sheet.to_file();
    let reports: Vec<_> = sheet.lines.with_untracked(|v| v.iter().map(|s| s.report.get_untracked()).collect());
    let is_system = sheet.joined.with_untracked(|j| j.tree.is_system());
    // The same lines and plot as the page's system panel.
    let (system, plot) = super::system::system_answer(sheet, is_system);
    let tree = if is_system { crate::sheet::report::tree_lines(&file, &reports) } else { Vec::new() };
    let project = sheet.project.with_untracked(|p| display_name(p));
    let date = sheet.date.get_untracked();
    review_sheet(&Review {
        project: &project,
        date: &date,
        circuit: circuit_note(&sheet.resolved.get_untracked()),
        lines: &file.lines,
        reports: &reports,
        tree: &tree,
        system: &system,
        plot: plot.as_ref(),
    })
}
