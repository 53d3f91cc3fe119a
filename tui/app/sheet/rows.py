"""How runs are shown: the run sheet's columns and rows, and the one-run detail lines."""

from __future__ import annotations

from gaugewalk.model.walk.job import Run
from gaugewalk.model.engine.contract import RunResult
from gaugewalk.tables.conductor.sizes import size_index
from gaugewalk.model.session.session import WalkSession, fmt_ft, fmt_pct
from gaugewalk.tui.app.widgets.runsheet import SheetRow



def load_text(run: Run) -> str:
    if run.load is None:
        return "panel"
    v = run.load.value
    return f"{v:g}{run.load.unit}"


def size_text(res: RunResult | None) -> str:
    if res is None:
        return "—"
    size = res.size.replace(" kcmil", "k")
    mat = "Al" if res.material == "al" else "Cu"
    lead = f"{res.sets}×" if res.sets > 1 else ""
    return f"{lead}{size} {mat}"


def sheet_row(session: WalkSession, run: Run) -> SheetRow:
    res = session.result_for(run.id)
    st = session.status(run, res)
    cells = (
        run.id,
        run.from_,
        run.to,
        fmt_ft(run.length_ft),
        load_text(run),
        size_text(res),
        fmt_pct(res.voltage_drop_pct) if res else "—",
        fmt_pct(res.total_drop_pct) if res else "—",
        st.words,
    )
    search = " ".join((run.id, run.from_, run.to, run.length, load_text(run), cells[5], st.words, run.notes)).lower()
    sort = {
        "id": _natural(run.id),
        "from": run.from_.lower(),
        "to": run.to.lower(),
        "feet": run.length_ft,
        "load": (res.amps if res else None),
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
    return [sheet_row(session, r) for r in session.job.runs]


def detail_lines(session: WalkSession, run: Run | None) -> str:
    """Two or three lines about one run, for under the sheet (Rich markup escaped by caller)."""
    if run is None and session.job.runs:
        return "No run matches the filter. Esc clears the filters."
    if run is None:
        return "No run here. Press n to record the first run."
    res = session.result_for(run.id)
    st = session.status(run, res)
    kind = "feeder" if session.job.is_feeder(run) else "branch"
    head = f"{run.id}  {run.from_} → {run.to}  ({kind})  {run.length} = {fmt_ft(run.length_ft)} ft"
    if res is None:
        body = "not sized"
    else:
        own, total = session.targets(run)
        egc = res.egc_size or "no EGC"
        race = f"{res.raceway_size} {res.raceway}" if res.raceway_size else f"{res.raceway}: none fits"
        body = (
            f"{size_text(res)} · {res.amps:.1f} A · drop {res.voltage_drop_pct:.2f}% "
            f"(≤{own:g}) · total {res.total_drop_pct:.2f}% (≤{total:g}) · by {res.governed_by}"
            f" · EGC {egc} · {race} · {res.ocpd_a} A"
        )
    lines = [head, body]
    if st.problems:
        lines.append(f"{st.words}: " + "; ".join(st.problems))
    return "\n".join(lines)
