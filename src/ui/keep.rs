//! Keeping work: autosave to local storage, several named worksheets,
//! links in the URL fragment, sheet files in and out, and the notices that
//! tell the person when any of it failed.

use leptos::prelude::*;
use wasm_bindgen::JsCast;

use super::state::Sheet;
use crate::sheet::file::{SheetFile, FORMAT, VERSION};
use crate::sheet::library::{display_name, Entry, Kv, Library, Problem, StoreError};
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
            if name.contains("Quota") { StoreError::Full } else { StoreError::Unavailable }
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

/// The worksheets on this device and the one open now.
#[derive(Clone, Copy)]
pub struct Keeper {
    /// The store (browser objects are not `Send`, so it is kept locally).
    pub library: StoredValue<Library<WebKv>, LocalStorage>,
    /// Id of the open worksheet.
    pub current: RwSignal<String>,
    /// Stored worksheets, as listed.
    pub entries: RwSignal<Vec<Entry>>,
    /// The last deleted worksheet, for undo.
    pub removed: RwSignal<Option<(Entry, String)>>,
    /// Whether the last save failed (so the notice is not repeated per key).
    pub failing: RwSignal<bool>,
    notices: Notices,
}

fn now() -> String {
    js_sys::Date::new_0().to_iso_string().as_string().unwrap_or_default()
}

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
        version: VERSION,
        project: String::new(),
        date: String::new(),
        units: Default::default(),
        lines: Vec::new(),
    }
}

impl Keeper {
    /// Opens storage, opens the right worksheet (a shared link first, else
    /// the last one open) and starts saving every change.
    pub fn start(sheet: Sheet, notices: Notices) -> Keeper {
        let kv = WebKv::open();
        if !kv.available() {
            notices.say(Problem::NotSaved(StoreError::Unavailable).to_string());
        }
        let library = StoredValue::new_local(Library::new(kv));
        let (entries, problem) = library.with_value(|l| l.entries());
        if let Some(p) = problem {
            notices.say(p.to_string());
        }
        let keeper = Keeper {
            library,
            current: RwSignal::new(String::new()),
            entries: RwSignal::new(entries),
            removed: RwSignal::new(None),
            failing: RwSignal::new(false),
            notices,
        };
        let opened_link = keeper.open_link_in_url(sheet, notices);
        if !opened_link {
            let id = keeper.library.with_value(|l| l.current()).or_else(|| keeper.entries.get_untracked().first().map(|e| e.id.clone()));
            match id {
                Some(id) => keeper.open(&id, sheet, notices),
                None => keeper.create(blank(), sheet),
            }
        }
        keeper.autosave(sheet, notices);
        let k = keeper;
        let on_hash = wasm_bindgen::closure::Closure::<dyn FnMut()>::new(move || {
            k.open_link_in_url(sheet, notices);
        });
        if let Some(w) = web_sys::window() {
            let _ = w.add_event_listener_with_callback("hashchange", on_hash.as_ref().unchecked_ref());
        }
        on_hash.forget();
        keeper
    }

    fn autosave(&self, sheet: Sheet, notices: Notices) {
        let k = *self;
        // Saving a big sheet takes a few milliseconds, so it runs in a task
        // of its own right after the change (never after a delay), one
        // save for however many changes arrived meanwhile. The results are
        // on screen first.
        let scheduled = StoredValue::new(false);
        Effect::new(move |_| {
            sheet.project.track();
            sheet.date.track();
            sheet.units.track();
            sheet.lines.with(|v| v.iter().for_each(|s| s.file.track()));
            if scheduled.get_value() {
                return;
            }
            scheduled.set_value(true);
            let save = wasm_bindgen::closure::Closure::once_into_js(move || {
                scheduled.set_value(false);
                k.save_now(sheet, notices);
            });
            if let Some(w) = web_sys::window() {
                let _ = w.set_timeout_with_callback(save.unchecked_ref());
            }
        });
    }

    /// Saves the open worksheet now.
    pub fn save_now(&self, sheet: Sheet, notices: Notices) {
        let id = self.current.get_untracked();
        if id.is_empty() {
            return;
        }
        match self.library.with_value(|l| l.save(&id, &sheet.to_file(), &now())) {
            Ok(list) => {
                self.failing.set(false);
                self.entries.set(list);
            }
            Err(p) => {
                if !self.failing.get_untracked() {
                    notices.say(p.to_string());
                }
                self.failing.set(true);
            }
        }
    }

    /// Opens a stored worksheet; a damaged one is kept aside and a fresh one opened.
    pub fn open(&self, id: &str, sheet: Sheet, notices: Notices) {
        // A change still waiting to be saved belongs to the sheet open now.
        self.save_now(sheet, notices);
        match self.library.with_value(|l| l.load(id)) {
            Ok(Some(file)) => {
                self.current.set(id.to_owned());
                self.library.with_value(|l| l.set_current(id));
                sheet.load(file);
            }
            Ok(None) => self.create(blank(), sheet),
            Err(p) => {
                notices.say(p.to_string());
                self.entries.set(self.library.with_value(|l| l.entries()).0);
                self.create(blank(), sheet);
            }
        }
    }

    /// Stores a sheet as a new worksheet and opens it.
    pub fn create(&self, file: SheetFile, sheet: Sheet) {
        self.save_now(sheet, self.notices);
        let id = new_id();
        let _ = self.library.with_value(|l| l.save(&id, &file, &now()));
        self.current.set(id.clone());
        self.library.with_value(|l| l.set_current(&id));
        self.entries.set(self.library.with_value(|l| l.entries()).0);
        sheet.load(file);
    }

    /// Copies a stored worksheet and opens the copy.
    pub fn duplicate(&self, id: &str, sheet: Sheet, notices: Notices) {
        if let Ok(Some(mut file)) = self.library.with_value(|l| l.load(id)) {
            file.project = format!("{} (copy)", display_name(&file.project));
            self.create(file, sheet);
        } else {
            notices.say("That worksheet could not be copied.");
        }
    }

    /// Deletes a stored worksheet (undo brings it back).
    pub fn delete(&self, id: &str, sheet: Sheet, notices: Notices) {
        if let Some(gone) = self.library.with_value(|l| l.remove(id)) {
            self.removed.set(Some(gone));
        }
        self.entries.set(self.library.with_value(|l| l.entries()).0);
        if self.current.get_untracked() == id {
            // Forget it first, so nothing saves it back.
            self.current.set(String::new());
            match self.entries.get_untracked().first().map(|e| e.id.clone()) {
                Some(next) => self.open(&next, sheet, notices),
                None => self.create(blank(), sheet),
            }
        }
    }

    /// Brings back the last deleted worksheet.
    pub fn undo_delete(&self, notices: Notices) {
        if let Some((entry, text)) = self.removed.get_untracked() {
            if let Err(p) = self.library.with_value(|l| l.restore(entry, &text)) {
                notices.say(p.to_string());
            }
            self.removed.set(None);
            self.entries.set(self.library.with_value(|l| l.entries()).0);
        }
    }

    /// Renames a stored worksheet (its project name).
    pub fn rename(&self, id: &str, name: String, sheet: Sheet, notices: Notices) {
        if self.current.get_untracked() == id {
            sheet.project.set(name);
            return;
        }
        if let Ok(Some(mut file)) = self.library.with_value(|l| l.load(id)) {
            file.project = name;
            if let Err(p) = self.library.with_value(|l| l.save(id, &file, &now())) {
                notices.say(p.to_string());
            }
            self.entries.set(self.library.with_value(|l| l.entries()).0);
        }
    }

    /// If the address carries a worksheet link, opens it as a new worksheet
    /// beside the stored ones and clears it from the address.
    pub fn open_link_in_url(&self, sheet: Sheet, notices: Notices) -> bool {
        let Some(w) = web_sys::window() else { return false };
        let hash = w.location().hash().unwrap_or_default();
        let fragment = hash.trim_start_matches('#');
        if fragment.is_empty() || !link::is_link(fragment) {
            return false;
        }
        // Clear the fragment first, so a reload does not open it again.
        if let Ok(history) = w.history() {
            let path = w.location().pathname().unwrap_or_default() + &w.location().search().unwrap_or_default();
            let _ = history.replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&path));
        }
        match link::decode(fragment) {
            Ok(file) => {
                let name = display_name(&file.project);
                self.create(file, sheet);
                notices.say(format!("Opened the shared worksheet “{name}” as a new worksheet. Your other worksheets are unchanged."));
                true
            }
            Err(e) => {
                notices.say(format!("The link could not be opened: {e}."));
                false
            }
        }
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

/// A file name from a project name: letters, digits and dashes only.
pub fn file_stem(project: &str) -> String {
    let s: String = project
        .chars()
        .map(|c| if c.is_alphanumeric() { c.to_ascii_lowercase() } else { '-' })
        .collect();
    let s = s.split('-').filter(|p| !p.is_empty()).collect::<Vec<_>>().join("-");
    if s.is_empty() { "worksheet".to_owned() } else { s.chars().take(60).collect() }
}
