//! Molecular structure from SMILES: atoms, bonds, hydrogens, rings, aromaticity.
//!
//! [`parse_smiles`] reads a SMILES string following the OpenSMILES
//! specification: the organic subset (B C N O P S F Cl Br I), bracket atoms
//! with isotope, hydrogen count, charge and atom class, lower-case aromatic
//! atoms, ring closures (`1`–`9`, `%nn`), branches, bond symbols `- = # $ :`,
//! direction marks `/ \` and chirality (read and ignored here) and
//! dot-separated components. Implicit hydrogens follow the specification's
//! normal valences; aromatic atoms get theirs after the ring system is given
//! alternating double bonds (Kekulé form). Ring bonds are found by cycle
//! detection; a Kekulé ring that satisfies the Hückel rule (4n+2 π electrons)
//! is marked aromatic, so `C1=CC=CC=C1` and `c1ccccc1` are the same molecule.
//!
//! Reference: OpenSMILES specification, version 1.0 (opensmiles.org, 2016).
//!
//! ```
//! use ebullio::molecule::parse_smiles;
//! let a = parse_smiles("C1=CC=CC=C1O").unwrap();
//! let b = parse_smiles("Oc1ccccc1").unwrap();
//! assert_eq!(a.formula(), "C6H6O");
//! assert_eq!(a.structure_key(), b.structure_key());
//! assert!(a.atoms().iter().filter(|x| x.aromatic).count() == 6);
//! ```

mod aromatic;
mod canon;
mod element;
mod error;
mod kekule;
mod parse;
mod rings;

pub use element::Element;
pub use error::{SmilesError, SmilesErrorKind};

/// Bond order as written (or perceived, for aromatic bonds).
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum BondOrder {
    /// Single bond (`-`, or no symbol).
    Single,
    /// Double bond (`=`).
    Double,
    /// Triple bond (`#`).
    Triple,
    /// Quadruple bond (`$`).
    Quadruple,
    /// Aromatic bond (`:`, or no symbol between two aromatic atoms in a ring).
    Aromatic,
}

impl BondOrder {
    /// Integer order; aromatic bonds count 1 here (their Kekulé order is on the bond).
    pub fn integer(self) -> u8 {
        match self {
            BondOrder::Single | BondOrder::Aromatic => 1,
            BondOrder::Double => 2,
            BondOrder::Triple => 3,
            BondOrder::Quadruple => 4,
        }
    }
}

/// One atom of a [`Molecule`].
#[derive(Debug, Clone, PartialEq)]
pub struct Atom {
    /// The element.
    pub element: Element,
    /// Aromatic (lower-case in the input, or perceived by the Hückel rule).
    pub aromatic: bool,
    /// Formal charge.
    pub charge: i8,
    /// Isotope mass number, if written.
    pub isotope: Option<u16>,
    /// Hydrogens carried by this atom (implicit, or the bracket `H` count);
    /// hydrogens written as separate `[H]` atoms are not included here.
    pub hydrogens: u8,
    /// Written in brackets.
    pub bracket: bool,
    /// In at least one ring.
    pub in_ring: bool,
    /// 1-based character position of the atom in the input SMILES.
    pub position: usize,
}

/// One bond of a [`Molecule`].
#[derive(Debug, Clone, PartialEq)]
pub struct Bond {
    /// First atom index.
    pub a: usize,
    /// Second atom index.
    pub b: usize,
    /// Order as written or perceived.
    pub order: BondOrder,
    /// Order in the Kekulé form (1, 2, 3, 4); equals `order` for non-aromatic bonds.
    pub kekule_order: u8,
    /// In at least one ring.
    pub in_ring: bool,
}

impl Bond {
    /// The atom at the other end from `i`.
    pub fn other(&self, i: usize) -> usize {
        if self.a == i {
            self.b
        } else {
            self.a
        }
    }
}

/// A molecule (or several dot-separated components) read from SMILES.
#[derive(Debug, Clone, PartialEq)]
pub struct Molecule {
    atoms: Vec<Atom>,
    bonds: Vec<Bond>,
    /// For each atom, (neighbour, bond index).
    adj: Adjacency,
    components: usize,
    smiles: String,
    /// Per atom: heavy degree and total hydrogens (computed with the implicit hydrogens).
    tally: Vec<(u32, u32)>,
    /// The spanning forest as written and the ring closures (for ring membership).
    tree: parse::Tree,
}

/// Largest molecule read (atoms), to keep time and memory bounded on any input.
pub const MAX_ATOMS: usize = 100_000;

/// Read a SMILES string into a [`Molecule`].
///
/// Errors name the problem and the 1-based character position:
///
/// ```
/// use ebullio::molecule::parse_smiles;
/// assert_eq!(parse_smiles("C1CCCCC").unwrap_err().to_string(), "unclosed ring 1 at position 2");
/// assert!(parse_smiles("CCO.Cl").unwrap().components() == 2);
/// ```
pub fn parse_smiles(s: &str) -> Result<Molecule, SmilesError> {
    let mut m = Molecule::empty();
    parse_smiles_into(s, &mut m)?;
    Ok(m)
}

/// [`parse_smiles`] into `m`, reusing its storage (a batch reads every structure into
/// one molecule and allocates only when a structure is larger than all before it).
/// On success `m` is exactly what [`parse_smiles`] gives; on error its contents are
/// unspecified (but it can be read into again), and the error is the same.
///
/// ```
/// use ebullio::molecule::{parse_smiles, parse_smiles_into, Molecule};
/// let mut m = Molecule::empty();
/// for s in ["CCO", "c1ccccc1O", "CC(C)=O"] {
///     parse_smiles_into(s, &mut m).unwrap();
///     assert_eq!(m, parse_smiles(s).unwrap());
/// }
/// assert!(parse_smiles_into("C1CC", &mut m).is_err());
/// ```
pub fn parse_smiles_into(s: &str, m: &mut Molecule) -> Result<(), SmilesError> {
    m.components = parse::read(s, &mut m.atoms, &mut m.bonds, &mut m.tree)?;
    m.adj.fill(m.atoms.len(), &m.bonds);
    m.smiles.clear();
    m.smiles.push_str(s.trim());
    m.tally.clear();
    rings::mark_ring_bonds(m);
    // Bonds left aromatic by default between two aromatic atoms but outside any
    // ring (biphenyl written c1ccccc1c1ccccc1) are single bonds.
    for b in &mut m.bonds {
        if b.order == BondOrder::Aromatic && !b.in_ring {
            b.order = BondOrder::Single;
            b.kekule_order = 1;
        }
    }
    if let Some(a) = m.atoms.iter().find(|a| a.aromatic && !a.in_ring) {
        return Err(SmilesError {
            kind: SmilesErrorKind::AromaticOutsideRing(a.element.symbol().to_lowercase()),
            position: a.position,
            input: s.to_string(),
        });
    }
    kekule::kekulize(m).map_err(|(kind, pos)| SmilesError {
        kind,
        position: pos,
        input: s.to_string(),
    })?;
    // the hydrogens and the tally; aromaticity perception changes neither
    kekule::implicit_hydrogens(m).map_err(|(kind, pos)| SmilesError {
        kind,
        position: pos,
        input: s.to_string(),
    })?;
    aromatic::perceive(m);
    Ok(())
}

/// Appends `n` in decimal (what `write!(out, "{n}")` gives, without the formatter).
pub fn push_count(out: &mut String, mut n: u32) {
    if n < 10 {
        // one figure, the usual count
        out.push(char::from(b'0' + n as u8));
        return;
    }
    let mut buf = [0u8; 10];
    let mut i = buf.len();
    loop {
        i -= 1;
        buf[i] = b'0' + (n % 10) as u8;
        n /= 10;
        if n == 0 {
            break;
        }
    }
    for &b in &buf[i..] {
        out.push(b as char);
    }
}

/// A formula's charge suffix: nothing for 0, `+`, `-`, `+2`, `-3`, ...
fn push_charge(out: &mut String, q: i32) {
    if q != 0 {
        out.push(if q > 0 { '+' } else { '-' });
        if q.unsigned_abs() > 1 {
            push_count(out, q.unsigned_abs());
        }
    }
}

/// Every atom's (neighbour, bond index) list in one flat array (two allocations per
/// molecule instead of one per atom); `adj[i]` is atom `i`'s slice, in bond order.
#[derive(Debug, Clone, PartialEq)]
struct Adjacency {
    /// Atom `i`'s entries are `nb[start[i]..start[i + 1]]`.
    start: Vec<usize>,
    nb: Vec<(usize, usize)>,
}

impl Adjacency {
    fn get(&self, i: usize) -> Option<&[(usize, usize)]> {
        let (a, b) = (*self.start.get(i)?, *self.start.get(i + 1)?);
        self.nb.get(a..b)
    }
}

impl std::ops::Index<usize> for Adjacency {
    type Output = [(usize, usize)];
    fn index(&self, i: usize) -> &[(usize, usize)] {
        &self.nb[self.start[i]..self.start[i + 1]]
    }
}

impl Adjacency {
    /// The lists of `n` atoms joined by `bonds`, in the storage already held.
    fn fill(&mut self, n: usize, bonds: &[Bond]) {
        let start = &mut self.start;
        start.clear();
        start.resize(n + 1, 0);
        for b in bonds {
            start[b.a + 1] += 1;
            start[b.b + 1] += 1;
        }
        for i in 0..n {
            start[i + 1] += start[i];
        }
        self.nb.clear();
        self.nb.resize(2 * bonds.len(), (0, 0));
        // start[i] serves as atom i's fill cursor, then moves back by one list
        for (k, b) in bonds.iter().enumerate() {
            self.nb[start[b.a]] = (b.b, k);
            start[b.a] += 1;
            self.nb[start[b.b]] = (b.a, k);
            start[b.b] += 1;
        }
        for i in (1..=n).rev() {
            start[i] = start[i - 1];
        }
        start[0] = 0;
    }
}

impl Default for Molecule {
    fn default() -> Self {
        Molecule::empty()
    }
}

impl Molecule {
    /// A molecule with no atoms, to read into with [`parse_smiles_into`].
    pub fn empty() -> Molecule {
        Molecule {
            atoms: Vec::new(),
            bonds: Vec::new(),
            adj: Adjacency {
                start: vec![0],
                nb: Vec::new(),
            },
            components: 0,
            smiles: String::new(),
            tally: Vec::new(),
            tree: parse::Tree::default(),
        }
    }

    /// All atoms, hydrogens written as `[H]` atoms included, in input order.
    pub fn atoms(&self) -> &[Atom] {
        &self.atoms
    }

    /// All bonds.
    pub fn bonds(&self) -> &[Bond] {
        &self.bonds
    }

    /// Neighbours of atom `i` as (atom index, bond index).
    pub fn neighbours(&self, i: usize) -> &[(usize, usize)] {
        self.adj.get(i).unwrap_or(&[])
    }

    /// Number of dot-separated components (connected pieces).
    pub fn components(&self) -> usize {
        self.components
    }

    /// The SMILES as given (trimmed).
    pub fn smiles(&self) -> &str {
        &self.smiles
    }

    /// Whether atom `i` is a heavy atom (anything but hydrogen).
    pub fn is_heavy(&self, i: usize) -> bool {
        self.atoms.get(i).is_some_and(|a| a.element != Element::H)
    }

    /// Total hydrogens on atom `i`: its own count plus bonded `[H]` atoms.
    pub fn total_hydrogens(&self, i: usize) -> u32 {
        self.tally.get(i).map_or(0, |t| t.1)
    }

    /// Heavy-atom neighbours of atom `i` (its heavy degree).
    pub fn heavy_degree(&self, i: usize) -> usize {
        self.tally.get(i).map_or(0, |t| t.0 as usize)
    }

    /// Indices of heavy atoms with their total hydrogen counts, in input order.
    pub fn heavy_atom_hydrogens(&self) -> Vec<(usize, u32)> {
        (0..self.atoms.len())
            .filter(|&i| self.is_heavy(i))
            .map(|i| (i, self.total_hydrogens(i)))
            .collect()
    }

    /// Number of atoms of each element, hydrogens included (all forms).
    pub fn element_counts(&self) -> std::collections::BTreeMap<Element, u32> {
        let mut m = std::collections::BTreeMap::new();
        for a in &self.atoms {
            *m.entry(a.element).or_insert(0) += 1;
            if a.hydrogens > 0 {
                *m.entry(Element::H).or_insert(0) += a.hydrogens as u32;
            }
        }
        m
    }

    /// Total number of atoms, hydrogens included.
    pub fn atom_count_with_hydrogens(&self) -> u32 {
        self.atoms.iter().map(|a| 1 + a.hydrogens as u32).sum()
    }

    /// Atoms of each element by atomic number, hydrogens included (what
    /// [`Molecule::element_counts`] gives, without building a map).
    fn counts_by_number(&self) -> [u32; 119] {
        let mut c = [0u32; 119];
        for a in &self.atoms {
            c[a.element.number() as usize] += 1;
            c[1] += a.hydrogens as u32;
        }
        c
    }

    /// Net formal charge.
    pub fn net_charge(&self) -> i32 {
        self.atoms.iter().map(|a| a.charge as i32).sum()
    }

    /// Molar mass in g/mol, if every element has a weight here.
    pub fn molar_mass(&self) -> Option<f64> {
        let mut m = 0.0;
        for (e, n) in self.element_counts() {
            m += e.atomic_weight()? * n as f64;
        }
        Some(m)
    }

    /// Molecular formula in Hill order (C, H, then alphabetical; alphabetical
    /// throughout when there is no carbon), with a net charge suffix such as
    /// `+`, `-2`.
    ///
    /// ```
    /// assert_eq!(ebullio::molecule::parse_smiles("CC(=O)[O-]").unwrap().formula(), "C2H3O2-");
    /// assert_eq!(ebullio::molecule::parse_smiles("ClCCl").unwrap().formula(), "CH2Cl2");
    /// ```
    pub fn formula(&self) -> String {
        let mut s = String::new();
        self.write_formula(&mut s);
        s
    }

    /// Appends [`Molecule::formula`] to `out` (no text of its own built).
    pub fn write_formula(&self, out: &mut String) {
        // The elements present and their counts in a short list (a molecule has few);
        // more than it holds go the way of [`Molecule::write_formula_by_number`].
        const MOST: usize = 12;
        let mut els = [(Element::H, 0u32); MOST];
        let (mut k, mut h, mut q) = (0, 0u32, 0i32);
        for a in &self.atoms {
            h += a.hydrogens as u32;
            q += a.charge as i32;
            if a.element == Element::H {
                h += 1;
                continue;
            }
            match els[..k].iter_mut().find(|e| e.0 == a.element) {
                Some(e) => e.1 += 1,
                None if k < MOST => {
                    els[k] = (a.element, 1);
                    k += 1;
                }
                None => return self.write_formula_by_number(out),
            }
        }
        let mut push = |sym: &str, n: u32| {
            out.push_str(sym);
            if n > 1 {
                push_count(out, n);
            }
        };
        let carbon = els[..k].iter().position(|e| e.0 == Element::C);
        if let Some(c) = carbon {
            push("C", els[c].1);
            if h > 0 {
                push("H", h);
            }
            els.swap(c, k - 1);
            k -= 1;
        } else if h > 0 {
            // without carbon, hydrogen takes its alphabetical place
            if k == MOST {
                return self.write_formula_by_number(out);
            }
            els[k] = (Element::H, h);
            k += 1;
        }
        let rest = &mut els[..k];
        rest.sort_unstable_by_key(|e| e.0.symbol());
        for e in rest.iter() {
            push(e.0.symbol(), e.1);
        }
        push_charge(out, q);
    }

    /// [`Molecule::write_formula`] from counts by atomic number (any number of elements).
    fn write_formula_by_number(&self, out: &mut String) {
        let counts = self.counts_by_number();
        let mut push = |sym: &str, n: u32| {
            out.push_str(sym);
            if n > 1 {
                push_count(out, n);
            }
        };
        let has_c = counts[6] > 0;
        if has_c {
            push("C", counts[6]);
            if counts[1] > 0 {
                push("H", counts[1]);
            }
        }
        // the other elements present, alphabetical by symbol
        let mut rest = [Element::H; 119];
        let mut k = 0;
        for (z, &n) in counts.iter().enumerate() {
            if n > 0 && !(has_c && (z == 1 || z == 6)) {
                rest[k] = Element::from_number(z as u8).unwrap_or(Element::H);
                k += 1;
            }
        }
        let rest = &mut rest[..k];
        rest.sort_unstable_by_key(|e| e.symbol());
        for e in rest.iter() {
            push(e.symbol(), counts[e.number() as usize]);
        }
        push_charge(out, self.net_charge());
    }

    /// Whether any atom is of element `e` (hydrogens on atoms count as H).
    pub fn has_element(&self, e: Element) -> bool {
        self.atoms
            .iter()
            .any(|a| a.element == e || (e == Element::H && a.hydrogens > 0))
    }

    /// A string identical for every valid spelling of the same structure
    /// (atom order, ring numbering, Kekulé or aromatic form): a canonical
    /// SMILES from a Morgan-style refined ranking of the atoms.
    ///
    /// ```
    /// use ebullio::molecule::parse_smiles;
    /// let k = |s| parse_smiles(s).unwrap().structure_key();
    /// assert_eq!(k("OCC"), k("CCO"));
    /// assert_ne!(k("CCO"), k("COC"));
    /// ```
    pub fn structure_key(&self) -> String {
        canon::canonical_smiles(self)
    }

    /// A valid SMILES for this molecule (the canonical one).
    pub fn write_smiles(&self) -> String {
        canon::canonical_smiles(self)
    }
}

#[cfg(test)]
mod tests {
    use super::{parse_smiles, push_count};

    #[test]
    fn push_count_writes_what_the_formatter_writes() {
        for n in (0..100_000).chain([u32::MAX - 1, u32::MAX]) {
            let mut s = String::from("x");
            push_count(&mut s, n);
            assert_eq!(s, format!("x{n}"));
        }
    }

    /// A ring closure that would repeat a bond is refused, whether the bond is a chain
    /// bond either way round or an earlier closure; closures that add a bond are read.
    #[test]
    fn ring_closures_that_repeat_a_bond_are_refused() {
        for s in ["C1C1", "C(C1)1", "CC1(C)C1", "C12CC12", "C12CCC21"] {
            let e = parse_smiles(s).unwrap_err();
            assert!(
                matches!(e.kind, crate::molecule::SmilesErrorKind::BadRingClosure(_)),
                "{s}: {e}"
            );
        }
        for s in ["C1CC1", "C12CC1C2", "C1.C1", "C(CC1)C1", "C1CC2CC1C2"] {
            assert!(parse_smiles(s).is_ok(), "{s}");
        }
    }

    /// The short-list formula and the one from counts by atomic number agree, with and
    /// without carbon, with hydrogen atoms, charges and more elements than the list holds.
    #[test]
    fn formula_from_the_short_list_matches_the_counts() {
        for s in [
            "CCO",
            "C",
            "[H][H]",
            "[H]C([H])([H])O",
            "O",
            "N#N",
            "ClCCl",
            "CC(=O)[O-]",
            "[NH4+]",
            "[O-][O-]",
            "[Fe+3]",
            "[13CH4]",
            "*C",
            "BrC(Cl)(F)I",
            "OS(=O)(=O)O",
            "[Na+].[Cl-]",
            "[Si](Cl)(Cl)(Br)I.[Li]F.[K]Br.[Na]P(=O)(O)O.[Se].[Ge].[B]",
            "[Li][Be][B][Na][Mg][Al][Si][K][Ca][Sc][Ti][V][Cr][Mn]",
            "C[Li][Be][B][Na][Mg][Al][Si][K][Ca][Sc][Ti][V][Cr][Mn]",
            "[Li][Be][B][Na][Mg][Al][Si][K][Ca][Sc][Ti][V]",
            "[Li][Be][B][Na][Mg][Al][Si][K][Ca][Sc][Ti][V][H]",
            "c1ccccc1[N+](=O)[O-]",
        ] {
            let m = parse_smiles(s).unwrap();
            let (mut fast, mut full) = (String::new(), String::new());
            m.write_formula(&mut fast);
            m.write_formula_by_number(&mut full);
            assert_eq!(fast, full, "{s}");
        }
    }

    #[test]
    fn cached_degrees_and_hydrogens_count_bracket_hydrogens() {
        // [H]C([H])([H])O: the methyl's hydrogens are atoms, the O has one implicit H
        let m = parse_smiles("[H]C([H])([H])O").unwrap();
        let c = m
            .atoms()
            .iter()
            .position(|a| a.element.symbol() == "C")
            .unwrap();
        let o = m
            .atoms()
            .iter()
            .position(|a| a.element.symbol() == "O")
            .unwrap();
        assert_eq!((m.heavy_degree(c), m.total_hydrogens(c)), (1, 3));
        assert_eq!((m.heavy_degree(o), m.total_hydrogens(o)), (1, 1));
        // a chain (no ring) and a ring: ring flags only on the ring
        let chain = parse_smiles("CCOC(C)=O").unwrap();
        assert!(chain.atoms().iter().all(|a| !a.in_ring));
        let ring = parse_smiles("C1CCCCC1C").unwrap();
        assert_eq!(ring.atoms().iter().filter(|a| a.in_ring).count(), 6);
        assert_eq!(ring.bonds().iter().filter(|b| b.in_ring).count(), 6);
    }
}
