"""A source declared in one field of the run card: ``panel 208Y/120 225A main 200A``,
``480Y/277; switchboard 400A``, ``xfmr 208Y/120 75kVA``.

The field takes, in any order, separated by spaces, commas or semicolons: the kind (``panel``,
the default; ``switchboard`` or ``swbd``; ``transformer``, ``xfmr`` or ``xf``), the system (as
``gaugewalk.model.engine.circuits.parse_system`` reads it; for a transformer its secondary), the
bus rating in amperes (``225A``, NEC 408.30), the main device's (``main 200A``; ``mlo``: main
lugs only, NEC 408.36), a transformer's rating (``75kVA``, which alone makes the source a
transformer) and ``nonlinear`` or ``linear`` for its loads (NEC 310.15(E)(3); left out: the job's
setting). A panel or switchboard whose system is left out has the system of the source
feeding it; a transformer changes the system, so its secondary is always written. Anything
else is refused with a sentence that names it and repeats the grammar (``GRAMMAR``).

Public API: ``GRAMMAR``, ``ORDER``, ``EXAMPLE``, ``read_source_text(text, fed_system=None) ->
dict``, ``new_source_from(source_id, text, fed_system=None) -> Source``.
"""

from __future__ import annotations

import re

from gaugewalk.model.walk.job import Source

KIND_WORDS = {
    "panel": "panel", "transformer": "transformer", "xfmr": "transformer", "xf": "transformer",
    "switchboard": "switchboard", "swbd": "switchboard",
}
"""The words for a kind of source the field takes, and the kind each names."""
ORDER = "kind system amps main kVA nonlinear, any order"
GRAMMAR = f"{ORDER}: panel 208Y/120 225A main 200A, xfmr 208Y/120 75kVA"
"""The field's grammar in one line, for its hint (``ORDER`` in its refusals)."""
EXAMPLE = "208Y/120 225A"

_AMPS = re.compile(r"^(\d+)\s*a(?:mps?)?$")
_KVA = re.compile(r"^(\d+(?:\.\d+)?)\s*kva$")
_SEPARATORS = re.compile(r"[\s,;]+")
# "225 A", "75 kVA": the number and its unit belong together
_NUMBER_UNIT = re.compile(r"(?<=\d)\s+(?=(?:a|amps?|kva)\b)", re.IGNORECASE)


def read_source_text(text: str, fed_system: str | None = None) -> dict:
    """The field read into a source's fields (``kind``, ``system``, and ``rating_a`` or
    ``kva`` where given); ``fed_system``: the system of the source the run starts at, a panel's
    or switchboard's when the text gives none. Raises ValueError with a sentence naming what is
    wrong."""
    from gaugewalk.model.engine.circuits import CircuitError, parse_system

    words = [w for w in _SEPARATORS.split(_NUMBER_UNIT.sub("", text.strip())) if w]
    found: dict = {}
    system_words: list[str] = []

    def once(key: str, value, word: str, what: str) -> None:
        if key in found:
            raise ValueError(f"two {what}s, {found[key][1]} and {word} ({ORDER})")
        found[key] = (value, word)

    words.reverse()
    while words:
        word = words.pop()
        low = word.lower()
        if low == "main":
            amps = _AMPS.match(words[-1].lower()) if words else None
            if amps is None:
                raise ValueError(f"give the main's rating after 'main', e.g. main 200A ({ORDER})")
            once("main_a", int(amps.group(1)), f"main {words.pop()}", "main")
        elif low == "mlo":
            once("main_a", None, word, "main")
        elif low in ("nonlinear", "linear"):
            once("nonlinear_loads", low == "nonlinear", word, "load character")
        elif low in KIND_WORDS:
            once("kind", KIND_WORDS[low], word, "kind")
        elif m := _AMPS.match(low):
            once("rating_a", int(m.group(1)), word, "rating")
        elif m := _KVA.match(low):
            once("kva", float(m.group(1)), word, "kVA rating")
        else:
            system_words.append(word)
    out = {key: value for key, (value, _) in found.items() if value is not None}
    out.setdefault("kind", "transformer" if "kva" in out else "panel")
    if not system_words:
        if fed_system is None or out["kind"] == "transformer":
            what = "the secondary system" if out["kind"] == "transformer" else "the system"
            raise ValueError(f"give {what} ({ORDER}), e.g. {EXAMPLE}")
        out["system"] = fed_system  # a panel or switchboard on the system that feeds it
        return out
    said = " ".join(system_words)
    try:
        system = parse_system(said)
    except CircuitError as exc:
        if "not a supply system" not in str(exc):
            raise ValueError(str(exc)) from None  # incomplete or ambiguous: it says which
        raise ValueError(f"'{said}' is not a system or a word of {ORDER} "
                         "(systems: 208Y/120, 480Y/277, 120/240...)") from None
    out["system"] = system
    if "kva" in out and out["kind"] != "transformer":
        raise ValueError(f"a kVA rating is a transformer's; write xfmr {system} "
                         f"{found['kva'][1]}")
    return out


def new_source_from(source_id: str, text: str, fed_system: str | None = None) -> Source:
    """The source ``source_id`` the field declares (``fed_system``: as ``read_source_text``).
    Raises ValueError with a sentence."""
    fields = read_source_text(text, fed_system)
    try:
        return Source(id=source_id, **fields)
    except Exception as exc:  # pydantic: a rating out of range, an id it refuses
        raise ValueError(_first_error(exc)) from None


def _first_error(exc: Exception) -> str:
    errors = getattr(exc, "errors", None)
    if callable(errors):
        try:
            first = errors()[0]
            where = ".".join(str(x) for x in first.get("loc", ()))
            words = {"rating_a": "the rating [A]", "main_a": "the main [A]",
                     "kva": "the kVA rating", "id": "the id"}
            said = str(first.get("msg", exc)).removeprefix("Value error, ")
            return f"{words.get(where, where)}: {said}" if where else said
        except Exception:
            pass
    return str(exc)
