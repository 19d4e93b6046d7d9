"""The one error type for impossible input, and the problems it carries.

Every problem names the key path in the case (``segment[2].diameter``), what was
wrong and how to fix it. Several problems can travel together so that a user
sees everything wrong with a file at once.
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass


@dataclass(frozen=True)
class Problem:
    """One thing wrong with the input, with the key it concerns."""

    key: str
    message: str

    def __str__(self) -> str:
        return f"{self.key}: {self.message}" if self.key else self.message


class CaseError(ValueError):
    """Input that cannot be computed: one or more problems, each naming its key.

    Parameters
    ----------
    problems
        A message, a `Problem`, or several problems.
    key
        The key path, when `problems` is a plain message.
    """

    def __init__(self, problems: str | Problem | Iterable[Problem], key: str = "") -> None:
        if isinstance(problems, str):
            items: tuple[Problem, ...] = (Problem(key, problems),)
        elif isinstance(problems, Problem):
            items = (problems,)
        else:
            items = tuple(problems)
        self.problems = items
        super().__init__("\n".join(str(p) for p in items))


class Problems:
    """Collects problems while a case is read, so all are reported at once."""

    def __init__(self) -> None:
        self.items: list[Problem] = []

    def add(self, key: str, message: str) -> None:
        self.items.append(Problem(key, message))

    def extend(self, error: CaseError) -> None:
        self.items.extend(error.problems)

    def __bool__(self) -> bool:
        return bool(self.items)

    def raise_if_any(self) -> None:
        if self.items:
            raise CaseError(self.items)


def nearest_names(name: object, names: Iterable[str], count: int = 3) -> list[str]:
    """Known names closest to `name`: those containing it first, then by similarity."""
    from difflib import get_close_matches

    text = str(name).lower()
    known = list(names)
    containing = [n for n in known if text and text in n]
    similar = get_close_matches(text, known, n=count, cutoff=0.5)
    return list(dict.fromkeys(containing + similar))[:count]


def did_you_mean(name: object, names: Iterable[str]) -> str:
    """ "did you mean 'a' or 'b'? " (with the trailing space), or "" when nothing is close."""
    close = nearest_names(name, names)
    return f"did you mean {' or '.join(repr(c) for c in close)}? " if close else ""
