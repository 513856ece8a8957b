"""Type hints for acidsite (see the docstrings in __init__.py)."""

from typing import Any, Dict, Iterable, Iterator, List, Literal, Mapping, Optional, Sequence, Tuple, Union, overload

__version__: str
rule_set_version: str
SCHEMA: str
REACTIONS: Tuple[str, ...]
CONTROLS: Tuple[str, ...]
DEFAULT_CHUNK: int

Scale = Literal["dmso", "water"]
Flags = Union[Mapping[str, str], Sequence[str], None]

class Record(Dict[str, Any]):
    def __init__(self, data: Any = ..., options: Optional[Mapping[str, Any]] = ...) -> None: ...
    def svg(self, bond_px: float = ...) -> Optional[str]: ...
    def _repr_svg_(self) -> Optional[str]: ...
    def _repr_html_(self) -> str: ...

def scan(
    smiles: str,
    *,
    site: Optional[int] = ...,
    base: Optional[str] = ...,
    scale: Scale = ...,
    reaction: Optional[str] = ...,
    control: Optional[Literal["kinetic", "thermodynamic"]] = ...,
    flags: Flags = ...,
) -> Record: ...
def draw(
    smiles: str,
    *,
    site: Optional[int] = ...,
    base: Optional[str] = ...,
    scale: Scale = ...,
    reaction: Optional[str] = ...,
    control: Optional[Literal["kinetic", "thermodynamic"]] = ...,
    bond_px: float = ...,
) -> str: ...
@overload
def annotate(
    smiles: Iterable[Optional[str]],
    *,
    ids: Optional[Iterable[Any]] = ...,
    threads: Optional[int] = ...,
    sites_only: bool = ...,
    site: Optional[int] = ...,
    base: Optional[str] = ...,
    scale: Scale = ...,
    reaction: Optional[str] = ...,
    control: Optional[Literal["kinetic", "thermodynamic"]] = ...,
    flags: Flags = ...,
    chunk: int = ...,
    as_json: Literal[False] = ...,
    detail: Literal["full", "brief"] = ...,
) -> Iterator[Record]: ...
@overload
def annotate(
    smiles: Iterable[Optional[str]],
    *,
    ids: Optional[Iterable[Any]] = ...,
    threads: Optional[int] = ...,
    sites_only: bool = ...,
    site: Optional[int] = ...,
    base: Optional[str] = ...,
    scale: Scale = ...,
    reaction: Optional[str] = ...,
    control: Optional[Literal["kinetic", "thermodynamic"]] = ...,
    flags: Flags = ...,
    chunk: int = ...,
    as_json: Literal[True],
    detail: Literal["full", "brief"] = ...,
) -> Iterator[str]: ...
def annotate_frame(
    df: Any,
    smiles_column: str = ...,
    *,
    per_site: bool = ...,
    id_column: Optional[str] = ...,
    keep_columns: bool = ...,
    with_record: bool = ...,
    threads: Optional[int] = ...,
    sites_only: bool = ...,
    site: Optional[int] = ...,
    base: Optional[str] = ...,
    scale: Scale = ...,
    reaction: Optional[str] = ...,
    control: Optional[Literal["kinetic", "thermodynamic"]] = ...,
    chunk: int = ...,
) -> Any: ...
def frame_columns(per_site: bool = ...) -> List[Tuple[str, str]]: ...
def read_csv_output(path_or_buffer: Any, **kwargs: Any) -> Any: ...
def bases() -> List[Dict[str, Any]]: ...
def rules() -> List[Dict[str, Any]]: ...
