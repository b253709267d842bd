//! The worksheets kept on this device: several named sheets in a key–value
//! store (the browser's local storage on the page, a map in tests).
//!
//! - Every sheet is stored whole, as its sheet-file JSON, under a key of its
//!   own; an index keeps their order and names. A damaged index is rebuilt
//!   from the sheets; a damaged sheet is moved aside under another key,
//!   never overwritten, and reported.
//! - The store can refuse a write (full, or disabled); that is reported,
//!   never hidden. No clock here: the caller supplies ids and times.

use serde::{Deserialize, Serialize};

use super::file::SheetFile;

/// Key of the index.
pub const INDEX_KEY: &str = "headroom.v1.index";
/// Key prefix of a stored sheet.
pub const SHEET_PREFIX: &str = "headroom.v1.sheet.";
/// Key prefix of an entry moved aside because it could not be read.
pub const ASIDE_PREFIX: &str = "headroom.v1.aside.";
/// Key of the id of the sheet last open.
pub const CURRENT_KEY: &str = "headroom.v1.current";

/// Why the store refused.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StoreError {
    /// Out of space.
    Full,
    /// Storage is switched off or not allowed.
    Unavailable,
}

/// A key–value store of strings.
pub trait Kv {
    /// The value of a key.
    fn get(&self, key: &str) -> Option<String>;
    /// Writes a key.
    ///
    /// # Errors
    /// [`StoreError`] when the store refuses.
    fn set(&self, key: &str, value: &str) -> Result<(), StoreError>;
    /// Removes a key.
    fn remove(&self, key: &str);
    /// Every key.
    fn keys(&self) -> Vec<String>;
}

/// One stored worksheet, as listed.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct Entry {
    /// Key suffix, unique on this device.
    pub id: String,
    /// The sheet's project name when last saved.
    pub name: String,
    /// When last saved, as the caller wrote it.
    pub updated: String,
}

/// Something the person should be told about the store.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Problem {
    /// A sheet could not be read; it was moved to `aside_key`.
    Damaged {
        /// The sheet's id.
        id: String,
        /// Where the unreadable text now is.
        aside_key: String,
        /// What was wrong.
        reason: String,
    },
    /// The index could not be read and was rebuilt from the sheets.
    IndexRebuilt,
    /// A write was refused.
    NotSaved(StoreError),
}

impl std::fmt::Display for Problem {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Problem::Damaged { aside_key, reason, .. } => write!(
                f,
                "A stored worksheet could not be read ({reason}). It has been kept, untouched, under \"{aside_key}\" and a fresh worksheet opened."
            ),
            Problem::IndexRebuilt => write!(f, "The list of stored worksheets was damaged and has been rebuilt from the worksheets themselves."),
            Problem::NotSaved(StoreError::Full) => write!(
                f,
                "Not saved: this device's storage for Headroom is full. Export the worksheet as a file, or delete old worksheets."
            ),
            Problem::NotSaved(StoreError::Unavailable) => write!(
                f,
                "Not saved: this browser is not letting Headroom store anything, so work will be lost on reload. Export it as a file."
            ),
        }
    }
}

/// The worksheets in a store.
pub struct Library<K: Kv> {
    kv: K,
}

/// How a worksheet is named in lists and messages: its project name, or
/// "Untitled worksheet".
pub fn display_name(project: &str) -> String {
    let n = project.trim();
    if n.is_empty() { "Untitled worksheet".to_owned() } else { n.to_owned() }
}

impl<K: Kv> Library<K> {
    /// A library over a store.
    pub fn new(kv: K) -> Self {
        Library { kv }
    }

    /// The store itself.
    pub fn kv(&self) -> &K {
        &self.kv
    }

    /// The stored worksheets in order, rebuilding a damaged index.
    pub fn entries(&self) -> (Vec<Entry>, Option<Problem>) {
        match self.kv.get(INDEX_KEY).map(|t| serde_json::from_str::<Vec<Entry>>(&t)) {
            None => (Vec::new(), None),
            Some(Ok(list)) => (list, None),
            Some(Err(_)) => {
                let raw = self.kv.get(INDEX_KEY).unwrap_or_default();
                let _ = self.kv.set(&format!("{ASIDE_PREFIX}index"), &raw);
                let mut list: Vec<Entry> = self
                    .kv
                    .keys()
                    .into_iter()
                    .filter_map(|k| k.strip_prefix(SHEET_PREFIX).map(str::to_owned))
                    .map(|id| {
                        let name = self
                            .kv
                            .get(&format!("{SHEET_PREFIX}{id}"))
                            .and_then(|t| SheetFile::from_json(&t).ok())
                            .map(|s| display_name(&s.project))
                            .unwrap_or_else(|| "Unreadable worksheet".to_owned());
                        Entry { id, name, updated: String::new() }
                    })
                    .collect();
                list.sort_by(|a, b| a.id.cmp(&b.id));
                let _ = self.write_index(&list);
                (list, Some(Problem::IndexRebuilt))
            }
        }
    }

    fn write_index(&self, list: &[Entry]) -> Result<(), StoreError> {
        self.kv.set(INDEX_KEY, &serde_json::to_string(list).unwrap_or_default())
    }

    /// Reads one worksheet. A damaged one is moved aside and reported.
    ///
    /// # Errors
    /// [`Problem::Damaged`], or `Ok(None)` when there is no such sheet.
    pub fn load(&self, id: &str) -> Result<Option<SheetFile>, Problem> {
        let key = format!("{SHEET_PREFIX}{id}");
        let Some(text) = self.kv.get(&key) else { return Ok(None) };
        match SheetFile::from_json(&text) {
            Ok(s) => Ok(Some(s)),
            Err(e) => {
                let aside_key = self.aside_key(id);
                // Keep the text first; only then free the sheet's key.
                if self.kv.set(&aside_key, &text).is_ok() {
                    self.kv.remove(&key);
                }
                Err(Problem::Damaged { id: id.to_owned(), aside_key, reason: e.to_string() })
            }
        }
    }

    fn aside_key(&self, id: &str) -> String {
        let keys = self.kv.keys();
        let mut n = 1;
        loop {
            let k = format!("{ASIDE_PREFIX}{id}.{n}");
            if !keys.contains(&k) {
                return k;
            }
            n += 1;
        }
    }

    /// Saves a worksheet under an id, adding it to the index if new, and
    /// returns the list as it now stands.
    ///
    /// # Errors
    /// [`Problem::NotSaved`] when the store refuses.
    pub fn save(&self, id: &str, sheet: &SheetFile, updated: &str) -> Result<Vec<Entry>, Problem> {
        self.kv
            .set(&format!("{SHEET_PREFIX}{id}"), &serde_json::to_string(sheet).unwrap_or_default())
            .map_err(Problem::NotSaved)?;
        let (mut list, _) = self.entries();
        let entry = Entry { id: id.to_owned(), name: display_name(&sheet.project), updated: updated.to_owned() };
        match list.iter_mut().find(|e| e.id == id) {
            Some(e) if *e == entry => return Ok(list),
            Some(e) => *e = entry,
            None => list.push(entry),
        }
        self.write_index(&list).map_err(Problem::NotSaved)?;
        Ok(list)
    }

    /// Removes a worksheet, returning its stored text for an undo.
    pub fn remove(&self, id: &str) -> Option<(Entry, String)> {
        let key = format!("{SHEET_PREFIX}{id}");
        let text = self.kv.get(&key)?;
        let (mut list, _) = self.entries();
        let pos = list.iter().position(|e| e.id == id);
        let entry = pos.map(|p| list.remove(p)).unwrap_or(Entry { id: id.to_owned(), name: String::new(), updated: String::new() });
        let _ = self.write_index(&list);
        self.kv.remove(&key);
        Some((entry, text))
    }

    /// Puts back what [`Library::remove`] returned.
    ///
    /// # Errors
    /// [`Problem::NotSaved`] when the store refuses.
    pub fn restore(&self, entry: Entry, text: &str) -> Result<(), Problem> {
        self.kv.set(&format!("{SHEET_PREFIX}{}", entry.id), text).map_err(Problem::NotSaved)?;
        let (mut list, _) = self.entries();
        if !list.iter().any(|e| e.id == entry.id) {
            list.push(entry);
        }
        self.write_index(&list).map_err(Problem::NotSaved)
    }

    /// The id last open, if it still exists.
    pub fn current(&self) -> Option<String> {
        let id = self.kv.get(CURRENT_KEY)?;
        self.kv.get(&format!("{SHEET_PREFIX}{id}")).map(|_| id)
    }

    /// Remembers the id open now.
    pub fn set_current(&self, id: &str) {
        let _ = self.kv.set(CURRENT_KEY, id);
    }
}

/// An in-memory store for tests, which can be made to refuse writes.
#[derive(Debug, Default)]
pub struct MemoryKv {
    map: std::cell::RefCell<std::collections::BTreeMap<String, String>>,
    /// When set, every write fails with this.
    pub refuse: std::cell::Cell<Option<StoreError>>,
}

impl Kv for MemoryKv {
    fn get(&self, key: &str) -> Option<String> {
        self.map.borrow().get(key).cloned()
    }
    fn set(&self, key: &str, value: &str) -> Result<(), StoreError> {
        match self.refuse.get() {
            Some(e) => Err(e),
            None => {
                self.map.borrow_mut().insert(key.to_owned(), value.to_owned());
                Ok(())
            }
        }
    }
    fn remove(&self, key: &str) {
        self.map.borrow_mut().remove(key);
    }
    fn keys(&self) -> Vec<String> {
        self.map.borrow().keys().cloned().collect()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn sheet(name: &str) -> SheetFile {
        let mut s = SheetFile::from_json(include_str!("../../examples/clinic-chilled-water.json")).unwrap();
        s.project = name.to_owned();
        s
    }

    #[test]
    fn save_list_load_remove_restore() {
        let lib = Library::new(MemoryKv::default());
        lib.save("a", &sheet("Clinic"), "t1").unwrap();
        lib.save("b", &sheet("Greenhouse"), "t2").unwrap();
        let (list, problem) = lib.entries();
        assert!(problem.is_none());
        assert_eq!(list.iter().map(|e| e.name.as_str()).collect::<Vec<_>>(), ["Clinic", "Greenhouse"]);
        assert_eq!(lib.load("b").unwrap().unwrap().project, "Greenhouse");
        let (entry, text) = lib.remove("a").unwrap();
        assert_eq!(lib.entries().0.len(), 1);
        lib.restore(entry, &text).unwrap();
        assert_eq!(lib.load("a").unwrap().unwrap().project, "Clinic");
    }

    #[test]
    fn a_damaged_sheet_is_kept_aside_not_overwritten() {
        let lib = Library::new(MemoryKv::default());
        lib.save("a", &sheet("Clinic"), "t1").unwrap();
        lib.kv().set(&format!("{SHEET_PREFIX}a"), "{\"format\":\"headroom-sheet\",\"vers").unwrap();
        let Err(Problem::Damaged { aside_key, .. }) = lib.load("a") else { panic!("expected damage") };
        assert_eq!(lib.kv().get(&aside_key).unwrap(), "{\"format\":\"headroom-sheet\",\"vers");
        // Saving a fresh sheet under the same id does not touch the kept text.
        lib.save("a", &sheet("Fresh"), "t2").unwrap();
        assert_eq!(lib.kv().get(&aside_key).unwrap(), "{\"format\":\"headroom-sheet\",\"vers");
        // A second damage goes to a second key.
        lib.kv().set(&format!("{SHEET_PREFIX}a"), "garbage").unwrap();
        let Err(Problem::Damaged { aside_key: second, .. }) = lib.load("a") else { panic!() };
        assert_ne!(second, aside_key);
    }

    #[test]
    fn a_damaged_index_is_rebuilt() {
        let lib = Library::new(MemoryKv::default());
        lib.save("a", &sheet("Clinic"), "t1").unwrap();
        lib.kv().set(INDEX_KEY, "[{oops").unwrap();
        let (list, problem) = lib.entries();
        assert_eq!(problem, Some(Problem::IndexRebuilt));
        assert_eq!(list[0].name, "Clinic");
        assert_eq!(lib.kv().get(&format!("{ASIDE_PREFIX}index")).unwrap(), "[{oops");
    }

    #[test]
    fn refused_writes_are_reported() {
        let lib = Library::new(MemoryKv::default());
        lib.kv().refuse.set(Some(StoreError::Full));
        assert_eq!(lib.save("a", &sheet("x"), "t"), Err(Problem::NotSaved(StoreError::Full)));
        assert!(Problem::NotSaved(StoreError::Full).to_string().contains("storage for Headroom is full"));
    }
}
