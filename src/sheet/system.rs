//! Lines joined into a system: each line may name the line it is fed from,
//! the lines then form a tree (or several, one per source); heat loads on
//! the branches add up to every line upstream; and the drop along each path
//! from a source to an end line gives the index circuit — the worst path,
//! whose drop is the pump head.
//!
//! - A line fed from a missing line, from itself, from a name two lines
//!   share, or in a circle of lines feeding each other, is reported by name
//!   and treated as a source; nothing typed is changed.
//! - Loads accumulate only through lines whose flow comes from a heat load:
//!   Φ = own Φ + diversity × Σ branches' Φ (a line's diversity is the
//!   user's choice, 1 when blank; it reduces what its branches bring, not its
//!   own load). A line with a typed flow keeps that flow; its load-less
//!   flow does not reach the lines above it, and they say so.
//! - Closed loop: the pump head is friction, fittings and components along
//!   the index circuit, on the flow run and — unless the sheet says the
//!   return is entered as lines of its own — once more for a return that
//!   mirrors it (common practice for a two-pipe system drawn flow-only);
//!   the static part is left out. Open system: the drops include the rise.

use super::file::{Circuit, LineFile, LoadFile, ReturnRun, Units};

/// What joining lines reads of a line: its name, what it is fed from, its
/// load and diversity. The page keeps one per line in a memo, so an edit
/// to anything else does not re-join the sheet.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Joint {
    /// The line's name.
    pub name: String,
    /// The name of the line it is fed from.
    pub fed_from: Option<String>,
    /// Its heat load, when its flow comes from one.
    pub load: Option<LoadFile>,
    /// Diversity on its branches' loads, as typed.
    pub diversity: Option<String>,
}

impl Joint {
    /// The joint of a stored line.
    pub fn of(l: &LineFile) -> Joint {
        Joint {
            name: l.name.clone(),
            fed_from: l.fed_from.clone(),
            load: l.load.clone(),
            diversity: l.diversity.clone(),
        }
    }
}
use super::number::parse_decimal;
use super::report::LineReport;
use super::units::{self, Dimension};

/// How the lines join.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Tree {
    /// Each line's parent (index), `None` for a source.
    pub parent: Vec<Option<usize>>,
    /// Each line's depth below its source (0 for a source).
    pub depth: Vec<usize>,
    /// Problems with `fed_from`, by line index.
    pub problems: Vec<(usize, String)>,
}

impl Tree {
    /// True when any line names the line it is fed from.
    pub fn is_system(&self) -> bool {
        self.parent.iter().any(Option::is_some)
    }

    /// The lines nothing is fed from.
    pub fn ends(&self) -> Vec<usize> {
        let mut has_child = vec![false; self.parent.len()];
        for p in self.parent.iter().flatten() {
            has_child[*p] = true;
        }
        (0..self.parent.len()).filter(|&i| !has_child[i]).collect()
    }

    /// The path from line `end` up to its source, end first.
    pub fn path(&self, end: usize) -> Vec<usize> {
        let mut out = vec![end];
        let mut at = end;
        while let Some(p) = self.parent[at] {
            out.push(p);
            at = p;
            if out.len() > self.parent.len() {
                break; // cannot happen once cycles are cut; a guard all the same
            }
        }
        out
    }
}

fn display(name: &str, i: usize) -> String {
    if name.trim().is_empty() {
        format!("line {}", i + 1)
    } else {
        format!("“{}”", name.trim())
    }
}

/// Joins the lines by their `fed_from` names.
pub fn tree(lines: &[LineFile]) -> Tree {
    tree_of(&lines.iter().map(Joint::of).collect::<Vec<_>>())
}

/// As [`tree`], from the lines' joints.
pub fn tree_of(lines: &[Joint]) -> Tree {
    let n = lines.len();
    let mut parent = vec![None; n];
    let mut problems = Vec::new();
    let mut by_name: std::collections::HashMap<&str, Vec<usize>> = std::collections::HashMap::new();
    for (i, l) in lines.iter().enumerate() {
        by_name.entry(l.name.trim()).or_default().push(i);
    }
    for (i, l) in lines.iter().enumerate() {
        let Some(from) = l.fed_from.as_deref().map(str::trim).filter(|t| !t.is_empty()) else { continue };
        match by_name.get(from).map(Vec::as_slice) {
            None | Some([]) => problems.push((i, format!("no line is named “{from}” to feed this one"))),
            Some([j]) if *j == i => problems.push((i, "a line cannot be fed from itself".to_owned())),
            Some([j]) => parent[i] = Some(*j),
            Some(_) => problems.push((i, format!("more than one line is named “{from}”: rename one so it is clear"))),
        }
    }
    // Cut circles: walk up from each line; a line met twice is in a circle.
    for start in 0..n {
        let mut seen = vec![start];
        let mut at = start;
        while let Some(p) = parent[at] {
            if let Some(k) = seen.iter().position(|&s| s == p) {
                let circle: Vec<usize> = seen[k..].to_vec();
                let names: Vec<String> = circle.iter().map(|&c| display(&lines[c].name, c)).collect();
                for &c in &circle {
                    problems.push((
                        c,
                        format!("lines feed each other in a circle: {} → back to the first", names.join(" → ")),
                    ));
                    parent[c] = None;
                }
                break;
            }
            seen.push(p);
            at = p;
        }
    }
    let depth = (0..n)
        .map(|i| {
            let mut d = 0;
            let mut at = i;
            while let Some(p) = parent[at] {
                d += 1;
                at = p;
                if d > n {
                    break;
                }
            }
            d
        })
        .collect();
    Tree { parent, depth, problems }
}

/// A line's own heat load in W (0 when left blank or wrong: the line's own
/// evaluation reports a wrong one), or `None` for a line with a typed flow.
fn own_load(l: &Joint, u: &Units) -> Option<f64> {
    let load = l.load.as_ref()?;
    let t = load.power.trim();
    if t.is_empty() {
        return Some(0.0);
    }
    Some(
        units::parse(Dimension::Power, t, u.power)
            .ok()
            .and_then(|m| m.to_si(None).ok())
            .filter(|p| p.is_finite() && *p >= 0.0)
            .unwrap_or(0.0),
    )
}

/// A line's diversity factor, 1 when blank or out of (0, 1].
pub fn diversity(l: &LineFile) -> f64 {
    diversity_of(l.diversity.as_deref())
}

fn diversity_of(text: Option<&str>) -> f64 {
    text.map(str::trim)
        .filter(|t| !t.is_empty())
        .and_then(|t| parse_decimal(t).ok())
        .filter(|d| d.is_finite() && *d > 0.0 && *d <= 1.0)
        .unwrap_or(1.0)
}

/// What a line carries for the lines below it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Carried {
    /// Φ the line's flow is derived from, W (own + diversity × branches).
    pub load_w: f64,
    /// How much of it its branches bring (before diversity), W.
    pub from_branches_w: f64,
    /// Branches whose flow is typed (so not in the load above).
    pub typed_branches: usize,
}

/// The heat load each load-driven line's flow comes from; `None` for lines
/// with a typed flow. Lines with no branches carry their own load.
pub fn carried(lines: &[LineFile], tree: &Tree, u: &Units) -> Vec<Option<Carried>> {
    carried_of(&lines.iter().map(Joint::of).collect::<Vec<_>>(), tree, u)
}

/// As [`carried`], from the lines' joints.
pub fn carried_of(lines: &[Joint], tree: &Tree, u: &Units) -> Vec<Option<Carried>> {
    let n = lines.len();
    let mut order: Vec<usize> = (0..n).collect();
    // Deepest first, so every branch is done before its parent.
    order.sort_by_key(|&i| std::cmp::Reverse(tree.depth[i]));
    let mut out: Vec<Option<Carried>> = lines
        .iter()
        .map(|l| own_load(l, u).map(|w| Carried { load_w: w, from_branches_w: 0.0, typed_branches: 0 }))
        .collect();
    let mut branches_w = vec![0.0; n];
    let mut typed = vec![0usize; n];
    for &i in &order {
        if let Some(c) = out[i].as_mut() {
            c.from_branches_w = branches_w[i];
            c.typed_branches = typed[i];
            c.load_w += diversity_of(lines[i].diversity.as_deref()) * branches_w[i];
        }
        if let Some(p) = tree.parent[i] {
            match out[i] {
                Some(c) => branches_w[p] += c.load_w,
                None => typed[p] += 1,
            }
        }
    }
    out
}

/// One path from a source to an end line.
#[derive(Debug, Clone, PartialEq)]
pub struct Path {
    /// The lines, end first, source last.
    pub lines: Vec<usize>,
    /// Drop along it (flow run), Pa: friction, fittings, components, and
    /// the static part in an open system.
    pub drop_pa: f64,
    /// Static part along it, Pa (shown apart in a closed loop).
    pub static_pa: f64,
    /// False when a line on it has no result (an error): the drop is then
    /// not a pump head.
    pub complete: bool,
}

/// The system's answer.
#[derive(Debug, Clone, PartialEq)]
pub struct Summary {
    /// Every path, worst first.
    pub paths: Vec<Path>,
    /// The pump head, Pa: the index circuit's drop, twice in a closed loop
    /// whose return mirrors the flow run.
    pub head_pa: Option<f64>,
    /// Flow at the index circuit's source, m³/s.
    pub flow_m3_s: Option<f64>,
    /// Whether the head counts a mirrored return run.
    pub mirrored: bool,
}

/// The paths from every end line to its source, worst first, and the pump
/// duty from the worst one (the index circuit).
pub fn summarise(tree: &Tree, reports: &[LineReport], u: &Units) -> Summary {
    let shown = |i: usize| {
        reports[i]
            .outcome
            .as_ref()
            .ok()
            .and_then(|o| o.shown.map(|k| (o.sizing.candidates[k].point, o.line.flow.value)))
    };
    let mut paths: Vec<Path> = tree
        .ends()
        .into_iter()
        .filter(|&e| tree.parent[e].is_some())
        .map(|e| {
            let lines = tree.path(e);
            let (mut drop_pa, mut static_pa, mut complete) = (0.0, 0.0, true);
            for &i in &lines {
                match shown(i) {
                    Some((p, _)) => {
                        drop_pa += p.total_drop.value;
                        static_pa += p.static_drop.value;
                    }
                    None => complete = false,
                }
            }
            Path { lines, drop_pa, static_pa, complete }
        })
        .collect();
    paths.sort_by(|a, b| b.drop_pa.total_cmp(&a.drop_pa));
    let mirrored = u.basis.circuit == Circuit::Closed && u.basis.return_run == ReturnRun::Mirrored;
    let index = paths.first().filter(|p| p.complete);
    let head_pa = index.map(|p| if mirrored { 2.0 * p.drop_pa } else { p.drop_pa });
    let flow_m3_s = index.and_then(|p| p.lines.last().and_then(|&s| shown(s)).map(|(_, q)| q));
    Summary { paths, head_pa, flow_m3_s, mirrored }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sheet::file::SheetFile;

    fn lines(spec: &[(&str, Option<&str>)]) -> Vec<LineFile> {
        let json = format!(
            r#"{{"format":"headroom-sheet","version":2,"lines":[{}]}}"#,
            spec.iter()
                .map(|(n, f)| match f {
                    Some(f) => format!(r#"{{"name":"{n}","fed_from":"{f}","flow":"1","fluid":{{"kind":"water","temperature":"10"}},"pipe":{{"series":"steel-sch40"}}}}"#),
                    None => format!(r#"{{"name":"{n}","flow":"1","fluid":{{"kind":"water","temperature":"10"}},"pipe":{{"series":"steel-sch40"}}}}"#),
                })
                .collect::<Vec<_>>()
                .join(",")
        );
        SheetFile::from_json(&json).unwrap().lines
    }

    #[test]
    fn a_tree_joins_by_name_and_bad_references_are_named() {
        let l = lines(&[("main", None), ("riser", Some("main")), ("coil", Some("riser")), ("stray", Some("nowhere"))]);
        let t = tree(&l);
        assert_eq!(t.parent, vec![None, Some(0), Some(1), None]);
        assert_eq!(t.depth, vec![0, 1, 2, 0]);
        assert_eq!(t.path(2), vec![2, 1, 0]);
        assert_eq!(t.problems, vec![(3, "no line is named “nowhere” to feed this one".to_owned())]);
        let l = lines(&[("a", Some("b")), ("b", Some("c")), ("c", Some("a")), ("d", Some("d"))]);
        let t = tree(&l);
        assert_eq!(t.parent, vec![None; 4]);
        assert!(t.problems.iter().any(|(i, m)| *i == 0 && m.contains("circle") && m.contains("“a” → “b” → “c”")));
        assert!(t.problems.iter().any(|(i, m)| *i == 3 && m.contains("itself")));
        let l = lines(&[("a", None), ("a", None), ("b", Some("a"))]);
        assert!(tree(&l).problems[0].1.contains("more than one line is named “a”"));
    }
}
