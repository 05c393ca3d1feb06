"""Type stub of the native module (Rust, PyO3). Use the functions of ``ebullio`` instead."""

from typing import Any, List, Optional, Sequence, Tuple

class InputError(ValueError):
    """Bad input; the message names the row (or file and line), the column and what was expected."""

    file: Optional[str]
    line: Optional[int]
    row: Optional[int]
    column: Optional[str]
    code: Optional[str]

class ArrowStream:
    """Columns handed to Python through the Arrow C stream interface (read once)."""

    def __arrow_c_stream__(self, requested_schema: Optional[object] = None) -> object: ...

class EstimateRun:
    def json(self) -> str: ...
    def html(self, command_line: str) -> str: ...

class FitRun:
    def json(self) -> str: ...
    def warnings(self) -> List[Tuple[Optional[int], str, str]]: ...
    def html(self, command_line: str) -> str: ...

class CheckRun:
    def summary_json(self, worst: int) -> str: ...
    def summary_text(self, worst: int) -> str: ...
    def html(self, table_name: str, command_line: str) -> str: ...
    def worst(self) -> Optional[str]: ...

def estimate(
    smiles: Any,
    compound: Optional[Any] = None,
    at: Sequence[str] = ...,
    measured: Sequence[str] = ...,
    keep_rows: bool = False,
) -> Tuple[ArrowStream, Optional[EstimateRun]]: ...
def fit(
    csv: Optional[bytes],
    path: Optional[str],
    model: str,
    at: Sequence[str],
    robust: bool,
    constants: str,
    tc: Optional[str],
    pc: Optional[str],
    compound: Optional[str],
    smiles: Optional[str],
    t_unit: Optional[str],
    p_unit: Optional[str],
    ref_p_tolerance_pct: float,
    ref_tb_tolerance_k: float,
    exclude: Sequence[str],
    barometric: Optional[str],
) -> FitRun: ...
def check(
    columns: Sequence[Tuple[str, Any]],
    constants: Optional[str] = None,
    tolerance: float = 1.0,
    reference_table: Optional[str] = None,
    bundled_reference: bool = True,
    structure: bool = True,
) -> Tuple[ArrowStream, CheckRun]: ...
def boil(
    pressure: Sequence[str],
    temperature: Sequence[str],
    antoine: Optional[Tuple[float, float, float]] = None,
    constants: Optional[str] = None,
    range: Optional[str] = None,
    compound: Optional[str] = None,
    reference_table: Optional[str] = None,
    fit: Optional[str] = None,
    smiles: Optional[str] = None,
    pressure_range: Optional[str] = None,
    temperature_range: Optional[str] = None,
    steps: int = 10,
    barometric: Optional[str] = None,
) -> str: ...
def vle(
    compound: Sequence[str],
    smiles: Sequence[str],
    pressure: Optional[str] = None,
    temperature: Optional[str] = None,
    model: Optional[str] = None,
    wilson: Optional[Sequence[float]] = None,
    nrtl: Optional[Sequence[float]] = None,
    points: int = 101,
    barometric: Optional[str] = None,
) -> str: ...
def version() -> str: ...
def threads() -> int: ...
