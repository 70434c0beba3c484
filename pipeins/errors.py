"""The one exception for bad input, and the warning record that travels with results."""

from __future__ import annotations

import difflib

__all__ = ["InputError", "closest_names", "near_hint", "one_line"]


class InputError(ValueError):
    """Bad input: names the input and says what is allowed.

    The message is one line, written for the person who typed the input, e.g.
    ``--rh: 120 is outside 0 to 100 %``.  The CLI prints it as ``Error: …`` and exits
    with status 2; the library never prints.
    """

    def __init__(self, name: str, message: str):
        self.name = name
        self.message = message
        super().__init__(f"{name}: {message}" if name else message)


def closest_names(word: str, names, n: int = 3) -> str:
    """A hint listing the catalogue names closest to *word*, for an 'unknown name' error.

    >>> closest_names("glas wool", ["glass wool", "mineral wool", "cellular glass"])
    'did you mean "glass wool" or "mineral wool"?'
    """
    names = list(names)
    close = difflib.get_close_matches(word.lower(), [x.lower() for x in names], n=n, cutoff=0.5)
    by_lower = {x.lower(): x for x in names}
    if close:
        return "did you mean " + " or ".join(f'"{by_lower[c]}"' for c in close) + "?"
    shown = ", ".join(names[:12]) + (", …" if len(names) > 12 else "")
    return f"known: {shown}"


def near_hint(word: str, names) -> str:
    """A :func:`~pipeins.errors.closest_names` hint naming only the names about as close as
    the closest one (similarity within 0.1 of the best), so a plain typo gets one suggestion.

    >>> near_hint("glas wool", ["glass wool", "mineral wool"])
    'did you mean "glass wool"?'
    """
    import difflib

    names = list(names)
    word = str(word).lower()
    scores = {n: difflib.SequenceMatcher(None, word, n.lower()).ratio() for n in names}
    best = max(scores.values(), default=0.0)
    near = [n for n in names if scores[n] >= best - 0.1]
    return closest_names(word, near if best >= 0.5 else names)


def one_line(text: str) -> str:
    """*text* safe to print as one line: newlines, tabs and other control characters
    (ESC, NUL, DEL, C1 and Unicode format/separator controls) shown as escapes.

    >>> one_line('unknown pipe "NPS\\n4\\x1b[31m"')
    'unknown pipe "NPS\\\\n4\\\\x1b[31m"'
    """
    import unicodedata

    out = []
    for ch in str(text):
        if ch == "\n":
            out.append("\\n")
        elif ch == "\r":
            out.append("\\r")
        elif ch == "\t":
            out.append("\\t")
        elif unicodedata.category(ch) in ("Cc", "Cf", "Zl", "Zp", "Cs"):
            code = ord(ch)
            out.append(f"\\x{code:02x}" if code < 0x100 else f"\\u{code:04x}")
        else:
            out.append(ch)
    return "".join(out)
