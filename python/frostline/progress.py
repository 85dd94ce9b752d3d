"""Progress lines on stderr for long runs (the engine calls back about every 10^8 updates)."""
from __future__ import annotations

import sys
import time
from contextlib import contextmanager
from contextvars import ContextVar
from typing import Callable, Iterator, Optional, TextIO

#: where long exact computations (determinants) report (stage, done, total); None: nowhere
_EXACT_HOOK: ContextVar[Optional[Callable[[str, int, int], None]]] = ContextVar("frostline_exact_hook", default=None)


@contextmanager
def exact_progress(hook: Callable[[str, int, int], None]) -> Iterator[None]:
    """Within the block, long exact computations call ``hook(stage, done, total)`` as they go."""
    token = _EXACT_HOOK.set(hook)
    try:
        yield
    finally:
        _EXACT_HOOK.reset(token)


def report(stage: str, done: int, total: int) -> None:
    """Report progress of an exact computation to the hook of :func:`exact_progress`, if any."""
    hook = _EXACT_HOOK.get()
    if hook is not None:
        hook(stage, done, total)


class StderrProgress:
    """A progress hook: ``stage: start time T, N site updates, S s elapsed`` on one updating line.

    Quiet for the first ``after`` seconds so short runs print nothing, then at
    most one line every ``every`` seconds.
    """

    def __init__(self, stage: str, stream: Optional[TextIO] = None, after: float = 1.0,
                 every: Optional[float] = None):
        self.stage = stage
        self.stream = stream or sys.stderr
        self.after = after
        # a terminal line updates in place; a log file gets a line every 5 s
        self.every = every if every is not None else (0.5 if self.stream.isatty() else 5.0)
        self._last = -1.0
        self._printed = False
        self._began = time.perf_counter()

    def note(self, stage: str) -> None:
        """Announce a new stage (printed only when the run has become long)."""
        self.stage = stage
        if time.perf_counter() - self._began >= self.after:
            self._emit(f"{stage} ...")

    def __call__(self, start_time: int, site_updates: int, seconds: float) -> None:
        now = time.perf_counter()
        if now - self._began < self.after or now - self._last < self.every:
            return
        self._last = now
        self._emit(f"{self.stage}: start time {start_time} sweeps back, {site_updates:.3g} site updates, "
                   f"{now - self._began:.1f} s elapsed")

    def exact(self, stage: str, done: int, total: int) -> None:
        """A hook for :func:`exact_progress`: ``stage: done of total, S s elapsed``."""
        now = time.perf_counter()
        if now - self._began < self.after or now - self._last < self.every:
            return
        self._last = now
        self._emit(f"{stage}: {done} of {total}, {now - self._began:.1f} s elapsed")

    def _emit(self, text: str) -> None:
        end = "\r" if self.stream.isatty() else "\n"
        print(text.ljust(78), end=end, file=self.stream, flush=True)
        self._printed = True

    def finish(self) -> None:
        """End the progress line (if one was printed)."""
        if self._printed and self.stream.isatty():
            print(file=self.stream)
