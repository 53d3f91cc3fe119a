"""How runs are shown: the run sheet's columns and rows, and the one-run detail lines."""

from __future__ import annotations

import math
from functools import lru_cache

from gaugewalk.model.engine.circuits import CircuitError, resolve_circuit
from gaugewalk.model.engine.contract import RunResult
from gaugewalk.model.session.card_form import circuit_words
from gaugewalk.model.session.session import (
    STATUS_AMPS,
    STATUS_DROP,
    STATUS_ERROR,
    STATUS_OK,
    STATUS_TOTAL,
    WalkSession,
    fmt_ft,
)
from gaugewalk.model.walk.checks import connection_of, default_connection
from gaugewalk.model.walk.equipment import load_short
from gaugewalk.model.walk.job import Run
from gaugewalk.model.walk.plausible import long_length
from gaugewalk.tables.conductor.ampacity import rooftop_words
from gaugewalk.tables.conductor.sizes import size_index
from gaugewalk.tables.equipment.horsepower import hp_text
from gaugewalk.tui.app.sheet.shape import SheetRow


def load_text(run: Run, fed: str | None = None) -> str:
    """The load column: the load as given, or for a feeder the kind of source it feeds
    (``fed``: panel, switchboard, transformer)."""
    if run.load is None:
        return fed or "panel"
    load = run.load
    if load.value is None:
        return load_short(load)  # a nameplate alone: "MCA 28 A"
    if load.unit == "hp":
        return f"{hp_text(load.value)}hp"
    return f"{load.value:g}{load.unit}"


def size_text(res: RunResult | None) -> str:
    if res is None:
        return "—"
    size = res.size.replace(" kcmil", "k")
    mat = "Al" if res.material == "al" else "Cu"
    lead = f"{res.sets}×" if res.sets > 1 else ""
    return f"{lead}{size} {mat}"


SHEET_STATUS = {
    STATUS_OK: "✓ ok", STATUS_DROP: "▲ drop", STATUS_TOTAL: "▲ total", STATUS_AMPS: "✗ amps",
    STATUS_ERROR: "✗ unsized",
}
"""The status column's short words (the detail line under the sheet gives the full ones)."""


@lru_cache(maxsize=256)
def _circuit(system: str, connection: str) -> tuple[str, tuple[float, int]]:
    """The circuit column: voltage and poles (``120V 1P``), and its sort value."""
    try:
        c = resolve_circuit(system, connection)
    except CircuitError:
        return "?", (0.0, 0)
    return f"{c.volts:g}V {c.hots}P", (c.volts, c.hots)


def source_kinds(session: WalkSession) -> dict[str, tuple[str, str]]:
    """Each source's system and kind, looked up once for a whole sheet."""
    return {s.id: (s.system, s.kind) for s in session.job.sources}


def circuit_cell(run: Run, sources: dict[str, tuple[str, str]]) -> tuple[str, tuple[float, int] | None]:
    """The run's circuit column and its sort value; a run naming no circuit takes its
    source's default (``default_connection``)."""
    source = sources.get(run.from_)
    if source is None:
        return "—", None
    conn = run.connection
    if conn is None:
        to = sources.get(run.to)
        conn = default_connection(source[0], to is not None and to[1] == "transformer")
    return _circuit(source[0], conn)


def _circuit_words(session: WalkSession, run: Run) -> str:
    """The run's circuit in words (``120 V, 1 pole and neutral``), or "" when unknown."""
    source = session.job.source(run.from_)
    conn = connection_of(session.job, run)
    if source is None or conn is None:
        return ""
    try:
        return circuit_words(resolve_circuit(source.system, conn))
    except CircuitError:
        return ""


def pct4(value: float | None) -> str:
    """A percentage in at most four characters: ``2.10``, ``12.3``, ``123``."""
    if value is None or not math.isfinite(value):
        return "—"
    if value < 9.995:
        return f"{value:.2f}"
    if value < 99.95:
        return f"{value:.1f}"
    return f"{value:.0f}" if value < 999.5 else ">999"


def sheet_size_text(res: RunResult | None) -> str:
    """The size column: ``12 Cu``, ``2/0 Al``, ``2×250k Cu`` (the detail line says AWG)."""
    return size_text(res).replace(" AWG", "")


def sheet_row(session: WalkSession, run: Run, sources: dict[str, tuple[str, str]] | None = None) -> SheetRow:
    res = session.result_for(run.id)
    st = session.status(run, res)
    sources = sources if sources is not None else source_kinds(session)
    circuit, circuit_sort = circuit_cell(run, sources)
    fed = sources.get(run.to)
    load = load_text(run, fed[1] if fed is not None else None)
    cells = (
        run.id,
        run.from_,
        run.to,
        fmt_ft(run.length_ft),
        load,
        circuit,
        f"{res.ocpd_a}A" if res else "—",
        sheet_size_text(res),
        pct4(res.voltage_drop_pct) if res else "—",
        pct4(res.total_drop_pct) if res else "—",
        SHEET_STATUS.get(st.words, st.words),
    )
    search = " ".join((run.id, run.from_, run.to, run.length, load, circuit, cells[7],
                       st.words, run.notes)).lower()
    sort = {
        "id": _natural(run.id),
        "from": run.from_.lower(),
        "to": run.to.lower(),
        "feet": run.length_ft,
        "load": (res.amps if res else None),
        "circuit": circuit_sort,
        "device": (res.ocpd_a if res else None),
        "size": (_size_rank(res) if res else None),
        "drop": (res.voltage_drop_pct if res else None),
        "total": (res.total_drop_pct if res else None),
        "status": (0 if st.flag else 1),
    }
    return SheetRow(run.id, cells, st.flag, sort, search, run.from_)


def _size_rank(res: RunResult) -> float:
    try:
        return size_index(res.size) + 100 * (res.sets - 1)
    except Exception:  # a size name the table does not know sorts last
        return 1e9


def _natural(text: str) -> str:
    """Sort key that puts R2 before R10."""
    out = []
    num = ""
    for ch in text:
        if ch.isdigit():
            num += ch
        else:
            if num:
                out.append(num.zfill(8))
                num = ""
            out.append(ch.lower())
    if num:
        out.append(num.zfill(8))
    return "".join(out)


def all_rows(session: WalkSession) -> list[SheetRow]:
    sources = source_kinds(session)
    return [sheet_row(session, r, sources) for r in session.job.runs]


def changed_rows(session: WalkSession, run_ids: set[str]) -> list[SheetRow]:
    """The rows of the runs ``run_ids`` (those of them still in the walk), as ``all_rows``
    makes them."""
    sources = source_kinds(session)
    runs = (session.job.run(rid) for rid in run_ids)
    return [sheet_row(session, r, sources) for r in runs if r is not None]


def detail_lines(session: WalkSession, run: Run | None) -> str:
    """Two or three lines about one run, for under the sheet (Rich markup escaped by caller)."""
    if run is None and session.job.runs:
        return "No run matches the filter. Esc clears the filters."
    if run is None:
        return "No run here. Press n to record the first run."
    res = session.result_for(run.id)
    st = session.status(run, res)
    kind = "feeder" if session.job.is_feeder(run) else "branch"
    words = _circuit_words(session, run)
    head = (f"{run.id}  {run.from_} → {run.to}  ({kind}{', ' + words if words else ''})  "
            f"{run.length} = {fmt_ft(run.length_ft)} ft")
    if res is None:
        body = "not sized"
    else:
        own, total = session.targets(run)
        egc = res.egc_size or "no EGC"
        race = f"{res.raceway_size} {res.raceway}" if res.raceway_size else f"{res.raceway}: none fits"
        if run.rooftop:
            race += ", " + rooftop_words(session.job.effective(run, "insulation"))
        body = (
            f"{size_text(res)} · {res.amps:.1f} A · drop {res.voltage_drop_pct:.2f}% "
            f"(≤{own:g}) · total {res.total_drop_pct:.2f}% (≤{total:g}) · by {res.governed_by}"
            f" · EGC {egc} · {race} · {res.ocpd_a} A"
        )
    lines = [head, body]
    said = [f"{st.words}: " + "; ".join(st.problems)] if st.problems else []
    long = long_length(run.length_ft, session.job.defaults)
    if long:  # a warning, never a problem: the third line has room for both
        said.append(f"⚠ {long}")
    feeder = session.result.feeders.get(run.id) if session.result is not None else None
    if feeder is not None and feeder.served_a is not None:  # stated, not a problem
        said.append(f"ⓘ sized for its stated {feeder.amps:.1f} A; the loads on {run.to} need "
                    f"{feeder.served_a:.1f} A (NEC 215.2(A)(1))")
    if said:
        lines.append("; ".join(said))
    return "\n".join(lines)
