//! The page's state: one worksheet of lines, each line's stored text in a
//! signal of its own and its result in a memo of its own, so an edit
//! re-sizes only the line that changed.
//!
//! - Every `Sheet` owns a reactive scope of its own. Opening another
//!   worksheet makes a new `Sheet` and the page is redrawn around it; the
//!   old one is disposed only after that ([`Sheet::dispose_later`]), so no
//!   view can read a value of the old worksheet after it was disposed.

use std::sync::atomic::{AtomicUsize, Ordering};

use leptos::prelude::*;

use crate::sheet::convert;
use crate::sheet::file::{Basis, LineFile, SheetFile, System, SystemFile, UnitChoice, Units, FORMAT};
use crate::sheet::presets::Service;
use crate::sheet::report::{detail, evaluate_line_in, with_tree_problems, Detail, LineReport, Outcome};
use crate::sheet::system::{self, Carried, Joint, Tree};
use crate::sheet::units::Dimension;

/// How many line evaluations the page has run (for the "only changed
/// lines are re-sized" test and the timing report).
pub static EVALUATIONS: AtomicUsize = AtomicUsize::new(0);

/// The demo worksheet: an invented clinic's chilled-water plant.
pub const DEMO: &str = include_str!("../../examples/clinic-chilled-water.json");
/// The domestic-water demo: the same clinic's cold and hot water, from fixtures.
pub const DEMO_DOMESTIC: &str = include_str!("../../examples/clinic-domestic-water.json");

/// One line of the worksheet.
#[derive(Clone)]
pub struct Slot {
    /// Stable id (for keys and selection), never reused in a session.
    pub id: u32,
    /// The stored text of the line.
    pub file: RwSignal<LineFile>,
    /// Its result, recomputed only when its text or the sheet's units change.
    pub report: Memo<LineReport>,
    /// What its open results panel shows beyond the result (the sizes
    /// around the answer with capacities, the worked steps): lazy, so it is
    /// made only for a line whose panel is drawn, once per result.
    pub detail: Memo<Option<(Outcome, Detail)>>,
    /// Whether the line is on the path whose drops are summed.
    pub in_path: RwSignal<bool>,
    /// What joining the sheet reads of it (name, feed, load, diversity).
    pub joint: RwSignal<Joint>,
    /// Its place in the system: depth, the load it carries, problems with
    /// what it is fed from. Changes only when those do.
    pub place: Memo<Place>,
    owner: Owner,
}

/// A line's place in the system, as its result needs it.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Place {
    /// Depth below its source (0 for a source or a line on its own).
    pub depth: usize,
    /// The load it carries for its branches and itself.
    pub carried: Option<Carried>,
    /// Problems with what it is fed from.
    pub problems: Vec<String>,
}

/// The sheet's lines joined: computed from every line's name, `fed_from`
/// and load, so a change to anything else leaves it (and every line's
/// [`Place`]) as it was.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Joined {
    /// Slot ids, in order.
    pub ids: Vec<u32>,
    /// The tree.
    pub tree: Tree,
    /// The load each line carries.
    pub carried: Vec<Option<Carried>>,
}

/// The worksheet.
#[derive(Clone, Copy)]
pub struct Sheet {
    /// Project name.
    pub project: RwSignal<String>,
    /// Worksheet date.
    pub date: RwSignal<String>,
    /// Unit choices as stored.
    pub units: RwSignal<UnitChoice>,
    /// Sheet-wide design basis (circuit, freezing margin, sizes searched).
    pub basis: RwSignal<Basis>,
    /// Whole-system settings: source and outlet pressures, pump, suction.
    pub system: RwSignal<SystemFile>,
    /// Unit choices resolved, with the design basis.
    pub resolved: Memo<Units>,
    /// The lines in order.
    pub lines: RwSignal<Vec<Slot>>,
    /// Notified whenever any line's text changes (by that line's own
    /// effect). What follows every line's text (saving, the system, the
    /// share link) tracks this and `lines`, not each line: tracking two
    /// hundred lines costs a reader two hundred subscriptions redone on
    /// every keystroke.
    pub edited: Trigger,
    /// The lines joined into a system.
    pub joined: Memo<Joined>,
    /// Whether the sheet is long ([`super::roster::WINDOW_FROM`] lines or
    /// more): its list is drawn as a window of rows, its "fed from" is
    /// typed, its print sheet is drawn only for printing.
    pub long: Memo<bool>,
    /// The line being edited.
    pub selected: RwSignal<Option<u32>>,
    /// The last deleted line and where it was, for undo.
    pub deleted: RwSignal<Option<(usize, Slot)>>,
    next_id: StoredValue<u32>,
    owner: StoredValue<Owner>,
}

impl PartialEq for Sheet {
    fn eq(&self, other: &Sheet) -> bool {
        self.lines == other.lines
    }
}

/// Runs `f` in a task of its own, `ms` milliseconds from now.
pub fn after(ms: i32, f: impl FnOnce() + 'static) {
    let f = wasm_bindgen::closure::Closure::once_into_js(f);
    if let Some(w) = web_sys::window() {
        let _ = w.set_timeout_with_callback_and_timeout_and_arguments_0(wasm_bindgen::JsCast::unchecked_ref(&f), ms);
    }
}

/// Runs `f` in a task of its own, after the reactive updates queued now
/// (they run as microtasks) have redrawn the page.
pub fn after_redraw(f: impl FnOnce() + 'static) {
    after(0, f);
}

/// Runs `f` after the next frame has been painted (in a task queued from
/// the frame callback, which runs after that frame's paint). A hidden page
/// paints no frames: `f` waits until it is shown.
///
/// Everything asked for before a frame runs in one task after it, in the
/// order asked, from one frame callback: a keystroke asks three or four
/// times (the answer panel, the list's row, the system box, the save), and
/// a frame callback and a task of its own for each cost script before the
/// answer's frame.
pub fn after_paint(f: impl FnOnce() + 'static) {
    let first = AFTER_PAINT.with_borrow_mut(|q| {
        q.push(Box::new(f));
        q.len() == 1
    });
    if !first {
        return;
    }
    let Some(w) = web_sys::window() else { return };
    let run = wasm_bindgen::closure::Closure::once_into_js(|| {
        // Taken in the frame callback: what is asked for from here on
        // waits for the frame after this one.
        let ready = AFTER_PAINT.with_borrow_mut(std::mem::take);
        after(0, move || ready.into_iter().for_each(|f| f()));
    });
    let _ = w.request_animation_frame(wasm_bindgen::JsCast::unchecked_ref(&run));
}

thread_local! {
    /// What waits for the next frame to be painted ([`after_paint`]).
    static AFTER_PAINT: std::cell::RefCell<Vec<Box<dyn FnOnce()>>> = const { std::cell::RefCell::new(Vec::new()) };
}

/// Calls `then` in a task after the next frame has painted whenever what
/// `track` reads changes, once however many changes come before that frame
/// (not for the first reading): for what may follow an edit a frame
/// behind the answer. `then` reads with `try_`: the frame may come after
/// its view is gone.
///
/// The first reading is made here, while the views around it are drawn
/// (a render effect's first run is immediate), so a change made after they
/// were drawn and before the page's effects first run is still followed:
/// an effect's first run comes a task later, and would take such a change
/// for the state the views were drawn from.
pub fn a_frame_behind(track: impl Fn() + 'static, then: impl Fn() + Copy + 'static) {
    let pending = StoredValue::new(false);
    let effect = RenderEffect::new(move |ran: Option<()>| {
        track();
        if ran.is_none() || pending.get_value() {
            return;
        }
        pending.set_value(true);
        after_paint(move || {
            pending.try_set_value(false);
            then();
        });
    });
    // Kept for as long as the current scope: dropping it stops it.
    StoredValue::new_local(effect);
}

/// Keeps `near` saying whether `el` is on the screen or within `margin`
/// of it (an `IntersectionObserver`), for as long as the current reactive
/// owner lives: the observer lets go of the element when it is disposed.
pub fn watch_near(el: &web_sys::Element, margin: &str, near: RwSignal<bool>) {
    use wasm_bindgen::JsCast;
    let seen = wasm_bindgen::closure::Closure::<dyn FnMut(js_sys::Array)>::new(move |entries: js_sys::Array| {
        // The newest entry says where the element is now.
        let now = js_sys::Reflect::get(&entries.at(-1), &"isIntersecting".into()).ok().and_then(|v| v.as_bool());
        if let (Some(now), Some(before)) = (now, near.try_get_untracked()) {
            if now != before {
                near.set(now);
            }
        }
    });
    let init = web_sys::IntersectionObserverInit::new();
    init.set_root_margin(margin);
    let Ok(observer) = web_sys::IntersectionObserver::new_with_options(seen.as_ref().unchecked_ref(), &init) else {
        return; // no observer: `near` stays as it is (drawn)
    };
    observer.observe(el);
    StoredValue::new_local(Watch { observer, _seen: seen });
}

/// An observer and its callback: disconnected before the callback is freed.
struct Watch {
    observer: web_sys::IntersectionObserver,
    _seen: wasm_bindgen::closure::Closure<dyn FnMut(js_sys::Array)>,
}

impl Drop for Watch {
    fn drop(&mut self) {
        self.observer.disconnect();
    }
}

/// Calls `f` on every `event` at `target`, for as long as the page lives.
pub fn listen(target: &web_sys::EventTarget, event: &str, f: impl FnMut(web_sys::Event) + 'static) {
    let f = wasm_bindgen::closure::Closure::<dyn FnMut(web_sys::Event)>::new(f);
    let _ = target.add_event_listener_with_callback(event, wasm_bindgen::JsCast::unchecked_ref(f.as_ref()));
    f.forget();
}

impl Sheet {
    /// A new empty worksheet in a reactive scope of its own, a child of the
    /// current owner.
    pub fn new() -> Sheet {
        let owner = Owner::new();
        // Kept in the parent's scope, so the scope does not own itself.
        let keep = StoredValue::new(owner.clone());
        owner.with(|| {
            let units = RwSignal::new(UnitChoice::default());
            let basis = RwSignal::new(Basis::default());
            let resolved = Memo::new(move |_| {
                let u = units.get();
                let mut r = u.resolve().unwrap_or_else(|_| Units::defaults(u.system));
                r.basis = basis.get();
                r
            });
            let lines: RwSignal<Vec<Slot>> = RwSignal::new(Vec::new());
            // Reads each line's joint, not its text: an edit that changes
            // no name, feed or load does not re-run this at all.
            // Gathered in a memo of its own so that `joined`, which every
            // line's place reads, has two sources, not one per line: the
            // reactive graph copies a memo's list of sources each time a
            // reader checks it.
            let joints = Memo::new(move |_| {
                lines.with(|v| {
                    let ids: Vec<u32> = v.iter().map(|s| s.id).collect();
                    let joints: Vec<Joint> = v.iter().map(|s| s.joint.get()).collect();
                    (ids, joints)
                })
            });
            let joined = Memo::new(move |_| {
                joints.with(|(ids, joints)| {
                    let tree = system::tree_of(joints);
                    let carried = if tree.is_system() {
                        system::carried_of(joints, &tree, &resolved.get())
                    } else {
                        vec![None; joints.len()]
                    };
                    Joined { ids: ids.clone(), tree, carried }
                })
            });
            Sheet {
                project: RwSignal::new(String::new()),
                date: RwSignal::new(String::new()),
                units,
                basis,
                system: RwSignal::new(SystemFile::default()),
                resolved,
                lines,
                edited: Trigger::new(),
                joined,
                long: Memo::new(move |_| lines.with(Vec::len) >= super::roster::WINDOW_FROM),
                selected: RwSignal::new(None),
                deleted: RwSignal::new(None),
                next_id: StoredValue::new(1),
                owner: keep,
            }
        })
    }

    /// A worksheet holding a sheet file's content, in a scope of its own.
    pub fn from_file(file: SheetFile) -> Sheet {
        let sheet = Sheet::new();
        sheet.fill(file);
        sheet
    }

    /// Disposes this worksheet's scope once the page has been redrawn
    /// without it. Call after the page has been given another worksheet.
    pub fn dispose_later(self) {
        after_redraw(move || self.dispose_now());
    }

    /// Disposes this worksheet's scope now: only for a worksheet nothing on
    /// the page is drawn from.
    pub fn dispose_now(self) {
        if let Some(owner) = self.owner.try_get_value() {
            owner.cleanup();
        }
        self.owner.dispose();
    }

    fn make_slot(&self, file: LineFile) -> Slot {
        let id = self.next_id.get_value();
        self.next_id.set_value(id + 1);
        let owner = self.owner.get_value().child();
        let resolved = self.resolved;
        let joined = self.joined;
        let edited = self.edited;
        owner.with(|| {
            let file = RwSignal::new(file);
            // A signal, set only when the line's name, feed or load changes:
            // a keystroke in any other field then reaches nothing that joins
            // the sheet (a memo here would mark the whole sheet's places,
            // results and rows to be checked on every keystroke).
            let joint = RwSignal::new(file.with_untracked(Joint::of));
            Effect::new(move |first: Option<()>| {
                let now = file.with(Joint::of);
                if joint.with_untracked(|j| *j != now) {
                    joint.set(now);
                }
                if first.is_some() {
                    edited.notify();
                }
            });
            let place = Memo::new(move |_| {
                joined.with(|j| match j.ids.iter().position(|&x| x == id) {
                    Some(i) => Place {
                        depth: j.tree.depth[i],
                        carried: j.carried[i],
                        problems: j.tree.problems.iter().filter(|(k, _)| *k == i).map(|(_, m)| m.clone()).collect(),
                    },
                    None => Place::default(),
                })
            });
            let report = Memo::new(move |_| {
                EVALUATIONS.fetch_add(1, Ordering::Relaxed);
                let p = place.get();
                let mut r = file.with(|f| evaluate_line_in(0, f, &resolved.get(), p.carried));
                with_tree_problems(&mut r, &p.problems);
                r
            });
            // One memo holds the result with its detail, so the results
            // panel needs no memo of its own (each memo type costs bytes).
            let detail = Memo::new(move |_| {
                report.with(|r| r.outcome.as_ref().ok().map(|o| (o.clone(), detail(o, &resolved.get()))))
            });
            Slot { id, file, report, detail, in_path: RwSignal::new(false), joint, place, owner: owner.clone() }
        })
    }

    /// Adds a line at the end (from a service's defaults) and selects it.
    pub fn add(&self, service: &Service) -> u32 {
        let n = self.lines.with_untracked(Vec::len) + 1;
        let slot = self.make_slot(service.new_line(&format!("Line {n}")));
        let id = slot.id;
        self.lines.update(|v| v.push(slot));
        self.selected.set(Some(id));
        id
    }

    /// Copies a line just below itself and selects the copy.
    pub fn duplicate(&self, id: u32) {
        let Some(pos) = self.position(id) else { return };
        let mut file = self.lines.with_untracked(|v| v[pos].file.get_untracked());
        file.name = format!("{} (copy)", file.name);
        let slot = self.make_slot(file);
        let new_id = slot.id;
        self.lines.update(|v| v.insert(pos + 1, slot));
        self.selected.set(Some(new_id));
    }

    /// Removes a line, keeping it for one undo.
    pub fn delete(&self, id: u32) {
        let Some(pos) = self.position(id) else { return };
        let slot = self.lines.try_update(|v| v.remove(pos));
        if let Some(previous) = self.deleted.get_untracked() {
            previous.1.owner.cleanup();
        }
        self.deleted.set(slot.map(|s| (pos, s)));
        let next = self.lines.with_untracked(|v| v.get(pos.min(v.len().saturating_sub(1))).map(|s| s.id));
        self.selected.set(next);
    }

    /// Puts the last deleted line back where it was.
    pub fn undo_delete(&self) {
        if let Some((pos, slot)) = self.deleted.get_untracked() {
            let id = slot.id;
            self.lines.update(|v| v.insert(pos.min(v.len()), slot));
            self.deleted.set(None);
            self.selected.set(Some(id));
        }
    }

    /// Moves a line up (−1) or down (+1).
    pub fn shift(&self, id: u32, by: isize) {
        let Some(pos) = self.position(id) else { return };
        self.lines.update(|v| {
            let to = pos as isize + by;
            if to >= 0 && (to as usize) < v.len() {
                v.swap(pos, to as usize);
            }
        });
    }

    /// Where a line is.
    pub fn position(&self, id: u32) -> Option<usize> {
        self.lines.with_untracked(|v| v.iter().position(|s| s.id == id))
    }

    /// The selected line's slot.
    pub fn current(&self) -> Option<Slot> {
        let id = self.selected.get()?;
        self.lines.with(|v| v.iter().find(|s| s.id == id).cloned())
    }

    /// Replaces the whole worksheet with a sheet file's content, in place
    /// (the page without storage uses this; the stored page makes a new
    /// [`Sheet`] instead). The old lines are disposed only after the page
    /// has been redrawn without them.
    pub fn load(&self, sheet: SheetFile) {
        let old = self.lines.get_untracked();
        let deleted = self.deleted.get_untracked();
        self.deleted.set(None);
        self.fill(sheet);
        after_redraw(move || {
            for s in old.into_iter().chain(deleted.map(|d| d.1)) {
                s.owner.cleanup();
            }
        });
    }

    fn fill(&self, sheet: SheetFile) {
        self.project.set(sheet.project);
        self.date.set(sheet.date);
        self.units.set(sheet.units);
        self.basis.set(sheet.basis);
        self.system.set(sheet.system);
        let slots: Vec<Slot> = sheet.lines.into_iter().map(|l| self.make_slot(l)).collect();
        self.selected.set(slots.first().map(|s| s.id));
        self.lines.set(slots);
    }

    /// The worksheet as a sheet file.
    pub fn to_file(&self) -> SheetFile {
        SheetFile {
            format: FORMAT.to_owned(),
            version: 1,
            project: self.project.get_untracked(),
            date: self.date.get_untracked(),
            units: self.units.get_untracked(),
            basis: self.basis.get_untracked(),
            system: self.system.get_untracked(),
            lines: self.lines.with_untracked(|v| v.iter().map(|s| s.file.get_untracked()).collect()),
        }
        .with_required_version()
    }

    /// Changes one field's unit, rewriting bare numbers so their meaning stays.
    pub fn set_unit(&self, dim: Dimension, symbol: &str) {
        let mut choice = self.units.get_untracked();
        *choice.slot_mut(dim) = Some(symbol.to_owned());
        self.change_units(choice);
    }

    /// Switches SI / US customary: every field to the system's defaults.
    pub fn set_system(&self, system: System) {
        self.change_units(UnitChoice { system, ..UnitChoice::default() });
    }

    fn change_units(&self, choice: UnitChoice) {
        let Ok(new) = choice.resolve() else { return };
        let old = self.resolved.get_untracked();
        self.lines.with_untracked(|v| {
            for s in v {
                let rho =
                    s.report.with_untracked(|r| r.outcome.as_ref().ok().map(|o| o.sizing.properties.density_kg_m3()));
                s.file.update(|f| convert::line(f, &old, &new, rho));
            }
        });
        self.system.update(|s| convert::system(s, &old, &new));
        self.units.set(choice);
    }
}

impl Default for Sheet {
    fn default() -> Self {
        Sheet::new()
    }
}
