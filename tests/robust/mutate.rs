//! Structure-aware mutation of scenarios, driven by a stream of bytes: the
//! same code serves the libFuzzer target (bytes chosen by the fuzzer) and
//! the stable-toolchain smoke test (bytes from a seeded generator).
//!
//! A mutation starts from one of the [seeds](super::seeds) as a JSON tree
//! and applies a few edits chosen by the bytes: replace the text of a
//! numeric input (hostile texts such as `NaN`, `1e300 kg`, `-0 mm`, `inf`,
//! or a random number with a random unit of the table), replace a
//! tolerance, splice in the subtree another seed has under the same key
//! (another spring model, contact law, body region...), wrap a spring in a
//! series or parallel combination, set a whole number to an edge value
//! (0, 1, `u32::MAX`), flip a flag, or duplicate or drop a list element.
//! The result is read back with `Scenario::from_value`; most mutations give
//! a valid scenario whose inputs are absurd, which is the point.

use super::seeds::seeds;
use joulewise_core::scenario::Scenario;
use joulewise_core::units::all_units;
use serde_json::{json, Value as Json};

/// Hostile texts for numeric inputs.
pub const HOSTILE_TEXTS: &[&str] = &[
    "NaN",
    "nan",
    "inf",
    "-inf",
    "+inf",
    "Infinity",
    "∞",
    "-∞",
    "1e300",
    "1e300 kg",
    "-1e300",
    "1e308",
    "1.8e308",
    "1e-300",
    "4.9e-324",
    "-0",
    "-0 mm",
    "0",
    "0 mm",
    "0.0",
    "-1",
    "-5 kg",
    "1e12",
    "1e13",
    "-1e13",
    "1e-13",
    "9e15",
    "99999999999999999999",
    "1,200",
    "1.200,5",
    "12 500",
    "12'500",
    "",
    " ",
    "1e",
    "e5",
    "-",
    ".",
    "5 lb",
    "5 lbf",
    "5 N",
    "5 mm",
    "5 deg",
    "400 deg",
    "-400 deg",
    "5 rad",
    "5 %",
    "200 %",
    "0x10",
    "1_000",
    "５",
    "1\u{200b}0",
    "1e5 MPa",
    "3 g",
    "1 /h",
    "1e9 /h",
];

/// Hostile tolerance texts.
pub const HOSTILE_TOLERANCES: &[&str] = &[
    "",
    "±5 %",
    "±100 %",
    "±1000 %",
    "±1e300 %",
    "±NaN",
    "±inf",
    "-5 %",
    "±0",
    "±1e300",
    "±1e300 mm",
    "+/-2 mm",
    "5 kg",
    "%",
    "±",
];

/// A stream of choices read from bytes; reads past the end give zeros, so
/// every byte string is a valid input.
pub struct Bytes<'a> {
    data: &'a [u8],
    pos: usize,
}

impl<'a> Bytes<'a> {
    /// Choices read from `data`.
    pub fn new(data: &'a [u8]) -> Self {
        Self { data, pos: 0 }
    }

    /// The next byte (0 past the end).
    pub fn byte(&mut self) -> u8 {
        let b = self.data.get(self.pos).copied().unwrap_or(0);
        self.pos += 1;
        b
    }

    /// A number below `n` (0 when `n` is 0).
    pub fn below(&mut self, n: usize) -> usize {
        if n == 0 {
            return 0;
        }
        let x = usize::from(self.byte()) << 8 | usize::from(self.byte());
        x % n
    }

    /// True or false.
    pub fn flag(&mut self) -> bool {
        self.byte() & 1 == 1
    }

    /// One of `items` (`None` when empty).
    pub fn pick<'b, T>(&mut self, items: &'b [T]) -> Option<&'b T> {
        items.get(self.below(items.len()))
    }

    /// True when every byte has been read.
    pub fn exhausted(&self) -> bool {
        self.pos >= self.data.len()
    }
}

/// A seeded generator of bytes for the smoke test (SplitMix64: fixed seed,
/// same bytes on every machine).
pub struct SplitMix(pub u64);

impl SplitMix {
    /// The next 64 random bits.
    pub fn next_u64(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }

    /// `n` random bytes.
    pub fn bytes(&mut self, n: usize) -> Vec<u8> {
        (0..n).map(|_| (self.next_u64() >> 56) as u8).collect()
    }
}

/// Where in the tree: a path of object keys and array indices.
type Path = Vec<PathSeg>;

#[derive(Clone, Debug)]
enum PathSeg {
    Key(String),
    Index(usize),
}

fn get_mut<'a>(root: &'a mut Json, path: &[PathSeg]) -> Option<&'a mut Json> {
    let mut node = root;
    for seg in path {
        node = match (seg, node) {
            (PathSeg::Key(k), Json::Object(m)) => m.get_mut(k)?,
            (PathSeg::Index(i), Json::Array(a)) => a.get_mut(*i)?,
            _ => return None,
        };
    }
    Some(node)
}

/// Every node of the tree with its path and the key it sits under.
fn nodes(root: &Json) -> Vec<(Path, Option<String>)> {
    fn walk(
        node: &Json,
        path: &mut Path,
        key: Option<&str>,
        out: &mut Vec<(Path, Option<String>)>,
    ) {
        out.push((path.clone(), key.map(str::to_string)));
        match node {
            Json::Object(m) => {
                for (k, v) in m {
                    path.push(PathSeg::Key(k.clone()));
                    walk(v, path, Some(k), out);
                    path.pop();
                }
            }
            Json::Array(a) => {
                for (i, v) in a.iter().enumerate() {
                    path.push(PathSeg::Index(i));
                    // Elements of a list share the list's key for splicing.
                    walk(v, path, key, out);
                    path.pop();
                }
            }
            _ => {}
        }
    }
    let mut out = Vec::new();
    walk(root, &mut Vec::new(), None, &mut out);
    out
}

fn is_numeric_input(v: &Json) -> bool {
    v.get("text").is_some_and(Json::is_string)
}

fn is_spring_model(v: &Json) -> bool {
    v.get("model").is_some_and(Json::is_string)
}

/// A random number as text with a random unit of the table (or none).
fn random_number(b: &mut Bytes<'_>) -> String {
    let mantissa = f64::from(b.byte()) + f64::from(b.byte()) / 256.0;
    let exp = i32::from(b.byte() % 41) - 20;
    let sign = if b.byte().is_multiple_of(5) { "-" } else { "" };
    let number = format!("{sign}{}", mantissa * 10f64.powi(exp));
    let units = all_units();
    if b.flag() {
        let u = b.pick(units).map(|u| u.symbol).unwrap_or("");
        format!("{number} {u}")
    } else {
        number
    }
}

/// Subtrees of the seeds by the key they sit under, for splicing.
fn donors(pool: &[Json]) -> Vec<(String, Json)> {
    let mut out = Vec::new();
    for tree in pool {
        for (path, key) in nodes(tree) {
            let (Some(key), Some(node)) = (key, get_path(tree, &path)) else {
                continue;
            };
            out.push((key, node.clone()));
        }
    }
    out
}

fn get_path<'a>(root: &'a Json, path: &[PathSeg]) -> Option<&'a Json> {
    let mut node = root;
    for seg in path {
        node = match (seg, node) {
            (PathSeg::Key(k), Json::Object(m)) => m.get(k)?,
            (PathSeg::Index(i), Json::Array(a)) => a.get(*i)?,
            _ => return None,
        };
    }
    Some(node)
}

/// The seeds as JSON trees, prepared once per process by the callers that
/// loop (see [`Mutator`]).
pub struct Mutator {
    pool: Vec<Json>,
    donors: Vec<(String, Json)>,
}

impl Default for Mutator {
    fn default() -> Self {
        Self::new()
    }
}

impl Mutator {
    /// A mutator over the built-in seeds.
    pub fn new() -> Self {
        let pool: Vec<Json> = seeds()
            .into_iter()
            .filter_map(|(_, s)| serde_json::to_value(&s).ok())
            .collect();
        Self::with_pool(pool)
    }

    /// A mutator over the given scenario trees (e.g. the seeds and the
    /// regression corpus).
    pub fn with_pool(pool: Vec<Json>) -> Self {
        let donors = donors(&pool);
        Self { pool, donors }
    }

    /// The JSON tree of a mutated scenario (which may no longer be a valid
    /// scenario).
    pub fn mutate_json(&self, b: &mut Bytes<'_>) -> Json {
        let mut tree = b.pick(&self.pool).cloned().unwrap_or(Json::Null);
        let edits = 1 + b.below(8);
        for _ in 0..edits {
            if b.exhausted() {
                break;
            }
            self.edit(&mut tree, b);
        }
        tree
    }

    /// A mutated scenario, when the mutation still reads as one.
    pub fn mutate(&self, b: &mut Bytes<'_>) -> Option<Scenario> {
        Scenario::from_value(self.mutate_json(b)).ok()
    }

    fn edit(&self, tree: &mut Json, b: &mut Bytes<'_>) {
        let all = nodes(tree);
        let op = b.byte() % 10;
        match op {
            // Numeric text: hostile or random.
            0..=3 => {
                let inputs: Vec<&Path> = all
                    .iter()
                    .filter(|(p, _)| get_path(tree, p).is_some_and(is_numeric_input))
                    .map(|(p, _)| p)
                    .collect();
                let Some(path) = b.pick(&inputs).map(|p| (*p).clone()) else {
                    return;
                };
                let text = if b.flag() {
                    b.pick(HOSTILE_TEXTS).copied().unwrap_or("").to_string()
                } else {
                    random_number(b)
                };
                if let Some(Json::Object(m)) = get_mut(tree, &path) {
                    m.insert("text".into(), Json::String(text));
                }
            }
            // Tolerance text.
            4 => {
                let inputs: Vec<&Path> = all
                    .iter()
                    .filter(|(p, _)| get_path(tree, p).is_some_and(is_numeric_input))
                    .map(|(p, _)| p)
                    .collect();
                let Some(path) = b.pick(&inputs).map(|p| (*p).clone()) else {
                    return;
                };
                let tol = b.pick(HOSTILE_TOLERANCES).copied().unwrap_or("");
                let normal = b.flag();
                if let Some(Json::Object(m)) = get_mut(tree, &path) {
                    m.insert("tol".into(), Json::String(tol.into()));
                    if normal {
                        m.insert("spread".into(), Json::String("normal".into()));
                    }
                }
            }
            // Splice a subtree another seed has under the same key.
            5 | 6 => {
                let Some((path, Some(key))) = b.pick(&all).cloned() else {
                    return;
                };
                let same: Vec<&Json> = self
                    .donors
                    .iter()
                    .filter(|(k, _)| *k == key)
                    .map(|(_, v)| v)
                    .collect();
                if let (Some(donor), Some(slot)) = (b.pick(&same), get_mut(tree, &path)) {
                    *slot = (*donor).clone();
                }
            }
            // Wrap a spring model in a series or parallel combination.
            7 => {
                let springs: Vec<&Path> = all
                    .iter()
                    .filter(|(p, _)| get_path(tree, p).is_some_and(is_spring_model))
                    .map(|(p, _)| p)
                    .collect();
                let Some(path) = b.pick(&springs).map(|p| (*p).clone()) else {
                    return;
                };
                let kind = if b.flag() { "series" } else { "parallel" };
                let copies = 1 + b.below(3);
                if let Some(slot) = get_mut(tree, &path) {
                    let members: Vec<Json> = (0..copies).map(|_| slot.clone()).collect();
                    *slot = json!({ "model": kind, "members": members });
                }
            }
            // Whole numbers to edge values; flags flipped.
            8 => {
                let scalars: Vec<&Path> = all
                    .iter()
                    .filter(|(p, _)| {
                        get_path(tree, p).is_some_and(|v| v.is_u64() || v.is_boolean())
                    })
                    .map(|(p, _)| p)
                    .collect();
                let Some(path) = b.pick(&scalars).map(|p| (*p).clone()) else {
                    return;
                };
                let edge = [0u64, 1, 2, 3, 7, 64, 1000, 100_000, u64::from(u32::MAX)];
                let pick = b.pick(&edge).copied().unwrap_or(0);
                if let Some(slot) = get_mut(tree, &path) {
                    *slot = match slot {
                        Json::Bool(x) => Json::Bool(!*x),
                        _ => json!(pick),
                    };
                }
            }
            // Duplicate or drop a list element.
            _ => {
                let lists: Vec<&Path> = all
                    .iter()
                    .filter(|(p, _)| get_path(tree, p).is_some_and(Json::is_array))
                    .map(|(p, _)| p)
                    .collect();
                let Some(path) = b.pick(&lists).map(|p| (*p).clone()) else {
                    return;
                };
                let dup = b.flag();
                let at = b.byte();
                if let Some(Json::Array(items)) = get_mut(tree, &path) {
                    if items.is_empty() {
                        return;
                    }
                    let i = usize::from(at) % items.len();
                    if dup {
                        let copy = items[i].clone();
                        items.insert(i, copy);
                    } else {
                        items.remove(i);
                    }
                }
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_same_bytes_give_the_same_mutation() {
        let m = Mutator::new();
        let data = SplitMix(42).bytes(64);
        let a = m.mutate_json(&mut Bytes::new(&data));
        let b = m.mutate_json(&mut Bytes::new(&data));
        assert_eq!(a, b);
    }

    #[test]
    fn most_mutations_still_read_as_scenarios() {
        let m = Mutator::new();
        let mut g = SplitMix(1);
        let read = (0..200)
            .filter(|_| m.mutate(&mut Bytes::new(&g.bytes(48))).is_some())
            .count();
        // A mutation that breaks the format is useful too, but the target
        // is the physics: most must still be scenarios.
        assert!(read > 100, "only {read} of 200 mutations read as scenarios");
    }
}
