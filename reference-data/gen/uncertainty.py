"""Stated expanded uncertainty (k = 2) in vapor pressure of some equations of state.

Keyed by the bibliography key of the equation. Values are FROM MEMORY of each paper's
abstract or uncertainty section (not re-read for this project); each is marked so in the
generated table. Equations not listed carry no recorded statement, and ebullio applies its
class value for reference equations (reference-data/SOURCES.md).
"""

STATED_U_P = {
    "Lemmon-JCED-2006": ("0.2", "from memory of Lemmon & Span (2006)"),
    "Span-IJT-2003B": ("0.2", "from memory of Span & Wagner (2003)"),
    "Span-JPCRD-1996": ("0.012", "from memory of Span & Wagner (1996)"),
}
