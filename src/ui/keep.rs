//! Keeping work: autosave to local storage, several named worksheets,
//! links in the URL fragment, sheet files in and out, and the notices that
//! tell the person when any of it failed.
//!
//! - The open worksheet is a [`Sheet`] replaced whole on every switch
//!   (open, new, demo, link, import, delete), never refilled in place.
//! - Every save names the revision it is based on; another tab's newer
//!   revision is followed when this tab has nothing unsaved, and stops
//!   this tab's saving (with a choice) when it has ([`Halt`]).
//! - A link is only read until the person agrees to open it.

use leptos::prelude::*;
use wasm_bindgen::JsCast;

use super::state::{after, after_paint, listen, Sheet};
use crate::sheet::file::{SheetFile, FORMAT};
use crate::sheet::library::{
    display_name, Entry, Kv, Library, Problem, StoreError, Trashed, ASIDE_PREFIX, BUILD_KEY, INDEX_KEY, REV_PREFIX,
    TRASH_PREFIX,
};
use crate::sheet::link;

/// Local storage as a [`Kv`]; every call copes with storage being absent.
pub struct WebKv(Option<web_sys::Storage>);

impl WebKv {
    /// The page's local storage, if the browser allows it.
    pub fn open() -> WebKv {
        WebKv(web_sys::window().and_then(|w| w.local_storage().ok().flatten()))
    }

    /// Whether storage can be used at all.
    pub fn available(&self) -> bool {
        self.0.is_some()
    }
}

impl Kv for WebKv {
    fn get(&self, key: &str) -> Option<String> {
        self.0.as_ref()?.get_item(key).ok().flatten()
    }

    fn set(&self, key: &str, value: &str) -> Result<(), StoreError> {
        let s = self.0.as_ref().ok_or(StoreError::Unavailable)?;
        s.set_item(key, value).map_err(|e| {
            let name = js_sys::Reflect::get(&e, &"name".into()).ok().and_then(|n| n.as_string()).unwrap_or_default();
            // "QuotaExceededError" (a prefix test: a search for a text
            // anywhere would bring core's substring searcher into the module).
            if name.starts_with("Quota") {
                StoreError::Full
            } else {
                StoreError::Unavailable
            }
        })
    }

    fn remove(&self, key: &str) {
        if let Some(s) = &self.0 {
            let _ = s.remove_item(key);
        }
    }

    fn keys(&self) -> Vec<String> {
        let Some(s) = &self.0 else { return Vec::new() };
        let n = s.length().unwrap_or(0);
        (0..n).filter_map(|i| s.key(i).ok().flatten()).collect()
    }
}

/// Messages for the person, shown until dismissed.
#[derive(Clone, Copy)]
pub struct Notices(pub RwSignal<Vec<String>>);

impl Notices {
    /// Shows a message once (a repeat of the last one is not added again).
    pub fn say(&self, text: impl Into<String>) {
        let text = text.into();
        self.0.update(|v| {
            if v.last() != Some(&text) {
                v.push(text);
            }
        });
    }
}

/// Why this tab has stopped saving the open worksheet.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Halt {
    /// Another tab or window saved a newer revision while this tab had
    /// changes of its own.
    OtherTab,
    /// A newer Headroom started in another tab; this tab runs old code.
    NewerBuild,
}

/// A worksheet link waiting for the person to say whether to open it.
#[derive(Debug, Clone, PartialEq)]
pub struct PendingLink {
    /// The fragment it came from (cleared from the address once saved).
    pub fragment: String,
    /// What it holds.
    pub file: SheetFile,
}

/// The worksheets on this device and the one open now.
#[derive(Clone, Copy)]
pub struct Keeper {
    /// The store (browser objects are not `Send`, so it is kept locally).
    pub library: StoredValue<Library<WebKv>, LocalStorage>,
    /// The open worksheet. Replaced whole when another is opened.
    pub sheet: RwSignal<Sheet>,
    /// Id of the open worksheet ("" when it is not stored).
    pub current: RwSignal<String>,
    /// Stored worksheets, as listed.
    pub entries: RwSignal<Vec<Entry>>,
    /// Deleted worksheets waiting in the trash.
    pub trash: RwSignal<Vec<Trashed>>,
    /// Unreadable entries kept aside: key and text.
    pub aside: RwSignal<Vec<(String, String)>>,
    /// The worksheet deleted last, for the restore toast.
    pub last_deleted: RwSignal<Option<Entry>>,
    /// Whether the last save failed (so the notice is not repeated per key).
    pub failing: RwSignal<bool>,
    /// Set when this tab has stopped saving, and why.
    pub halted: RwSignal<Option<Halt>>,
    /// A shared link waiting for a yes or no.
    pub pending: RwSignal<Option<PendingLink>>,
    /// Whether the browser agreed to keep this site's storage (`None`:
    /// not asked yet, or the browser cannot say).
    pub persisted: RwSignal<Option<bool>>,
    /// Whether every file is cached for offline use.
    pub offline_ready: RwSignal<bool>,
    /// The revision the open worksheet was loaded or last saved as.
    rev: StoredValue<u64>,
    /// Whether the open worksheet has changes not yet saved.
    dirty: StoredValue<bool>,
    root: StoredValue<Owner>,
    /// Whether the page has been drawn around a worksheet yet: until then
    /// a worksheet replaced is disposed at once, with no redraw to wait for.
    drawn: StoredValue<bool>,
    notices: Notices,
}

fn now() -> String {
    js_sys::Date::new_0().to_iso_string().as_string().unwrap_or_default()
}

/// When a change is saved if no frame has come to save it after (a hidden
/// page paints none), ms. In a shown page the frame comes first and this
/// finds nothing left to save.
const HIDDEN_SAVE_MS: i32 = 200;

/// How long deleted worksheets stay in the trash (a choice of ours).
pub const TRASH_DAYS: f64 = 30.0;

/// A new id, unique on this device.
pub fn new_id() -> String {
    let t = js_sys::Date::now() as u64;
    let r = (js_sys::Math::random() * 1e9) as u64;
    format!("w{t:x}{r:x}")
}

/// An empty worksheet file.
pub fn blank() -> SheetFile {
    SheetFile {
        format: FORMAT.to_owned(),
        version: 1,
        project: String::new(),
        date: String::new(),
        units: Default::default(),
        basis: Default::default(),
        system: Default::default(),
        lines: Vec::new(),
    }
}

/// This build's id, written by scripts/post-build into boot.js: the build
/// time (UTC, `YYYYMMDDhhmmss`) then the module's name, so a later build
/// sorts after an earlier one. `None` where the page was not started by
/// boot.js (component tests).
pub fn build_id() -> Option<String> {
    let w = web_sys::window()?;
    js_sys::Reflect::get(&w, &"headroomBuild".into()).ok()?.as_string().filter(|b| !b.starts_with("__"))
}

fn address_fragment() -> String {
    web_sys::window().and_then(|w| w.location().hash().ok()).unwrap_or_default().trim_start_matches('#').to_owned()
}

/// Removes the fragment from the address without a reload or a new
/// history entry, if it is still `fragment`.
fn clear_fragment(fragment: &str) {
    let Some(w) = web_sys::window() else { return };
    if address_fragment() != fragment {
        return;
    }
    if let Ok(history) = w.history() {
        let path = w.location().pathname().unwrap_or_default() + &w.location().search().unwrap_or_default();
        let _ = history.replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&path));
    }
}

impl Keeper {
    /// Opens storage and the last worksheet open, asks about a shared link
    /// in the address, and starts saving every change.
    pub fn start(notices: Notices) -> Keeper {
        let kv = WebKv::open();
        if !kv.available() {
            notices.say(Problem::NotSaved(StoreError::Unavailable).to_string());
        }
        let library = StoredValue::new_local(Library::new(kv));
        let (_, problem) = library.with_value(|l| l.entries());
        if let Some(p) = problem {
            notices.say(p.to_string());
        }
        library.with_value(|l| l.reconcile());
        let cutoff = js_sys::Date::new(&(js_sys::Date::now() - TRASH_DAYS * 86_400_000.0).into()).to_iso_string();
        library.with_value(|l| l.purge_before(&cutoff.as_string().unwrap_or_default()));
        let keeper = Keeper {
            library,
            sheet: RwSignal::new(Sheet::new()),
            current: RwSignal::new(String::new()),
            entries: RwSignal::new(Vec::new()),
            trash: RwSignal::new(Vec::new()),
            aside: RwSignal::new(Vec::new()),
            last_deleted: RwSignal::new(None),
            failing: RwSignal::new(false),
            halted: RwSignal::new(None),
            pending: RwSignal::new(None),
            persisted: RwSignal::new(None),
            offline_ready: RwSignal::new(false),
            rev: StoredValue::new(0),
            dirty: StoredValue::new(false),
            root: StoredValue::new(Owner::current().unwrap_or_default()),
            drawn: StoredValue::new(false),
            notices,
        };
        keeper.refresh_lists();
        let last = keeper.library.with_value(|l| l.current());
        let first = keeper.entries.get_untracked().first().map(|e| e.id.clone());
        let opened = [last, first].into_iter().flatten().any(|id| keeper.load(&id));
        if !opened {
            let _ = keeper.create(blank());
        }
        keeper.autosave();
        keeper.offer_link_in_url();
        if let Some(w) = web_sys::window() {
            listen(&w, "hashchange", move |_| keeper.offer_link_in_url());
            listen(&w, "storage", move |ev| {
                if let Some(ev) = ev.dyn_ref::<web_sys::StorageEvent>() {
                    keeper.on_storage(ev.key(), ev.new_value());
                }
            });
            if js_sys::Reflect::get(&w, &"headroomOffline".into()).ok().and_then(|v| v.as_bool()) == Some(true) {
                keeper.offline_ready.set(true);
            }
            listen(&w, "headroom-offline-ready", move |_| keeper.offline_ready.set(true));
        }
        if let Some(build) = build_id() {
            let _ = keeper.library.with_value(|l| l.kv().set(BUILD_KEY, &build));
        }
        keeper.ask_to_persist();
        keeper.drawn.set_value(true);
        keeper
    }

    fn autosave(&self) {
        let k = *self;
        // Saving a big sheet takes a few milliseconds, so it runs in a task
        // of its own right after the frame that shows the change (never
        // after a delay), one save for however many changes arrived
        // meanwhile: the results are on screen first. A hidden page paints
        // no frames, so a timer saves it there.
        let seen = StoredValue::new(None::<Sheet>);
        Effect::new(move |_| {
            let sheet = k.sheet.get();
            sheet.project.track();
            sheet.date.track();
            sheet.units.track();
            sheet.basis.track();
            sheet.system.track();
            sheet.lines.track();
            sheet.edited.track();
            if seen.get_value() != Some(sheet) {
                // A worksheet just opened: what it shows is what is stored.
                seen.set_value(Some(sheet));
                return;
            }
            if k.dirty.get_value() {
                return; // a save is already on its way
            }
            k.dirty.set_value(true);
            after_paint(move || k.save_now());
            after(HIDDEN_SAVE_MS, move || k.save_now());
        });
    }

    /// Saves the open worksheet now, if it has changes and this tab may.
    pub fn save_now(&self) {
        let id = self.current.get_untracked();
        if id.is_empty() || !self.dirty.get_value() || self.halted.get_untracked().is_some() {
            return;
        }
        let file = self.sheet.get_untracked().to_file();
        match self.library.with_value(|l| l.save(&id, &file, &now(), self.rev.get_value())) {
            Ok((list, rev)) => {
                self.rev.set_value(rev);
                self.dirty.set_value(false);
                self.failing.set(false);
                if self.entries.with_untracked(|e| *e != list) {
                    self.entries.set(list);
                }
            }
            Err(Problem::Conflict { .. }) => self.halted.set(Some(Halt::OtherTab)),
            Err(p) => {
                if !self.failing.get_untracked() {
                    self.notices.say(p.to_string());
                }
                self.failing.set(true);
            }
        }
    }

    /// Shows a worksheet file as the open one: a new [`Sheet`] in a scope
    /// of its own; the old one is disposed after the page is redrawn
    /// (at once while the keeper starts: nothing has been drawn yet).
    fn show(&self, id: &str, file: SheetFile, rev: u64) {
        self.current.set(id.to_owned());
        self.rev.set_value(rev);
        self.dirty.set_value(false);
        self.failing.set(false);
        self.halted.set(None);
        if !id.is_empty() {
            self.library.with_value(|l| l.set_current(id));
        }
        let fresh = self.root.with_value(|o| o.with(|| Sheet::from_file(file)));
        let old = self.sheet.get_untracked();
        self.sheet.set(fresh);
        if self.drawn.get_value() {
            old.dispose_later();
        } else {
            old.dispose_now();
        }
    }

    /// Reads a stored worksheet and shows it; `false` (with a notice) when
    /// it cannot be shown.
    fn load(&self, id: &str) -> bool {
        match self.library.with_value(|l| l.load(id)) {
            Ok(Some((file, rev))) => {
                self.show(id, file, rev);
                true
            }
            Ok(None) => false,
            Err(p) => {
                self.notices.say(p.to_string());
                self.refresh_lists();
                false
            }
        }
    }

    /// Opens a stored worksheet (the open one is saved first).
    pub fn open(&self, id: &str) {
        self.save_now();
        if !self.load(id) && self.current.get_untracked().is_empty() {
            let _ = self.create(blank());
        }
    }

    /// Stores a sheet as a new worksheet and opens it. When the store
    /// refuses, the sheet is still opened (unsaved) and the person told.
    ///
    /// # Errors
    /// The store's [`Problem`].
    pub fn create(&self, file: SheetFile) -> Result<(), Problem> {
        self.save_now();
        let id = new_id();
        match self.library.with_value(|l| l.save(&id, &file, &now(), 0)) {
            Ok((list, rev)) => {
                self.entries.set(list);
                self.show(&id, file, rev);
                Ok(())
            }
            Err(p) => {
                self.notices.say(p.to_string());
                self.show("", file, 0);
                Err(p)
            }
        }
    }

    /// Copies a stored worksheet and opens the copy.
    pub fn duplicate(&self, id: &str) {
        self.save_now();
        match self.library.with_value(|l| l.load(id)) {
            Ok(Some((mut file, _))) => {
                file.project = format!("{} (copy)", display_name(&file.project));
                let _ = self.create(file);
            }
            Err(p) => self.notices.say(p.to_string()),
            Ok(None) => self.notices.say("That worksheet could not be copied."),
        }
    }

    /// Moves a stored worksheet to the trash.
    pub fn delete(&self, id: &str) {
        self.save_now();
        match self.library.with_value(|l| l.remove(id, &now())) {
            Ok(gone) => self.last_deleted.set(gone.map(|t| t.entry)),
            Err(p) => {
                self.notices.say(format!("{p} The worksheet was not deleted."));
                return;
            }
        }
        self.refresh_lists();
        if self.current.get_untracked() == id {
            // Forget it first, so nothing saves it back.
            self.current.set(String::new());
            self.dirty.set_value(false);
            let next = self.entries.get_untracked().first().map(|e| e.id.clone());
            if !next.is_some_and(|n| self.load(&n)) {
                let _ = self.create(blank());
            }
        }
    }

    /// Brings a worksheet back from the trash.
    pub fn restore(&self, id: &str) {
        if let Err(p) = self.library.with_value(|l| l.restore(id)) {
            self.notices.say(p.to_string());
        }
        if self.last_deleted.with_untracked(|d| d.as_ref().is_some_and(|e| e.id == id)) {
            self.last_deleted.set(None);
        }
        self.refresh_lists();
    }

    /// Empties one worksheet from the trash for good.
    pub fn purge(&self, id: &str) {
        self.library.with_value(|l| l.purge(id));
        self.refresh_lists();
    }

    /// Discards an unreadable entry kept aside.
    pub fn discard_aside(&self, key: &str) {
        self.library.with_value(|l| l.discard_aside(key));
        self.refresh_lists();
    }

    /// Re-reads the worksheet list, the trash and what is kept aside.
    pub fn refresh_lists(&self) {
        let (list, _) = self.library.with_value(|l| l.entries());
        self.entries.set(list);
        self.trash.set(self.library.with_value(|l| l.trash()));
        self.aside.set(self.library.with_value(|l| l.aside()));
    }

    /// Renames a stored worksheet (its project name).
    pub fn rename(&self, id: &str, name: String) {
        if self.current.get_untracked() == id {
            self.sheet.get_untracked().project.set(name);
            return;
        }
        if let Ok(Some((mut file, rev))) = self.library.with_value(|l| l.load(id)) {
            file.project = name;
            if let Err(p) = self.library.with_value(|l| l.save(id, &file, &now(), rev)) {
                self.notices.say(p.to_string());
            }
            self.refresh_lists();
        }
    }

    /// Another tab wrote to storage.
    fn on_storage(&self, key: Option<String>, value: Option<String>) {
        let Some(key) = key else { return };
        let current = self.current.get_untracked();
        if key == BUILD_KEY {
            let mine = build_id().unwrap_or_default();
            if value.is_some_and(|v| !mine.is_empty() && v > mine) {
                // Whatever is waiting is saved with this (older) code first.
                self.save_now();
                self.halted.set(Some(Halt::NewerBuild));
            }
            return;
        }
        if !current.is_empty() && key == format!("{REV_PREFIX}{current}") {
            let theirs = value.and_then(|v| v.parse::<u64>().ok());
            if theirs != Some(self.rev.get_value()) && self.halted.get_untracked().is_none() {
                if self.dirty.get_value() {
                    self.halted.set(Some(Halt::OtherTab));
                } else if theirs.is_some() {
                    // Nothing of this tab's would be lost: follow the other tab.
                    self.load(&current);
                    self.notices
                        .say("This worksheet was changed in another tab or window; this tab now shows those changes.");
                } else {
                    self.notices.say("This worksheet was deleted in another tab or window. It is still shown here: keep it as a new worksheet to store it again.");
                    self.halted.set(Some(Halt::OtherTab));
                }
            }
            return;
        }
        // Another tab's keystrokes rewrite its sheet's key; only the keys
        // behind the lists are worth re-reading them for.
        if key == INDEX_KEY || key.starts_with(TRASH_PREFIX) || key.starts_with(ASIDE_PREFIX) {
            self.refresh_lists();
        }
    }

    /// After [`Halt::OtherTab`]: shows the stored (newer) copy, dropping
    /// this tab's unsaved changes.
    pub fn take_theirs(&self) {
        let id = self.current.get_untracked();
        self.halted.set(None);
        self.dirty.set_value(false);
        if !self.load(&id) {
            self.keep_mine();
        }
    }

    /// After a halt: stores this tab's copy as a new worksheet.
    pub fn keep_mine(&self) {
        let mut file = self.sheet.get_untracked().to_file();
        file.project = format!("{} (this tab's copy)", display_name(&file.project));
        self.halted.set(None);
        self.dirty.set_value(false);
        if self.create(file).is_ok() {
            self.notices.say("This tab's copy is kept as a new worksheet; the other copy is unchanged.");
        }
    }

    /// If the address carries a worksheet link, reads it and asks the
    /// person whether to open it. Nothing is stored until they agree, so a
    /// flood of links cannot fill storage.
    pub fn offer_link_in_url(&self) {
        let fragment = address_fragment();
        if fragment.is_empty() || !link::is_link(&fragment) {
            return;
        }
        if self.pending.with_untracked(|p| p.as_ref().is_some_and(|p| p.fragment == fragment)) {
            return;
        }
        let (pending, notices) = (self.pending, self.notices);
        wasm_bindgen_futures::spawn_local(async move {
            let read = super::share::read_fragment(fragment.clone()).await;
            // The browser inflates the link a moment later: if another
            // link has come into the address meanwhile, only that one is
            // offered (it is being read too).
            if address_fragment() != fragment {
                return;
            }
            match read {
                Ok(file) => pending.set(Some(PendingLink { fragment, file })),
                Err(e) => notices.say(format!("The link could not be opened: {e}.")),
            }
        });
    }

    /// Opens the pending link as a new worksheet beside the stored ones;
    /// the address is cleared only once it is stored.
    pub fn accept_link(&self) {
        let Some(p) = self.pending.get_untracked() else { return };
        self.pending.set(None);
        let name = display_name(&p.file.project);
        match self.create(p.file) {
            Ok(()) => {
                clear_fragment(&p.fragment);
                self.notices.say(format!("Opened the shared worksheet “{name}” as a new worksheet. Your other worksheets are unchanged."));
            }
            Err(_) => self.notices.say(format!(
                "The shared worksheet “{name}” is open but could not be stored on this device. The link stays in the address bar, so nothing is lost."
            )),
        }
    }

    /// Leaves the pending link unopened (it stays in the address bar).
    pub fn decline_link(&self) {
        self.pending.set(None);
    }

    fn ask_to_persist(&self) {
        let Some(w) = web_sys::window() else { return };
        let nav = w.navigator();
        let has = js_sys::Reflect::get(&nav, &"storage".into()).is_ok_and(|s| !s.is_undefined());
        if !has {
            return;
        }
        let Ok(promise) = nav.storage().persist() else { return };
        let persisted = self.persisted;
        super::when_settled(promise, Box::new(move |r| persisted.set(r.ok().and_then(|v| v.as_bool()))));
    }
}

/// Offers text as a file download.
pub fn download(name: &str, mime: &str, text: &str) {
    let Some(document) = web_sys::window().and_then(|w| w.document()) else { return };
    let parts = js_sys::Array::of1(&text.into());
    let opts = web_sys::BlobPropertyBag::new();
    opts.set_type(mime);
    let Ok(blob) = web_sys::Blob::new_with_str_sequence_and_options(&parts, &opts) else { return };
    let Ok(url) = web_sys::Url::create_object_url_with_blob(&blob) else { return };
    if let Ok(a) = document.create_element("a") {
        let a: web_sys::HtmlAnchorElement = a.unchecked_into();
        a.set_href(&url);
        a.set_download(name);
        a.click();
    }
    let _ = web_sys::Url::revoke_object_url(&url);
}

/// A file name from a project name: the letters and digits of any script
/// (what `char::is_alphanumeric` keeps), every run of anything else one
/// dash, ASCII letters in lower case, at most 60 characters.
pub fn file_stem(project: &str) -> String {
    // The browser's Unicode tables (`\p{Alphabetic}`, `\p{N}`: the
    // properties `char::is_alphanumeric` reads), not core's: those were
    // 1.7 KB gzip of the module for this one use (tests/browser.rs holds the
    // two to the same answer).
    let others = js_sys::RegExp::new(r"[^\p{Alphabetic}\p{N}]+", "gu");
    let s = String::from(js_sys::JsString::from(project).replace_by_pattern(&others, "-")).to_ascii_lowercase();
    let s = s.split('-').filter(|p| !p.is_empty()).collect::<Vec<_>>().join("-");
    if s.is_empty() {
        "worksheet".to_owned()
    } else {
        s.chars().take(60).collect()
    }
}
