//! The SMILES grammar: atoms, bonds, branches, ring closures, components.
//!
//! Reference: OpenSMILES specification, version 1.0, §3 (grammar).

use super::error::{SmilesError, SmilesErrorKind as K};
use super::{Atom, Bond, BondOrder, Element, MAX_ATOMS};

/// Bond symbol read before an atom or ring digit.
#[derive(Clone, Copy, PartialEq, Eq, Debug)]
enum Sym {
    Single,
    Double,
    Triple,
    Quadruple,
    Aromatic,
    /// `/` or `\`: a single bond with a direction (ignored here).
    Directional,
}

impl Sym {
    fn order(self) -> BondOrder {
        match self {
            Sym::Single | Sym::Directional => BondOrder::Single,
            Sym::Double => BondOrder::Double,
            Sym::Triple => BondOrder::Triple,
            Sym::Quadruple => BondOrder::Quadruple,
            Sym::Aromatic => BondOrder::Aromatic,
        }
    }
}

/// The graph as a spanning forest: every atom after the first of its component hangs
/// from the atom written before it by the bond between them; each ring closure adds a
/// bond (and a ring) to it.
#[derive(Debug, Clone, PartialEq, Default)]
pub(super) struct Tree {
    /// Per atom: (atom it hangs from, that bond), `usize::MAX` for a component's first.
    pub up: Vec<(usize, usize)>,
    /// Per atom: bonds to its component's first atom along the forest.
    pub depth: Vec<u32>,
    /// The ring-closure bonds, in input order.
    pub closures: Vec<usize>,
}

struct OpenRing {
    /// The ring number.
    n: usize,
    atom: usize,
    sym: Option<Sym>,
    byte: usize,
}

struct Reader<'a> {
    s: &'a str,
    b: &'a [u8],
    i: usize,
    atoms: &'a mut Vec<Atom>,
    bonds: &'a mut Vec<Bond>,
    tree: &'a mut Tree,
    /// Ring numbers open now, in no particular order (few at a time).
    rings: Vec<OpenRing>,
}

/// Reads the graph as written (before rings, Kekulé form and implicit hydrogens) into
/// `atoms` and `bonds` (cleared first, their capacity kept for the next molecule);
/// returns the number of components.
pub(super) fn read(
    input: &str,
    atoms: &mut Vec<Atom>,
    bonds: &mut Vec<Bond>,
    tree: &mut Tree,
) -> Result<usize, SmilesError> {
    atoms.clear();
    bonds.clear();
    tree.up.clear();
    tree.depth.clear();
    tree.closures.clear();
    let s = input.trim();
    let offset = input.len() - input.trim_start().len();
    let err = |k: K, byte: usize| SmilesError::at(k, input, byte + offset);
    if s.is_empty() {
        return Err(err(K::Empty, 0));
    }
    let mut r = Reader {
        s,
        b: s.as_bytes(),
        i: 0,
        atoms,
        bonds,
        tree,
        rings: Vec::new(),
    };
    // at most one atom per character and one bond per atom or ring digit
    let most = s.len().min(MAX_ATOMS);
    r.atoms.reserve(most);
    r.bonds.reserve(most);
    // open branches: (atom before the branch, byte of its '('), reused between molecules
    // and the open rings: their storage reused between molecules
    let (mut stack, mut rings) = WORK.take();
    stack.clear();
    rings.clear();
    r.rings = rings;
    let result = read_graph(&mut r, &mut stack, input, offset);
    WORK.set((stack, std::mem::take(&mut r.rings)));
    result
}

type Branches = Vec<(Option<usize>, usize)>;

thread_local! {
    static WORK: std::cell::Cell<(Branches, Vec<OpenRing>)> =
        const { std::cell::Cell::new((Vec::new(), Vec::new())) };
}

fn read_graph(
    r: &mut Reader,
    stack: &mut Vec<(Option<usize>, usize)>,
    input: &str,
    offset: usize,
) -> Result<usize, SmilesError> {
    let err = |k: K, byte: usize| SmilesError::at(k, input, byte + offset);
    let ascii = input.is_ascii();
    let mut components = 0usize;
    let mut prev: Option<usize> = None;
    let mut pending: Option<(Sym, usize)> = None;
    // Whether the last thing read can be followed by a bond / ring digit.
    while r.i < r.b.len() {
        let c = r.b[r.i];
        let start = r.i;
        match c {
            b'(' => {
                if prev.is_none() || pending.is_some() {
                    return Err(err(K::Dangling("branch"), start));
                }
                stack.push((prev, start));
                r.i += 1;
            }
            b')' => {
                if pending.is_some() {
                    return Err(err(
                        K::Dangling("bond symbol"),
                        pending.map_or(start, |p| p.1),
                    ));
                }
                let Some((p, open)) = stack.pop() else {
                    return Err(err(K::UnbalancedParen, start));
                };
                if r.i > 0 && r.b[r.i - 1] == b'(' {
                    return Err(err(K::Dangling("empty branch"), open));
                }
                prev = p;
                r.i += 1;
            }
            b'.' => {
                if pending.is_some() || prev.is_none() {
                    return Err(err(K::Dangling("'.'"), start));
                }
                if !stack.is_empty() {
                    return Err(err(K::UnbalancedParen, stack.last().map_or(start, |x| x.1)));
                }
                prev = None;
                r.i += 1;
            }
            b'-' | b'=' | b'#' | b'$' | b':' | b'/' | b'\\' => {
                if pending.is_some() || prev.is_none() {
                    return Err(err(K::Dangling("bond symbol"), start));
                }
                let sym = match c {
                    b'-' => Sym::Single,
                    b'=' => Sym::Double,
                    b'#' => Sym::Triple,
                    b'$' => Sym::Quadruple,
                    b':' => Sym::Aromatic,
                    _ => Sym::Directional,
                };
                pending = Some((sym, start));
                r.i += 1;
            }
            b'0'..=b'9' | b'%' => {
                let Some(p) = prev else {
                    return Err(err(K::Dangling("ring number"), start));
                };
                let n = if c == b'%' {
                    let d = r.b.get(r.i + 1..r.i + 3);
                    match d {
                        Some([x, y]) if x.is_ascii_digit() && y.is_ascii_digit() => {
                            r.i += 3;
                            ((x - b'0') * 10 + (y - b'0')) as usize
                        }
                        _ => return Err(err(K::UnexpectedChar('%'), start)),
                    }
                } else {
                    r.i += 1;
                    (c - b'0') as usize
                };
                let sym = pending.take().map(|x| x.0);
                match r.rings.iter().position(|x| x.n == n) {
                    None => r.rings.push(OpenRing {
                        n,
                        atom: p,
                        sym,
                        byte: start,
                    }),
                    Some(at) => {
                        let open = r.rings.swap_remove(at);
                        let order = match (open.sym, sym) {
                            (Some(a), Some(b)) if a.order() != b.order() => {
                                return Err(err(K::RingBondConflict(n as u32), start))
                            }
                            (Some(a), _) | (None, Some(a)) => Some(a.order()),
                            (None, None) => None,
                        };
                        // a bond between the two already: one hangs from the other in the
                        // forest, or an earlier closure joined them (every bond is one of these)
                        let joined = |x: usize, y: usize| {
                            let b = &r.bonds[x];
                            (b.a == p && b.b == y) || (b.b == p && b.a == y)
                        };
                        if open.atom == p
                            || r.tree.up[p].0 == open.atom
                            || r.tree.up[open.atom].0 == p
                            || r.tree.closures.iter().any(|&k| joined(k, open.atom))
                        {
                            return Err(err(K::BadRingClosure(n as u32), start));
                        }
                        r.bond(open.atom, p, order);
                        r.tree.closures.push(r.bonds.len() - 1);
                    }
                }
            }
            _ => {
                let atom = match organic_symbol(r.b, r.i) {
                    // the organic subset read from a table (what `organic` reads)
                    Some((element, aromatic, len)) => {
                        r.i += len;
                        Reader::new_atom(element, aromatic)
                    }
                    None if c == b'[' => r.bracket().map_err(|(k, at)| err(k, at))?,
                    None => r.organic().map_err(|(k, at)| err(k, at))?,
                };
                if r.atoms.len() >= MAX_ATOMS {
                    return Err(err(K::TooLarge(MAX_ATOMS), start));
                }
                let idx = r.atoms.len();
                // characters before the atom: bytes when the input is ASCII (the usual case)
                let position = if ascii {
                    start + offset + 1
                } else {
                    input[..start + offset].chars().count() + 1
                };
                r.atoms.push(Atom { position, ..atom });
                match prev {
                    Some(p) => {
                        let order = pending.take().map(|x| x.0.order());
                        r.bond(p, idx, order);
                        r.tree.up.push((p, r.bonds.len() - 1));
                        r.tree.depth.push(r.tree.depth[p] + 1);
                    }
                    None => {
                        components += 1;
                        r.tree.up.push((usize::MAX, usize::MAX));
                        r.tree.depth.push(0);
                    }
                }
                prev = Some(idx);
            }
        }
    }
    if let Some((_, at)) = pending {
        return Err(err(K::Dangling("bond symbol"), at));
    }
    if let Some((_, open)) = stack.last() {
        return Err(err(K::UnbalancedParen, *open));
    }
    if let Some(ring) = r.rings.iter().min_by_key(|x| x.byte) {
        return Err(err(K::UnclosedRing(ring.n as u32), ring.byte));
    }
    Ok(components)
}

/// Organic-subset symbols by their first byte: element number, aromatic, and whether the
/// symbol may be the first of `Cl` or `Br`; `*` is the wildcard (number 0).
const ORGANIC: [Option<(u8, bool, bool)>; 256] = {
    let mut t = [None; 256];
    t[b'B' as usize] = Some((5, false, true));
    t[b'C' as usize] = Some((6, false, true));
    t[b'N' as usize] = Some((7, false, false));
    t[b'O' as usize] = Some((8, false, false));
    t[b'P' as usize] = Some((15, false, false));
    t[b'S' as usize] = Some((16, false, false));
    t[b'F' as usize] = Some((9, false, false));
    t[b'I' as usize] = Some((53, false, false));
    t[b'b' as usize] = Some((5, true, false));
    t[b'c' as usize] = Some((6, true, false));
    t[b'n' as usize] = Some((7, true, false));
    t[b'o' as usize] = Some((8, true, false));
    t[b'p' as usize] = Some((15, true, false));
    t[b's' as usize] = Some((16, true, false));
    t[b'*' as usize] = Some((0, false, false));
    t
};

/// The organic-subset atom at byte `i` of `b` (element, aromatic, bytes), as
/// [`Reader::organic`] reads it; `None` where that gives an error (or for a bracket).
#[inline]
fn organic_symbol(b: &[u8], i: usize) -> Option<(Element, bool, usize)> {
    let (z, aromatic, two) = ORGANIC[*b.get(i)? as usize]?;
    let element = Element::from_number(z)?;
    if two {
        match (z, b.get(i + 1)) {
            (6, Some(b'l')) => return Some((Element::CL, false, 2)),
            (5, Some(b'r')) => return Some((Element::BR, false, 2)),
            _ => {}
        }
    }
    Some((element, aromatic, 1))
}

impl Reader<'_> {
    /// Add a bond; with no symbol it is aromatic between two aromatic atoms, else single.
    #[inline]
    fn bond(&mut self, a: usize, b: usize, order: Option<BondOrder>) {
        let order = order.unwrap_or(if self.atoms[a].aromatic && self.atoms[b].aromatic {
            BondOrder::Aromatic
        } else {
            BondOrder::Single
        });
        self.bonds.push(Bond {
            a,
            b,
            order,
            kekule_order: order.integer(),
            in_ring: false,
        });
    }

    fn new_atom(element: Element, aromatic: bool) -> Atom {
        Atom {
            element,
            aromatic,
            charge: 0,
            isotope: None,
            hydrogens: 0,
            bracket: false,
            in_ring: false,
            position: 0,
        }
    }

    /// An organic-subset atom (or `*`).
    fn organic(&mut self) -> Result<Atom, (K, usize)> {
        let start = self.i;
        let c = self.b[self.i];
        let two = self.b.get(self.i..self.i + 2);
        let (el, arom, len) = match (c, two) {
            (b'C', Some(b"Cl")) => (Element::CL, false, 2),
            (b'B', Some(b"Br")) => (Element::BR, false, 2),
            (b'B', _) => (Element::B, false, 1),
            (b'C', _) => (Element::C, false, 1),
            (b'N', _) => (Element::N, false, 1),
            (b'O', _) => (Element::O, false, 1),
            (b'P', _) => (Element::P, false, 1),
            (b'S', _) => (Element::S, false, 1),
            (b'F', _) => (Element::F, false, 1),
            (b'I', _) => (Element::I, false, 1),
            (b'b', _) => (Element::B, true, 1),
            (b'c', _) => (Element::C, true, 1),
            (b'n', _) => (Element::N, true, 1),
            (b'o', _) => (Element::O, true, 1),
            (b'p', _) => (Element::P, true, 1),
            (b's', _) => (Element::S, true, 1),
            (b'*', _) => (Element::from_number(0).unwrap_or(Element::H), false, 1),
            _ if c.is_ascii_alphabetic() => {
                let mut end = self.i + 1;
                if self.b.get(end).is_some_and(|x| x.is_ascii_lowercase()) {
                    end += 1;
                }
                let sym = self.s.get(self.i..end).unwrap_or("?").to_string();
                return Err((K::UnknownElement(sym), start));
            }
            _ => {
                let ch = self.s[self.i..].chars().next().unwrap_or('?');
                return Err((K::UnexpectedChar(ch), start));
            }
        };
        self.i += len;
        Ok(Self::new_atom(el, arom))
    }

    fn peek(&self) -> Option<u8> {
        self.b.get(self.i).copied()
    }

    fn digits(&mut self, max: usize) -> Option<u32> {
        let start = self.i;
        let mut v: u32 = 0;
        while self.i < self.b.len() && self.b[self.i].is_ascii_digit() && self.i - start < max {
            v = v * 10 + (self.b[self.i] - b'0') as u32;
            self.i += 1;
        }
        (self.i > start).then_some(v)
    }

    /// A bracket atom: `[` isotope? symbol chiral? hcount? charge? class? `]`.
    fn bracket(&mut self) -> Result<Atom, (K, usize)> {
        let open = self.i;
        let Some(close) = self.b[open..].iter().position(|&x| x == b']') else {
            return Err((K::UnclosedBracket, open));
        };
        let close = open + close;
        self.i += 1;
        let isotope = self.digits(4).map(|v| v as u16);
        let sym_start = self.i;
        let c = self.peek().ok_or((K::UnclosedBracket, open))?;
        let (element, aromatic) = if c == b'*' {
            self.i += 1;
            (Element::from_number(0).unwrap_or(Element::H), false)
        } else if c.is_ascii_lowercase() {
            // Aromatic symbols: b c n o p s se as (OpenSMILES), te accepted too.
            let two = self.s.get(self.i..self.i + 2).unwrap_or("");
            let (sym, len) = match two {
                "se" => ("Se", 2),
                "as" => ("As", 2),
                "te" => ("Te", 2),
                _ => match c {
                    b'b' => ("B", 1),
                    b'c' => ("C", 1),
                    b'n' => ("N", 1),
                    b'o' => ("O", 1),
                    b'p' => ("P", 1),
                    b's' => ("S", 1),
                    _ => {
                        let t = self.s.get(self.i..self.i + 1).unwrap_or("?");
                        return Err((K::UnknownElement(t.to_string()), sym_start));
                    }
                },
            };
            self.i += len;
            (Element::from_symbol(sym).unwrap_or(Element::C), true)
        } else if c.is_ascii_uppercase() {
            let two = self.s.get(self.i..self.i + 2);
            let one = self.s.get(self.i..self.i + 1).unwrap_or("");
            match two.and_then(|t| {
                (t.as_bytes()[1].is_ascii_lowercase())
                    .then(|| Element::from_symbol(t))
                    .flatten()
            }) {
                Some(e) => {
                    self.i += 2;
                    (e, false)
                }
                None => match Element::from_symbol(one) {
                    Some(e) => {
                        self.i += 1;
                        (e, false)
                    }
                    None => {
                        let t = match two {
                            Some(t) if t.as_bytes()[1].is_ascii_lowercase() => t,
                            _ => one,
                        };
                        return Err((K::UnknownElement(t.to_string()), sym_start));
                    }
                },
            }
        } else {
            let ch = self.s[self.i..].chars().next().unwrap_or('?');
            return Err((K::UnexpectedChar(ch), self.i));
        };
        // Chirality: @, @@, @TH1, @AL2, @SP3, @TB12, @OH30 (read and ignored).
        if self.peek() == Some(b'@') {
            self.i += 1;
            if self.peek() == Some(b'@') {
                self.i += 1;
            } else if let Some(t) = self.s.get(self.i..self.i + 2) {
                if matches!(t, "TH" | "AL" | "SP" | "TB" | "OH") {
                    self.i += 2;
                    if self.digits(2).is_none() {
                        return Err((K::BadBracket("chirality class needs a number"), self.i));
                    }
                }
            }
        }
        let mut hydrogens = 0u8;
        if self.peek() == Some(b'H') {
            self.i += 1;
            hydrogens = self.digits(1).unwrap_or(1) as u8;
        }
        let mut charge: i32 = 0;
        if let Some(sign @ (b'+' | b'-')) = self.peek() {
            let unit = if sign == b'+' { 1 } else { -1 };
            self.i += 1;
            if self.peek() == Some(sign) {
                self.i += 1;
                charge = 2 * unit;
                if self.peek() == Some(sign) {
                    self.i += 1;
                    charge = 3 * unit;
                }
            } else {
                charge = unit * self.digits(2).unwrap_or(1) as i32;
            }
            if !(-15..=15).contains(&charge) {
                return Err((K::BadBracket("charge outside -15..+15"), self.i));
            }
        }
        if self.peek() == Some(b':') {
            self.i += 1;
            if self.digits(9).is_none() {
                return Err((K::BadBracket("atom class needs a number after ':'"), self.i));
            }
        }
        if self.i != close {
            return Err((
                K::BadBracket("expected isotope, element, chirality, H count, charge, class"),
                self.i,
            ));
        }
        self.i = close + 1;
        if element == Element::H && hydrogens > 0 {
            // [H2] and similar: molecular hydrogen written as one bracket atom.
        }
        Ok(Atom {
            element,
            aromatic,
            charge: charge as i8,
            isotope,
            hydrogens,
            bracket: true,
            in_ring: false,
            position: 0,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::{organic_symbol, Reader, Tree};

    /// The table reads every ASCII byte, and the byte after it, as `Reader::organic` does
    /// (where the match gives an error, the table gives nothing and the match reads it).
    #[test]
    fn organic_table_reads_as_the_match() {
        let (mut atoms, mut bonds, mut tree) = (Vec::new(), Vec::new(), Tree::default());
        for c in 0u8..128 {
            for d in [b'l', b'r', b'C', b'c', b'1', b'(', b' ', b'L', b'R'] {
                let text = String::from_utf8(vec![c, d]).unwrap();
                let mut r = Reader {
                    s: &text,
                    b: text.as_bytes(),
                    i: 0,
                    atoms: &mut atoms,
                    bonds: &mut bonds,
                    tree: &mut tree,
                    rings: Vec::new(),
                };
                let by_match = r.organic().ok().map(|a| (a.element, a.aromatic, r.i));
                assert_eq!(organic_symbol(text.as_bytes(), 0), by_match, "{text:?}");
            }
        }
    }
}
