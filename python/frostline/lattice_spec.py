"""What a lattice declares about itself, in one place: :class:`LatticeSpec`.

Every lattice module (built in or outside) defines ``LATTICE = LatticeSpec(...)``
and registers its module under the entry-point group ``frostline.lattices``.
The command line, :mod:`frostline.exact.formulas`, :mod:`frostline.io` and the
registry read these declarations; none of them names a lattice.
"""
from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any, Callable, Dict, Mapping, Optional, Sequence, Tuple

from .region import Region


@dataclass(frozen=True)
class Argument:
    """One command-line argument of a shape (passed to ``argparse.add_argument``).

    ``name`` is the keyword the shape's ``build`` receives; ``flag`` (for
    example ``"--q"``) makes it an option, otherwise it is positional.
    ``exclusive`` names a group of mutually exclusive arguments; ``style``
    makes the argument a keyword of the picture (``sample --picture``), under
    that name, instead of an argument of the region.
    """

    name: str
    help: str
    type: Optional[Callable[[str], Any]] = int
    nargs: Any = None
    default: Any = None
    metavar: Any = None
    flag: Optional[str] = None
    choices: Optional[Sequence[Any]] = None
    exclusive: Optional[str] = None
    style: Optional[str] = None

    def add_to(self, parser: Any) -> None:
        """Add this argument to an argparse parser or group."""
        options: Dict[str, Any] = {"help": self.help}
        for key in ("type", "nargs", "metavar", "choices"):
            if getattr(self, key) is not None:
                options[key] = getattr(self, key)
        if self.flag is None:
            parser.add_argument(self.name, **options)
        else:
            parser.add_argument(self.flag, dest=self.name, default=self.default, **options)


@dataclass(frozen=True)
class Shape:
    """A named family of regions with its command-line arguments.

    ``build(**arguments)`` returns the region; ``required`` lists exclusive
    groups of which exactly one member must be given; ``methods`` adds the
    shape's own exact methods (beyond auto, cftp and generic, which every
    region has) to the command line's ``--method`` choices.
    """

    name: str
    help: str
    build: Callable[..., Region]
    arguments: Tuple[Argument, ...] = ()
    description: str = ""
    required: Tuple[str, ...] = ()
    methods: Tuple[str, ...] = ()

    @property
    def method_choices(self) -> Tuple[str, ...]:
        """Every ``--method`` value the command line accepts for this shape."""
        return ("auto", "cftp", "generic") + tuple(m for m in self.methods if m not in ("auto", "cftp", "generic"))


@dataclass(frozen=True)
class LatticeSpec:
    """Everything the rest of frostline knows about one lattice.

    Attributes
    ----------
    name : str
        The registry key (one lowercase word, also the module name).
    summary : str
        One line for ``frostline lattices``.
    shapes : tuple of Shape
        Region families for the command line.
    closed_forms : mapping name -> callable
        Exact counts and partition functions in closed form
        (re-exported by :mod:`frostline.exact.formulas`).
    tile_classes : tuple of str
        Names of the tile classes, in class-index order.
    theory_curves : tuple of str
        The published limit curves ``Region.arctic_curve`` knows, with sources.
    streams : mapping name -> int
        Random-stream ids of the lattice's own exact methods (the engine owns
        1 and 2); they never change, so seeds keep their samples.
    weight_keys : tuple of str
        Keys of ``Region.describe()`` that hold weights (stored separately in
        sample files).
    region_from_record : callable(record, arrays) -> Region
        Rebuilds a region from a sample file's record and arrays.
    comparison : (label, callable(n) -> Region), optional
        The region family whose frozen boundary ``frostline compare`` measures
        against theory at size n.
    demo : callable(size, q) -> list of (label, Region, title, note), optional
        Regions that ``frostline demo`` samples and draws; ``note(sample)``
        (or None) gives one more (label, value) row of the sample's table, for
        a figure that applies to that region (for example its volume).
    """

    name: str
    summary: str
    shapes: Tuple[Shape, ...] = ()
    closed_forms: Mapping[str, Callable[..., Any]] = field(default_factory=dict)
    tile_classes: Tuple[str, ...] = ()
    theory_curves: Tuple[str, ...] = ()
    streams: Mapping[str, int] = field(default_factory=dict)
    weight_keys: Tuple[str, ...] = ()
    region_from_record: Optional[Callable[[dict, dict], Region]] = None
    comparison: Optional[Tuple[str, Callable[[int], Region]]] = None
    demo: Optional[Callable[[int, Optional[float]], Sequence[Tuple[str, Region, str, Any]]]] = None

    def __post_init__(self) -> None:
        if not self.name.isidentifier() or self.name != self.name.lower():
            raise ValueError(f"a lattice name is one lowercase identifier, got {self.name!r}")
        for stream_name, value in self.streams.items():
            if isinstance(value, bool) or not isinstance(value, int) or value < 3:
                raise ValueError(f"stream {stream_name!r} of lattice {self.name!r} must be an int >= 3 "
                                 f"(1 and 2 belong to the engine), got {value!r}")
