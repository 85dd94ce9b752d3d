# Type stubs for the compiled module frostline._core (private).
# Its submodules are written as classes with static methods so that one stub
# file describes them; at run time they are pybind11 submodules.
from typing import Callable, List, Optional, Tuple

import numpy as np
import numpy.typing as npt

ProgressHook = Optional[Callable[[int, int, float], None]]
IntArray = npt.NDArray[np.int32]

class ForwardChain:
    def run(self, sweeps: int, progress: ProgressHook = ...) -> int: ...
    @property
    def heights(self) -> IntArray: ...
    @property
    def time(self) -> int: ...

class engine:
    class HeightModel:
        def __init__(self, n_sites: int, boundary_values: npt.ArrayLike, constraints: npt.ArrayLike,
                     residues: npt.ArrayLike, step: int, colour_classes: npt.ArrayLike) -> None: ...
        @property
        def n_sites(self) -> int: ...
        @property
        def n_nodes(self) -> int: ...
        @property
        def step(self) -> int: ...
        @property
        def n_colour_classes(self) -> int: ...

    class ForwardChain(ForwardChain): ...

    @staticmethod
    def simd_levels() -> List[str]: ...
    @staticmethod
    def simd_choice() -> str: ...
    @staticmethod
    def extremes(model: engine.HeightModel) -> Tuple[IntArray, IntArray]: ...
    @staticmethod
    def sample(model: engine.HeightModel, least: IntArray, greatest: IntArray, q: float, key0: int, key1: int,
               check_order: bool = ..., max_start_time: int = ..., progress: ProgressHook = ...,
               rule: Optional[dict] = ...) -> Tuple[IntArray, dict]: ...
    @staticmethod
    def generic_chain(model: engine.HeightModel, start: IntArray, min_height: int, max_height: int, q: float,
                      key0: int, key1: int, time: int = ..., rule: Optional[dict] = ...) -> ForwardChain: ...
    @staticmethod
    def check_monotone(model: engine.HeightModel, q: float, rule: Optional[dict], sites: npt.ArrayLike,
                       window: int, test_bits: npt.NDArray[np.uint64], progress: ProgressHook = ...) -> dict: ...
    @staticmethod
    def connected_components(n: int, a: npt.ArrayLike, b: npt.ArrayLike) -> npt.NDArray[np.int64]: ...
    @staticmethod
    def integrate_heights(values: npt.ArrayLike, known: npt.ArrayLike, tails: npt.ArrayLike, heads: npt.ArrayLike,
                          deltas: npt.ArrayLike) -> npt.NDArray[np.int64]: ...
    @staticmethod
    def all_configurations(model: engine.HeightModel, cap: int) -> IntArray: ...
    @staticmethod
    def heat_bath_draws(lo: int, hi: int, step: int, q: float, min_height: int, max_height: int,
                        bits: npt.NDArray[np.uint64]) -> IntArray: ...

class lozenge:
    @staticmethod
    def box_sample(a: int, b: int, c: int, q: float, key0: int, key1: int, check_order: bool = ...,
                   max_start_time: int = ..., progress: ProgressHook = ..., threads: int = ...) -> Tuple[IntArray, dict]: ...
    @staticmethod
    def box_chain(a: int, b: int, c: int, q: float, key0: int, key1: int, start: IntArray,
                  time: int = ...) -> ForwardChain: ...
    @staticmethod
    def box_cells(a: int, b: int, c: int, padded: IntArray) -> IntArray: ...
    @staticmethod
    def point_sample(rows: int, columns: int, shift: int, runs: IntArray, least: IntArray, greatest: IntArray,
                     key0: int, key1: int, check_order: bool = ..., max_start_time: int = ...,
                     progress: ProgressHook = ..., threads: int = ...) -> Tuple[IntArray, dict]: ...
    @staticmethod
    def column_sample(rows: int, columns: int, runs: IntArray, least: IntArray, greatest: IntArray, q: float,
                      key0: int, key1: int, check_order: bool = ..., max_start_time: int = ...,
                      progress: ProgressHook = ..., threads: int = ...) -> Tuple[IntArray, dict]: ...

class domino:
    class CornerLayout:
        def __init__(self, rows: int, columns: int, runs: npt.ArrayLike) -> None: ...
        @property
        def n_sites(self) -> int: ...

    @staticmethod
    def corner_sample(layout: domino.CornerLayout, least: IntArray, greatest: IntArray, rule: Optional[dict],
                      key0: int, key1: int, check_order: bool = ..., max_start_time: int = ...,
                      progress: ProgressHook = ..., threads: int = ...) -> Tuple[IntArray, dict]: ...
    @staticmethod
    def corner_chain(layout: domino.CornerLayout, start: IntArray, rule: Optional[dict], key0: int, key1: int,
                     time: int = ...) -> ForwardChain: ...
    @staticmethod
    def aztec_shuffle(n: int, horizontal: Optional[npt.ArrayLike] = ..., vertical: Optional[npt.ArrayLike] = ...,
                      key0: int = ..., key1: int = ..., progress: ProgressHook = ...,
                      segment_orders: int = ..., memory_limit: float = ...) -> IntArray: ...

class square_ice:
    @staticmethod
    def ice_sample(n: int, table: npt.ArrayLike, least: IntArray, greatest: IntArray, key0: int,
                   key1: int, check_order: bool = ..., max_start_time: int = ...,
                   progress: ProgressHook = ..., threads: int = ...) -> Tuple[IntArray, dict]: ...
    @staticmethod
    def ice_chain(n: int, table: npt.ArrayLike, start: IntArray, key0: int, key1: int,
                  time: int = ...) -> ForwardChain: ...
