"""Other spellings of catalogue names: US spellings and trade words, in one place.

Every catalogue lookup (insulation and wall materials, finishes) normalises both the name
the user wrote and the catalogue's own names with :func:`canonical_words`, so
``"aluminum, oxidized"``, ``"galvanized steel"``, ``"fiberglass"`` and ``"ASJ"`` find the
same entries as ``"aluminium, oxidised"``, ``"galvanised steel"``, ``"glass wool"`` and
``"paper facing"``.  Only generic words are listed (US/UK spelling pairs and common trade
names of material types), never a product or brand name.

To add an alias, add a pair to :data:`SPELLINGS` (one word for another) or :data:`TRADE_WORDS`
(a phrase for the catalogue's phrase); the test in ``tests/test_units.py`` walks them.
"""

from __future__ import annotations

import functools
import re

__all__ = ["SPELLINGS", "TRADE_WORDS", "canonical_words"]

#: US (or variant) spelling -> the catalogue's (British) spelling, whole words only.
SPELLINGS: dict[str, str] = {
    "aluminum": "aluminium",
    "oxidized": "oxidised",
    "galvanized": "galvanised",
    "color": "colour",
    "colored": "coloured",
    "fiber": "fibre",
    "gage": "gauge",
    "vulcanized": "vulcanised",
}

#: Trade words -> the catalogue's words (lower case, words separated by single spaces).
#: ASJ, the all-service jacket, is a white kraft-paper laminate: its outer surface is paper.
TRADE_WORDS: dict[str, str] = {
    "fiberglass": "glass wool",
    "fibreglass": "glass wool",
    "glass fibre": "glass wool",
    "rock wool": "mineral wool",
    "stone wool": "mineral wool",
    "mineral fibre": "mineral wool",
    "calsil": "calcium silicate",
    "cal sil": "calcium silicate",
    "polyiso": "polyisocyanurate foam",
    "pir foam": "polyisocyanurate foam",
    "pir": "polyisocyanurate foam",
    "pe foam": "polyethylene foam",
    "perlite": "expanded perlite",
    "asj": "paper facing",
    "all service jacket": "paper facing",
}


@functools.cache
def _pattern() -> re.Pattern:
    phrases = sorted(TRADE_WORDS, key=len, reverse=True)
    return re.compile(r"(?<![\w])(" + "|".join(re.escape(p) for p in phrases) + r")(?![\w])")


def canonical_words(text: str) -> str:
    """*text* in lower case with spaces, underscores, hyphens and commas as single spaces,
    US spellings and trade words replaced by the catalogue's words.

    Examples
    --------
    >>> canonical_words("Aluminum, oxidized")
    'aluminium oxidised'
    >>> canonical_words("Fiberglass pipe section")
    'glass wool pipe section'
    >>> canonical_words("ASJ")
    'paper facing'
    >>> canonical_words("galvanized-steel_new")
    'galvanised steel new'
    """
    words = re.sub(r"[\s_\-,]+", " ", str(text).strip().lower()).strip()
    words = " ".join(SPELLINGS.get(w, w) for w in words.split(" "))
    words = _pattern().sub(lambda m: TRADE_WORDS[m.group(1)], words)
    # a trade word may already carry the catalogue's next word ("polyiso foam")
    return re.sub(r"\b(\w+) \1\b", r"\1", words)
