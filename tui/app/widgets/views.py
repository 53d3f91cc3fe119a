"""The supply tree, the footage tally and the boards: the other ways to look at a walk.

The tree goes from each service through feeders, transformers and panels to the branch runs, with
the cumulative drop at every node; it is built only when shown, with the chain of sources open
and each panel's branch runs folded. The footage tally shows the takeoff's conductor feet by
material and size with a bar for each in text blocks (readable without colour), then the takeoff:
the order, the cut lists and a short pull list. The boards show each panel's schedule: its
positions, runs, poles, phase and load per line, from ``gaugewalk.model.report.content`` (the
report's own text), with the sources' ratings and loading above them.
"""

from __future__ import annotations

from rich.text import Text
from textual.widgets import Tree

from gaugewalk.model.session.session import WalkSession, fmt_ft, fmt_pct
from gaugewalk.model.walk.graph import SupplyGraph
from gaugewalk.model.walk.job import Run, Source
from gaugewalk.tui.app.plain import escape
from gaugewalk.tui.app.sheet.rows import size_text

_EIGHTHS = " ▏▎▍▌▋▊▉"


def text_bar(value: float, top: float, width: int) -> str:
    """A bar of ``width`` cells at most, in eighth-cell steps."""
    if top <= 0 or value <= 0:
        return ""
    cells = value / top * width
    full = int(cells)
    rest = int(round((cells - full) * 8))
    if rest == 8:
        full, rest = full + 1, 0
    return "█" * full + (_EIGHTHS[rest] if rest else "")


# ----- supply tree ---------------------------------------------------------------------------
class SupplyTree(Tree):
    """Sources and runs, nested by what feeds what."""

    def __init__(self, **kwargs) -> None:
        super().__init__("walk", **kwargs)
        self.show_root = False
        self.guide_depth = 3
        self.session: WalkSession | None = None
        self.graph: SupplyGraph | None = None

    def build(self, session: WalkSession) -> None:
        self.session = session
        self.graph = SupplyGraph(session.job)
        self.clear()
        tops = self.graph.roots()
        for src in tops:
            node = self.root.add(self._source_label(src, None), data=("source", src.id), expand=False)
            self._fill(node, src.id, depth=0)
        if not tops:
            self.root.add_leaf("No sources yet: the service is declared in the job settings or the walk file.")

    def _fill(self, node, source_id: str, depth: int) -> None:
        graph = self.graph
        assert graph is not None
        runs = graph.children[source_id]
        feeders = [r for r in runs if r.to in graph.sources]
        branches = [r for r in runs if r.to not in graph.sources]
        for r in feeders:
            dest = graph.sources[r.to]
            child = node.add(self._source_label(dest, r), data=("run", r.id), expand=False)
            if depth < 12:
                self._fill(child, dest.id, depth + 1)
        for r in branches:
            node.add_leaf(self._branch_label(r), data=("run", r.id))
        # open the chain of sources; a list of branch runs opens on Enter
        if feeders or not node.parent or node.parent.is_root:
            node.expand()

    def _source_label(self, src: Source, feeder: Run | None) -> Text:
        session = self.session
        assert session is not None
        at = session.source_drop(src.id)
        t = Text()
        t.append(f"{src.id}", style="bold")
        t.append(f" at bus {fmt_pct(at)}%", style="bold")
        t.append(f" · {src.kind} {src.system}")
        if feeder is not None:
            res = session.result_for(feeder.id)
            st = session.status(feeder, res)
            if st.flag:
                t.append(f" · {st.words}", style="bold")
            t.append(f" · via {feeder.id} {fmt_ft(feeder.length_ft)} ft {size_text(res)}")
            if res is not None:
                t.append(f" · run {fmt_pct(res.voltage_drop_pct)}%")
        result = session.result
        if result is not None:
            info = result.transformers.get(src.id)
            loading = result.loadings.get(src.id)
            if info is not None:
                t.append(f" · {info.kva:g} kVA loaded {info.utilisation_pct:.0f}%, "
                         f"drop in it {fmt_pct(info.drop_pct)}%")
            elif loading is not None and loading.utilisation_pct is not None:
                t.append(f" · loaded {loading.utilisation_pct:.0f}% of {loading.limit_a} A "
                         f"(line {loading.line})")
        n = len(self.graph.children[src.id])
        t.append(f" · {n} runs")
        return t

    def _branch_label(self, r: Run) -> Text:
        session = self.session
        assert session is not None
        res = session.result_for(r.id)
        st = session.status(r, res)
        t = Text()
        t.append(f"{r.id}", style="bold")
        if res is not None:
            t.append(f" total {fmt_pct(res.total_drop_pct)}%", style="bold")
        t.append(f" · {st.words}", style="bold" if st.flag else "")
        t.append(f" · {r.to} · {fmt_ft(r.length_ft)} ft {size_text(res)}")
        return t


# ----- footage ---------------------------------------------------------------------------------
#: Runs named per piece and pieces shown per conductor line in the footage view's pull list (the
#: rest counted; ``gaugewalk takeoff`` and the report list them all).
PULL_LIST_RUNS = 6
PULL_LIST_PIECES = 3


def footage_text(session: WalkSession, width: int = 78) -> str:
    """Conductor feet by material and size with a text bar each, then the takeoff: the same
    ``gaugewalk.model.walk.takeoff`` numbers as ``gaugewalk takeoff`` and the report."""
    from gaugewalk.model.walk.takeoff import build_takeoff
    from gaugewalk.tui.cli.takeoff import render_text

    if session.result is None:
        return "Sizing the walk…"
    try:
        takeoff = build_takeoff(session.job, session.result)
    except ValueError as exc:  # TakeoffError and table lookups: say why, never crash
        return "The takeoff cannot be made: " + escape(str(exc))
    d = session.job.defaults
    rows = takeoff.footage_by_size()
    lines = [
        "[b]Conductor feet by material and size[/b]",
        f"(route + {d.slack_per_end_ft:g} ft slack per end) × conductors × sets; "
        f"order adds {d.waste_pct:g}% waste",
        "",
    ]
    if not rows:
        lines.append("No sized runs yet.")
    else:
        top = max(r.net_ft for r in rows)
        bar_w = max(width - 40, 10)
        lines.append(f"{'':3}{'size':<11}{'feet':>9}{'order':>9}")
        for r in rows:
            mat = "Al" if r.material == "al" else "Cu"
            lines.append(
                f"{mat} {escape(r.size):<10} {r.net_ft:>8,.0f} {r.with_waste_ft:>8,} "
                f"{text_bar(r.net_ft, top, bar_w)}"
            )
        total = sum(r.net_ft for r in rows)
        lines.append(f"{'all':<13} {total:>8,.0f} {sum(r.with_waste_ft for r in rows):>8,}")
    route = sum(r.length_ft for r in session.job.runs)
    lines += ["", f"Route length of {len(session.job.runs)} runs: {route:,.0f} ft", "", "─" * 20, ""]
    lines.append(escape(render_text(takeoff, "[Takeoff]", runs_per_piece=PULL_LIST_RUNS,
                                    pieces_per_line=PULL_LIST_PIECES)
                        .replace("[Takeoff]", "Takeoff")))
    return "\n".join(lines)


# ----- boards ----------------------------------------------------------------------------------
def _grid(columns: tuple[str, ...], rows: tuple[tuple[str, ...], ...]) -> list[str]:
    """Columns padded to their widest cell, as plain lines (not yet escaped)."""
    widths = [max([len(c), *(len(r[i]) for r in rows)]) for i, c in enumerate(columns)]
    out = ["  ".join(c.ljust(w) for c, w in zip(columns, widths, strict=True)).rstrip()]
    out += ["  ".join(v.ljust(w) for v, w in zip(r, widths, strict=True)).rstrip() for r in rows]
    return out


def boards_text(session: WalkSession) -> str:
    """The sources with their ratings and loading, then every panel's schedule."""
    from gaugewalk.model.report.content import schedules_of, sources_table_of
    from gaugewalk.model.walk.schedule import drop_basis

    if session.result is None:
        return "Sizing the walk…"
    job, result = session.job, session.result
    lines = ["[b]Sources[/b]", escape(f"Total drop: {drop_basis(job)}."), ""]
    columns, rows = sources_table_of(job, result)
    lines += [escape(x) for x in _grid(columns, rows)]
    for sch in schedules_of(job, result):
        lines += ["", f"[b]{escape(sch.title)}[/b]"]
        lines += [escape(n) for n in sch.notes]
        lines += [escape(x) for x in _grid(sch.columns, sch.rows)]
    lines += ["", "p keeps the positions the tool picked in the walk file (gaugewalk place FILE)"]
    return "\n".join(lines)
