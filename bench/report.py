"""The benchmark's tables: each target's ratio with PASS or MISS, the absolute times beside it only
as what this machine measured, and the cost per run at each size of the scaling run."""

from __future__ import annotations


def _s(seconds: float) -> str:
    if seconds < 0.01:
        return f"{seconds * 1000:.1f} ms"
    return f"{seconds * 1000:.0f} ms" if seconds < 1 else f"{seconds:.2f} s"


def _ms(ms: float) -> str:
    return f"{ms:.1f} ms" if ms < 10 else f"{ms:.0f} ms"


# what this machine measured, for each target: numerator / baseline
DETAIL = {
    "calc_ratio": lambda r: f"{_s(r['calc_s'])} / {_s(r['python_s'])}",
    "check_ratio": lambda r: f"{_s(r['check_s'])} / {_s(r['check_parse_s'])}",
    "open_ratio": lambda r: f"{_ms(r['open_ms'])} / {_ms(r['tomllib_ms'])}",
    "save_ratio": lambda r: f"{_ms(r['save_ms'])} / {_ms(r['tomli_w_ms'])}",
    "recompute_ratio": lambda r: f"{_ms(r['recompute_ms'])} / {_ms(r['tomllib_ms'])}",
    "edit_ratio": lambda r: f"{_ms(r['edit_ms'])} / {_ms(r['tomllib_ms'])}",
    "app_edit_ratio": lambda r: f"{_ms(r['app_edit_ms'])} / {_ms(r['tomllib_ms'])}",
    "stall_frames": lambda r: (f"{_ms(r['edit_stall_ms'])} / 16.7 ms: open card "
                               f"{_ms(r['open_stall_ms'])}, type {_ms(r['typing_stall_ms'])}, "
                               f"store {_ms(r['store_stall_ms'])}"),
    "start_ratio": lambda r: f"{_s(r['start_s'])} / {_s(r['bare_start_s'])}",
    "start_sized_ratio": lambda r: f"{_s(r['start_sized_s'])} / {_s(r['bare_start_s'])}",
    "sized_ratio": lambda r: f"{_s(r['sized_paint_s'])} / {_s(r['first_paint_s'])}",
    "worst_key_ms": lambda r: (f"scroll {_ms(r['worst_scroll_ms'])}, filter "
                               f"{_ms(r['worst_filter_ms'])}, open card {_ms(r['worst_card_ms'])}, "
                               f"type {_ms(r['worst_typing_ms'])}"),
    "peak_mb": lambda r: (f"app {r['app_rss_mb']:.0f} MB, " if "app_rss_mb" in r else "")
                         + (f"its head start {r['head_start_rss_mb']:.0f} MB, "
                            if r.get("head_start_rss_mb") else "")
                         + f"model only {r['model_rss_mb']:.0f} MB "
                         + f"(traced {r['traced_peak_mb']:.0f} MB)",
}


def _value(key: str, value: float) -> str:
    if key.endswith("_ms"):
        return f"{value:.0f} ms"
    if key.endswith("_mb"):
        return f"{value:.0f} MB"
    return f"{value:.3f}x" if value < 0.1 else f"{value:.2f}x"


def _limit(key: str, limit: float) -> str:
    if key.endswith("_ms"):
        return f"<= {limit:g} ms"
    if key.endswith("_mb"):
        return f"<= {limit:g} MB"
    return f"<= {limit:g}x"


def table(r: dict, targets) -> str:
    """One line per target measured: figure, ratio, target, PASS/MISS, this machine's times."""
    n = r["runs"]
    head = (f"{n:,} runs (targets at 5,000)", "ratio", "target", "", "on this machine")
    rows = []
    for t in targets:
        if t.key not in r:
            continue
        value = r[t.key]
        rows.append((t.figure.replace("N runs", f"{n:,} runs"), _value(t.key, value),
                     _limit(t.key, t.limit), "PASS" if value <= t.limit else "MISS",
                     DETAIL[t.key](r)))
    widths = [max(len(row[i]) for row in rows + [head]) for i in range(5)]
    lines = ["  ".join(c.ljust(w) for c, w in zip(head, widths, strict=True)).rstrip(),
             "  ".join("-" * w for w in widths)]
    lines += ["  ".join(c.ljust(w) for c, w in zip(row, widths, strict=True)).rstrip()
              for row in rows]
    missed = [t.key for t in targets if t.key in r and r[t.key] > t.limit]
    lines.append(f"{len(rows) - len(missed)} of {len(rows)} targets met"
                 + (f"; MISS: {', '.join(missed)}" if missed else ""))
    info = [
        f"one-run edit median {_ms(r['edit_median_ms'])}; incremental result equals a full "
        f"recompute: {'yes' if r['edit_matches_full'] else 'NO'}",
        f"put_run with its save to disk {_ms(r['put_run_saved_ms'])}; every sheet row rebuilt "
        f"{_ms(r['sheet_rows_ms'])}; save_walk {_ms(r['save_file_ms'])}; footage view "
        f"{_ms(r['footage_ms'])}",
    ]
    if "pydantic_floor_s" in r:
        info.append(
            f"pydantic imported and one model built, a process: "
            f"{r['pydantic_floor_s'] / r['check_parse_s']:.2f}x the check baseline "
            f"({_s(r['pydantic_floor_s'])}), the part of check's ratio before any code of ours")
    if "walk_model_s" in r:
        info.append(
            f"the walk model imported (its pydantic classes built), a process: "
            f"{r['walk_model_s'] / r['check_parse_s']:.2f}x the check baseline "
            f"({_s(r['walk_model_s'])}), what check pays before it reads the walk")
    if "check_instructions" in r:
        info.append(
            f"instructions under valgrind (independent of the load): check "
            f"{r['check_instructions'] / 1e6:,.0f} M, a process only parsing it "
            f"{r['parse_instructions'] / 1e6:,.0f} M: "
            f"{r['check_instructions'] / r['parse_instructions']:.2f}x")
    if "app_edit_ms" in r:
        info.append(
            f"app store step median {_ms(r['app_edit_median_ms'])}, "
            f"worst {_ms(r['app_edit_worst_ms'])}; "
            f"longest stall in the worst cycle {_ms(r['edit_stall_worst_ms'])}; "
            f"stalls over a frame (1/60 s) in all: {r['frames_dropped']}")
    return "\n".join(lines) + "\nfor information (this machine): " + "\n  ".join(info)


BASELINES = ("tomllib_ms", "tomli_w_ms")


def scaling_table(results: list[dict], slack: float,
                  ref_runs: int = 5000) -> tuple[str, dict]:
    """Cost per run at each size; PASS when the cost per run at the largest size is at most
    ``slack`` times that at ``ref_runs`` runs."""
    sizes = [r["runs"] for r in results]
    ref = sizes.index(ref_runs)
    lines = ["figure (this machine)" + "".join(f"{n:>12,}" for n in sizes)
             + f"   per run at each size              largest / {ref_runs:,}"]
    verdicts = {}
    for key in ("open_ms", "tomllib_ms", "recompute_ms", "save_ms", "tomli_w_ms", "edit_ms",
                "app_edit_ms", "first_paint_s", "sized_paint_s", "peak_mb"):
        if not all(key in r for r in results):
            continue
        vals = [r[key] for r in results]
        unit = "s" if key.endswith("_s") else ("MB" if key.endswith("_mb") else "ms")
        per = [v / n * (1e6 if unit == "s" else 1e3) for v, n in zip(vals, sizes, strict=True)]
        per_unit = "kB" if unit == "MB" else "us"
        growth = per[-1] / per[ref]
        if key in BASELINES:  # measured for the ratios; their growth is the machine's and Python's
            verdict = f"{growth:.2f}x (baseline)"
        else:
            verdicts[key] = growth <= slack
            verdict = f"{growth:.2f}x <= {slack:g}x {'PASS' if verdicts[key] else 'MISS'}"
        shown = [_s(v) if unit == "s" else _s(v / 1000) if unit == "ms" else f"{v:.0f} MB"
                 for v in vals]
        lines.append(f"{key:<21}" + "".join(f"{v:>12}" for v in shown)
                     + "   " + (" / ".join(f"{p:.3g}" for p in per) + f" {per_unit}").ljust(35)
                     + verdict)
    return "\n".join(lines), verdicts
