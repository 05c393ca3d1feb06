//! Chemical elements: symbols, atomic numbers and standard atomic weights.
//!
//! Reference: IUPAC Commission on Isotopic Abundances and Atomic Weights,
//! standard atomic weights (abridged, conventional values) for the elements
//! organic chemistry uses; other elements carry no weight here.

/// Element symbols by atomic number (index 0 is the SMILES wildcard `*`).
const SYMBOLS: [&str; 119] = [
    "*", "H", "He", "Li", "Be", "B", "C", "N", "O", "F", "Ne", "Na", "Mg", "Al", "Si", "P", "S",
    "Cl", "Ar", "K", "Ca", "Sc", "Ti", "V", "Cr", "Mn", "Fe", "Co", "Ni", "Cu", "Zn", "Ga", "Ge",
    "As", "Se", "Br", "Kr", "Rb", "Sr", "Y", "Zr", "Nb", "Mo", "Tc", "Ru", "Rh", "Pd", "Ag", "Cd",
    "In", "Sn", "Sb", "Te", "I", "Xe", "Cs", "Ba", "La", "Ce", "Pr", "Nd", "Pm", "Sm", "Eu", "Gd",
    "Tb", "Dy", "Ho", "Er", "Tm", "Yb", "Lu", "Hf", "Ta", "W", "Re", "Os", "Ir", "Pt", "Au", "Hg",
    "Tl", "Pb", "Bi", "Po", "At", "Rn", "Fr", "Ra", "Ac", "Th", "Pa", "U", "Np", "Pu", "Am", "Cm",
    "Bk", "Cf", "Es", "Fm", "Md", "No", "Lr", "Rf", "Db", "Sg", "Bh", "Hs", "Mt", "Ds", "Rg", "Cn",
    "Nh", "Fl", "Mc", "Lv", "Ts", "Og",
];

/// A chemical element, by atomic number (0 is the SMILES wildcard atom `*`).
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub struct Element(u8);

impl Element {
    /// Hydrogen.
    pub const H: Element = Element(1);
    /// Boron.
    pub const B: Element = Element(5);
    /// Carbon.
    pub const C: Element = Element(6);
    /// Nitrogen.
    pub const N: Element = Element(7);
    /// Oxygen.
    pub const O: Element = Element(8);
    /// Fluorine.
    pub const F: Element = Element(9);
    /// Silicon.
    pub const SI: Element = Element(14);
    /// Phosphorus.
    pub const P: Element = Element(15);
    /// Sulfur.
    pub const S: Element = Element(16);
    /// Chlorine.
    pub const CL: Element = Element(17);
    /// Bromine.
    pub const BR: Element = Element(35);
    /// Iodine.
    pub const I: Element = Element(53);

    /// The element with this atomic number, if it exists (0 = wildcard).
    pub fn from_number(z: u8) -> Option<Element> {
        ((z as usize) < SYMBOLS.len()).then_some(Element(z))
    }

    /// The element written with this symbol (case-sensitive, e.g. `"Cl"`).
    ///
    /// ```
    /// use ebullio::molecule::Element;
    /// assert_eq!(Element::from_symbol("Cl"), Some(Element::CL));
    /// assert_eq!(Element::from_symbol("Xx"), None);
    /// ```
    pub fn from_symbol(s: &str) -> Option<Element> {
        SYMBOLS
            .iter()
            .position(|&x| x == s)
            .map(|z| Element(z as u8))
    }

    /// Atomic number (0 for the wildcard).
    pub fn number(self) -> u8 {
        self.0
    }

    /// Element symbol, e.g. `"Br"`.
    pub fn symbol(self) -> &'static str {
        SYMBOLS[self.0 as usize]
    }

    /// English name for messages, for the elements the estimator meets.
    pub fn name(self) -> &'static str {
        match self.0 {
            0 => "wildcard atom",
            1 => "hydrogen",
            5 => "boron",
            6 => "carbon",
            7 => "nitrogen",
            8 => "oxygen",
            9 => "fluorine",
            14 => "silicon",
            15 => "phosphorus",
            16 => "sulfur",
            17 => "chlorine",
            34 => "selenium",
            35 => "bromine",
            53 => "iodine",
            _ => self.symbol(),
        }
    }

    /// Standard atomic weight in g/mol (conventional value), where known here.
    pub fn atomic_weight(self) -> Option<f64> {
        Some(match self.0 {
            1 => 1.008,
            3 => 6.94,
            5 => 10.81,
            6 => 12.011,
            7 => 14.007,
            8 => 15.999,
            9 => 18.998,
            11 => 22.990,
            12 => 24.305,
            13 => 26.982,
            14 => 28.085,
            15 => 30.974,
            16 => 32.06,
            17 => 35.45,
            19 => 39.098,
            20 => 40.078,
            26 => 55.845,
            29 => 63.546,
            30 => 65.38,
            33 => 74.922,
            34 => 78.971,
            35 => 79.904,
            50 => 118.71,
            53 => 126.904,
            _ => return None,
        })
    }

    /// Normal valences of the SMILES organic subset (OpenSMILES §3.1.1);
    /// empty for other elements.
    pub fn organic_valences(self) -> &'static [u8] {
        match self.0 {
            5 => &[3],
            6 => &[4],
            7 => &[3, 5],
            8 => &[2],
            15 => &[3, 5],
            16 => &[2, 4, 6],
            9 | 17 | 35 | 53 => &[1],
            _ => &[],
        }
    }
}

impl std::fmt::Display for Element {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.symbol())
    }
}
