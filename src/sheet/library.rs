//! The worksheets kept on this device: several named sheets in a key–value
//! store (the browser's local storage on the page, a map in tests).
//!
//! - Every sheet is stored whole, as its sheet-file JSON, under a key of its
//!   own, with a revision number under another; an index keeps their order
//!   and names. The index is only a cache: [`Library::reconcile`] rebuilds
//!   it from the stored keys, so writes from two tabs cannot lose a sheet.
//! - A write names the revision it was based on and is refused when the
//!   stored revision has moved on ([`Problem::Conflict`]): two tabs on one
//!   sheet never silently overwrite each other.
//! - Nothing is destroyed by accident: a damaged sheet is moved aside under
//!   another key (listed by [`Library::aside`]); a sheet saved by a newer
//!   Headroom is left exactly as it is; a deleted sheet goes to a trash
//!   ([`Library::trash`]) until restored or purged.
//! - The store can refuse a write (full, or disabled); that is reported,
//!   never hidden. No clock here: the caller supplies ids and times.

use serde::{Deserialize, Serialize};

use super::file::{SheetError, SheetFile};
use super::order::sorted_by;
use super::records;

/// Key of the index.
pub const INDEX_KEY: &str = "headroom.v1.index";
/// Key prefix of a stored sheet.
pub const SHEET_PREFIX: &str = "headroom.v1.sheet.";
/// Key prefix of a stored sheet's revision (a whole number; absent is 0).
pub const REV_PREFIX: &str = "headroom.v1.rev.";
/// Key prefix of an entry moved aside because it could not be read.
pub const ASIDE_PREFIX: &str = "headroom.v1.aside.";
/// Key prefix of a deleted sheet in the trash.
pub const TRASH_PREFIX: &str = "headroom.v1.trash.";
/// Key of the id of the sheet last open.
pub const CURRENT_KEY: &str = "headroom.v1.current";
/// Key of the build of Headroom that started last on this device.
pub const BUILD_KEY: &str = "headroom.v1.build";

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

/// A deleted worksheet waiting in the trash.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct Trashed {
    /// How it was listed.
    pub entry: Entry,
    /// When it was deleted, as the caller wrote it (ISO 8601 sorts).
    pub deleted: String,
    /// The stored text, exactly.
    pub text: String,
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
    /// A sheet was saved by a newer Headroom; it is left untouched.
    Newer {
        /// The sheet's id.
        id: String,
        /// The format version it has.
        version: u32,
    },
    /// The stored sheet has a newer revision than the one this copy was
    /// based on: another tab or window saved it meanwhile.
    Conflict {
        /// The sheet's id.
        id: String,
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
                "A stored worksheet could not be read ({reason}). It has been kept, untouched, under \"{aside_key}\" (see Worksheets, \"Kept aside\", to download it)."
            ),
            Problem::Newer { version, .. } => write!(
                f,
                "This worksheet was saved by a newer Headroom (sheet format {version}). It is left untouched; open it in the newer version."
            ),
            Problem::Conflict { .. } => write!(
                f,
                "This worksheet was changed in another tab or window. This tab has stopped saving it, so neither copy overwrites the other."
            ),
            Problem::IndexRebuilt => write!(f, "The list of stored worksheets was damaged and has been rebuilt from the worksheets themselves."),
            Problem::NotSaved(StoreError::Full) => write!(
                f,
                "Not saved: this device's storage for Headroom is full. Export the worksheet as a file, or delete old worksheets and empty the trash."
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
    if n.is_empty() {
        "Untitled worksheet".to_owned()
    } else {
        n.to_owned()
    }
}

/// The project name in stored text, read loosely (any version, damaged
/// shapes allowed) for listing only.
fn peek_name(text: &str) -> Option<String> {
    records::from_text(text, records::project).ok().map(|p| display_name(&p))
}

fn sheet_key(id: &str) -> String {
    format!("{SHEET_PREFIX}{id}")
}

fn rev_key(id: &str) -> String {
    format!("{REV_PREFIX}{id}")
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

    /// The stored worksheets in index order, rebuilding a damaged index.
    pub fn entries(&self) -> (Vec<Entry>, Option<Problem>) {
        match self.kv.get(INDEX_KEY).map(|t| records::from_text(&t, records::entries)) {
            None => (Vec::new(), None),
            Some(Ok(list)) => (list, None),
            Some(Err(_)) => {
                let raw = self.kv.get(INDEX_KEY).unwrap_or_default();
                let _ = self.kv.set(&format!("{ASIDE_PREFIX}index"), &raw);
                self.kv.remove(INDEX_KEY);
                (self.reconcile(), Some(Problem::IndexRebuilt))
            }
        }
    }

    /// Makes the index agree with the stored sheets: entries whose sheet is
    /// gone are dropped, sheets missing from it are added (by id order).
    /// Run at start and whenever another tab changed the index, since two
    /// tabs writing it at once can each drop the other's entry.
    pub fn reconcile(&self) -> Vec<Entry> {
        let listed: Vec<Entry> =
            self.kv.get(INDEX_KEY).and_then(|t| records::from_text(&t, records::entries).ok()).unwrap_or_default();
        let stored: Vec<String> =
            self.kv.keys().into_iter().filter_map(|k| k.strip_prefix(SHEET_PREFIX).map(str::to_owned)).collect();
        let stored = sorted_by(stored, &|a, b| a.cmp(b));
        let mut list: Vec<Entry> = listed.iter().filter(|e| stored.contains(&e.id)).cloned().collect();
        for id in stored {
            if !list.iter().any(|e| e.id == id) {
                let name = self
                    .kv
                    .get(&sheet_key(&id))
                    .and_then(|t| peek_name(&t))
                    .unwrap_or_else(|| "Unreadable worksheet".to_owned());
                list.push(Entry { id, name, updated: String::new() });
            }
        }
        if list != listed {
            let _ = self.write_index(&list);
        }
        list
    }

    fn write_index(&self, list: &[Entry]) -> Result<(), StoreError> {
        self.kv.set(INDEX_KEY, &records::write_entries(list))
    }

    fn drop_from_index(&self, id: &str) {
        let (mut list, _) = self.entries();
        if let Some(p) = list.iter().position(|e| e.id == id) {
            list.remove(p);
            let _ = self.write_index(&list);
        }
    }

    /// The stored revision of a sheet (0 when it has none).
    pub fn revision(&self, id: &str) -> u64 {
        self.kv.get(&rev_key(id)).and_then(|t| t.trim().parse().ok()).unwrap_or(0)
    }

    /// Reads one worksheet with its revision. A damaged one is moved aside
    /// (and dropped from the index) and reported; one saved by a newer
    /// Headroom is left exactly where it is.
    ///
    /// # Errors
    /// [`Problem::Damaged`] or [`Problem::Newer`]; `Ok(None)` when there is
    /// no such sheet.
    pub fn load(&self, id: &str) -> Result<Option<(SheetFile, u64)>, Problem> {
        let key = sheet_key(id);
        let Some(text) = self.kv.get(&key) else { return Ok(None) };
        match SheetFile::from_json(&text) {
            Ok(s) => Ok(Some((s, self.revision(id)))),
            Err(SheetError::Version(version)) => Err(Problem::Newer { id: id.to_owned(), version }),
            Err(e) => {
                let aside_key = self.aside_key(id);
                // Keep the text first; only then free the sheet's key.
                if self.kv.set(&aside_key, &text).is_ok() {
                    self.kv.remove(&key);
                    self.kv.remove(&rev_key(id));
                    self.drop_from_index(id);
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

    /// Saves a worksheet under an id if the stored revision is still
    /// `based_on` (0 for a new sheet), adds it to the index if new, and
    /// returns the list as it now stands with the new revision.
    ///
    /// # Errors
    /// [`Problem::Conflict`] when another writer saved a newer revision
    /// (nothing is written); [`Problem::NotSaved`] when the store refuses.
    pub fn save(
        &self,
        id: &str,
        sheet: &SheetFile,
        updated: &str,
        based_on: u64,
    ) -> Result<(Vec<Entry>, u64), Problem> {
        if self.revision(id) != based_on {
            return Err(Problem::Conflict { id: id.to_owned() });
        }
        self.kv.set(&sheet_key(id), &sheet.to_compact_json()).map_err(Problem::NotSaved)?;
        let rev = based_on + 1;
        self.kv.set(&rev_key(id), &rev.to_string()).map_err(Problem::NotSaved)?;
        let (mut list, _) = self.entries();
        let entry = Entry { id: id.to_owned(), name: display_name(&sheet.project), updated: updated.to_owned() };
        match list.iter_mut().find(|e| e.id == id) {
            Some(e) if *e == entry => return Ok((list, rev)),
            Some(e) => *e = entry,
            None => list.push(entry),
        }
        self.write_index(&list).map_err(Problem::NotSaved)?;
        Ok((list, rev))
    }

    /// Moves a worksheet to the trash, stamped `deleted`.
    ///
    /// # Errors
    /// [`Problem::NotSaved`] when the trash cannot be written; the sheet is
    /// then left where it was.
    pub fn remove(&self, id: &str, deleted: &str) -> Result<Option<Trashed>, Problem> {
        let key = sheet_key(id);
        let Some(text) = self.kv.get(&key) else { return Ok(None) };
        let (list, _) = self.entries();
        let entry = list.iter().find(|e| e.id == id).cloned().unwrap_or_else(|| Entry {
            id: id.to_owned(),
            name: peek_name(&text).unwrap_or_default(),
            updated: String::new(),
        });
        let trashed = Trashed { entry, deleted: deleted.to_owned(), text };
        self.kv
            .set(&format!("{TRASH_PREFIX}{id}"), &{
                let mut o = records::Out::new(false);
                trashed.write(&mut o);
                o.done()
            })
            .map_err(Problem::NotSaved)?;
        self.kv.remove(&key);
        self.kv.remove(&rev_key(id));
        self.drop_from_index(id);
        Ok(Some(trashed))
    }

    /// What is in the trash, most recently deleted first.
    pub fn trash(&self) -> Vec<Trashed> {
        let list: Vec<Trashed> = self
            .kv
            .keys()
            .into_iter()
            .filter(|k| k.starts_with(TRASH_PREFIX))
            .filter_map(|k| self.kv.get(&k).and_then(|t| records::from_text(&t, Trashed::read).ok()))
            .collect();
        sorted_by(list, &|a: &Trashed, b| b.deleted.cmp(&a.deleted))
    }

    /// Puts a deleted worksheet back where it was listed (at the end).
    ///
    /// # Errors
    /// [`Problem::NotSaved`] when the store refuses.
    pub fn restore(&self, id: &str) -> Result<(), Problem> {
        let key = format!("{TRASH_PREFIX}{id}");
        let Some(t) = self.kv.get(&key).and_then(|t| records::from_text(&t, Trashed::read).ok()) else { return Ok(()) };
        // Another sheet never shares an id, but never overwrite one.
        if self.kv.get(&sheet_key(id)).is_some() {
            return Err(Problem::Conflict { id: id.to_owned() });
        }
        self.kv.set(&sheet_key(id), &t.text).map_err(Problem::NotSaved)?;
        let rev = self.revision(id) + 1;
        let _ = self.kv.set(&rev_key(id), &rev.to_string());
        self.kv.remove(&key);
        let (mut list, _) = self.entries();
        if !list.iter().any(|e| e.id == id) {
            list.push(t.entry);
        }
        self.write_index(&list).map_err(Problem::NotSaved)
    }

    /// Empties one worksheet from the trash for good.
    pub fn purge(&self, id: &str) {
        self.kv.remove(&format!("{TRASH_PREFIX}{id}"));
    }

    /// Empties every worksheet deleted before `cutoff` (same clock and form
    /// as the `deleted` stamps); returns how many went.
    pub fn purge_before(&self, cutoff: &str) -> usize {
        let old: Vec<String> =
            self.trash().into_iter().filter(|t| t.deleted.as_str() < cutoff).map(|t| t.entry.id).collect();
        for id in &old {
            self.purge(id);
        }
        old.len()
    }

    /// Entries moved aside as unreadable: key and stored text.
    pub fn aside(&self) -> Vec<(String, String)> {
        self.kv
            .keys()
            .into_iter()
            .filter(|k| k.starts_with(ASIDE_PREFIX))
            .filter_map(|k| self.kv.get(&k).map(|t| (k, t)))
            .collect()
    }

    /// Discards an entry kept aside (after the person has downloaded it).
    pub fn discard_aside(&self, key: &str) {
        if key.starts_with(ASIDE_PREFIX) {
            self.kv.remove(key);
        }
    }

    /// The id last open, if it still exists.
    pub fn current(&self) -> Option<String> {
        let id = self.kv.get(CURRENT_KEY)?;
        self.kv.get(&sheet_key(&id)).map(|_| id)
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
    fn save_list_load_trash_restore() {
        let lib = Library::new(MemoryKv::default());
        lib.save("a", &sheet("Clinic"), "t1", 0).unwrap();
        lib.save("b", &sheet("Greenhouse"), "t2", 0).unwrap();
        let (list, problem) = lib.entries();
        assert!(problem.is_none());
        assert_eq!(list.iter().map(|e| e.name.as_str()).collect::<Vec<_>>(), ["Clinic", "Greenhouse"]);
        assert_eq!(lib.load("b").unwrap().unwrap().0.project, "Greenhouse");
        let gone = lib.remove("a", "2026-12-02T10:00:00Z").unwrap().unwrap();
        assert_eq!(gone.entry.name, "Clinic");
        assert_eq!(lib.entries().0.len(), 1);
        assert_eq!(lib.trash().len(), 1);
        lib.restore("a").unwrap();
        assert_eq!(lib.load("a").unwrap().unwrap().0.project, "Clinic");
        assert!(lib.trash().is_empty());
    }

    #[test]
    fn the_trash_keeps_sheets_until_purged_or_too_old() {
        let lib = Library::new(MemoryKv::default());
        lib.save("a", &sheet("Old"), "t", 0).unwrap();
        lib.save("b", &sheet("New"), "t", 0).unwrap();
        lib.remove("a", "2026-10-01T00:00:00Z").unwrap();
        lib.remove("b", "2026-12-01T00:00:00Z").unwrap();
        assert_eq!(lib.trash().iter().map(|t| t.entry.name.as_str()).collect::<Vec<_>>(), ["New", "Old"]);
        assert_eq!(lib.purge_before("2026-11-01T00:00:00Z"), 1);
        assert_eq!(lib.trash().len(), 1);
        lib.purge("b");
        assert!(lib.trash().is_empty());
    }

    #[test]
    fn a_full_store_leaves_a_deleted_sheet_where_it_was() {
        let lib = Library::new(MemoryKv::default());
        lib.save("a", &sheet("Clinic"), "t", 0).unwrap();
        lib.kv().refuse.set(Some(StoreError::Full));
        assert_eq!(lib.remove("a", "t2"), Err(Problem::NotSaved(StoreError::Full)));
        lib.kv().refuse.set(None);
        assert_eq!(lib.load("a").unwrap().unwrap().0.project, "Clinic");
    }

    #[test]
    fn a_write_based_on_an_old_revision_is_refused() {
        // Two tabs open revision 1; the first saves (revision 2); the
        // second's save, based on 1, must not overwrite it.
        let lib = Library::new(MemoryKv::default());
        let (_, r1) = lib.save("a", &sheet("v1"), "t1", 0).unwrap();
        let (_, r2) = lib.save("a", &sheet("first tab"), "t2", r1).unwrap();
        assert_eq!(r2, r1 + 1);
        assert_eq!(lib.save("a", &sheet("second tab"), "t3", r1), Err(Problem::Conflict { id: "a".into() }));
        assert_eq!(lib.load("a").unwrap().unwrap(), (sheet("first tab"), r2));
        // A new sheet under an id that exists is a conflict too.
        assert!(matches!(lib.save("a", &sheet("x"), "t", 0), Err(Problem::Conflict { .. })));
    }

    #[test]
    fn a_damaged_sheet_is_kept_aside_not_overwritten_and_leaves_the_index() {
        let lib = Library::new(MemoryKv::default());
        lib.save("a", &sheet("Clinic"), "t1", 0).unwrap();
        lib.kv().set(&format!("{SHEET_PREFIX}a"), "{\"format\":\"headroom-sheet\",\"vers").unwrap();
        let Err(Problem::Damaged { aside_key, .. }) = lib.load("a") else { panic!("expected damage") };
        assert_eq!(lib.kv().get(&aside_key).unwrap(), "{\"format\":\"headroom-sheet\",\"vers");
        assert!(lib.entries().0.is_empty(), "no blank entry lingers in the list");
        assert_eq!(lib.aside(), vec![(aside_key.clone(), "{\"format\":\"headroom-sheet\",\"vers".to_owned())]);
        // Saving a fresh sheet under the same id does not touch the kept text.
        lib.save("a", &sheet("Fresh"), "t2", 0).unwrap();
        assert_eq!(lib.kv().get(&aside_key).unwrap(), "{\"format\":\"headroom-sheet\",\"vers");
        // A second damage goes to a second key.
        lib.kv().set(&format!("{SHEET_PREFIX}a"), "garbage").unwrap();
        let Err(Problem::Damaged { aside_key: second, .. }) = lib.load("a") else { panic!() };
        assert_ne!(second, aside_key);
        lib.discard_aside(&second);
        assert_eq!(lib.aside().len(), 1);
    }

    #[test]
    fn a_sheet_from_a_newer_headroom_is_left_untouched() {
        let lib = Library::new(MemoryKv::default());
        let text = r#"{"format":"headroom-sheet","version":7,"project":"From the future","lines":[]}"#;
        lib.kv().set(&format!("{SHEET_PREFIX}n"), text).unwrap();
        assert_eq!(lib.load("n"), Err(Problem::Newer { id: "n".into(), version: 7 }));
        assert_eq!(lib.kv().get(&format!("{SHEET_PREFIX}n")).unwrap(), text);
        assert!(lib.aside().is_empty());
        assert_eq!(lib.reconcile()[0].name, "From the future");
    }

    #[test]
    fn a_damaged_index_is_rebuilt() {
        let lib = Library::new(MemoryKv::default());
        lib.save("a", &sheet("Clinic"), "t1", 0).unwrap();
        lib.kv().set(INDEX_KEY, "[{oops").unwrap();
        let (list, problem) = lib.entries();
        assert_eq!(problem, Some(Problem::IndexRebuilt));
        assert_eq!(list[0].name, "Clinic");
        assert_eq!(lib.kv().get(&format!("{ASIDE_PREFIX}index")).unwrap(), "[{oops");
    }

    #[test]
    fn the_index_is_rebuilt_from_the_stored_keys() {
        // Two tabs each wrote the index from a stale copy: one entry lost,
        // one entry for a sheet that was deleted.
        let lib = Library::new(MemoryKv::default());
        lib.save("a", &sheet("Kept"), "t", 0).unwrap();
        lib.save("b", &sheet("Lost from the index"), "t", 0).unwrap();
        lib.kv()
            .set(INDEX_KEY, r#"[{"id":"a","name":"Kept","updated":"t"},{"id":"gone","name":"Deleted","updated":""}]"#)
            .unwrap();
        let list = lib.reconcile();
        assert_eq!(list.iter().map(|e| e.id.as_str()).collect::<Vec<_>>(), ["a", "b"]);
        assert_eq!(list[1].name, "Lost from the index");
        assert_eq!(lib.entries().0, list, "written back");
    }

    #[test]
    fn refused_writes_are_reported() {
        let lib = Library::new(MemoryKv::default());
        lib.kv().refuse.set(Some(StoreError::Full));
        assert_eq!(lib.save("a", &sheet("x"), "t", 0), Err(Problem::NotSaved(StoreError::Full)));
        assert!(Problem::NotSaved(StoreError::Full).to_string().contains("storage for Headroom is full"));
    }
}
