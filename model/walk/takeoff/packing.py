"""Cut lists: each run's conductor cuts packed into the boxes and reels the job buys.

A group is one conductor line (material, insulation, size, function, colour); its cuts are one per
run and parallel set [ft]. They are packed into *pieces*: put-ups (boxes, reels) of the lengths
listed for the size, and, where the supplier cuts the size to length (``CUT_SIZES`` in
``gaugewalk.tables.order.putups``), one piece cut to length for a remainder shorter than the
shortest put-up (a reel is not bought for less than it holds). A cut longer than every put-up is
a piece cut to length of its own. The packing leaves the least offcut it finds, then the fewest
pieces.

Bin packing with a choice of bin lengths is NP-hard, so the search is bounded and says so:

1. A first answer: best-fit decreasing (each cut, longest first, onto the fullest piece that
   still holds it) into the longest put-up, each piece then shortened to the shortest put-up
   that holds what is on it, the emptiest pieces moved to the cut-to-length piece where allowed.
2. Choices of put-ups (how many of each length) whose offcut could beat it, fewest offcut first,
   each filled by best-fit decreasing; a group of at most ``EXACT_MAX_CUTS`` cuts is filled by an
   exact search (every placement, equal gaps tried once) within ``EXACT_NODE_BUDGET`` steps.
   A group of more than ``TAIL_MAX_CUTS`` cuts keeps the fullest pieces of the first answer and
   searches again only its emptiest pieces, where the offcut is. The work per group is bounded
   (``WORK_BUDGET`` placements), and the answer says when a limit cut the search short.

Lower bounds shown beside the answer: the fewest pieces any packing could use, the Martello-Toth
bound L2 for bins of the longest put-up (S. Martello, P. Toth, *Knapsack Problems*, 1990, ch. 8),
which is never below ceil(total / longest put-up); and the least offcut, from the fewest feet of
put-ups that cover the total as if it were one length (``order_putups``).
"""

from __future__ import annotations

import bisect
import itertools
import math
from dataclasses import dataclass
from typing import Sequence

from gaugewalk.model.walk.takeoff.lines import Cut, Piece, PutUpCount
from gaugewalk.tables.order.putups import CUT_LABEL, PutUp

#: Groups with at most this many cuts get the exact search.
EXACT_MAX_CUTS = 10
#: Steps (placements tried) the exact search may take per choice of put-ups.
EXACT_NODE_BUDGET = 20_000
#: A larger group keeps its fullest pieces from the first answer and searches again only the
#: emptiest pieces (at least one) and the cut-to-length piece, up to this many cuts.
TAIL_MAX_CUTS = 60
#: Placements best-fit decreasing may make per group, over every choice of put-ups it tries.
WORK_BUDGET = 20_000
#: Most choices of put-ups listed per group.
MAX_CHOICES = 4_000


@dataclass(frozen=True)
class Packing:
    """The pieces one group is ordered in, with the lower bounds beside them."""

    pieces: tuple[Piece, ...]
    lower_bound_count: int          # fewest pieces any packing could use
    lower_bound_offcut_ft: int      # [ft] least offcut any packing could leave
    method: str                     # how the packing was found
    too_long: tuple[Cut, ...] = ()  # cuts longer than every put-up (each cut to length)

    @property
    def offcut_ft(self) -> int:
        return sum(p.offcut_ft for p in self.pieces)

    def order(self) -> tuple[PutUpCount, ...]:
        """The pieces counted per put-up, longest first; each cut-to-length piece its own line."""
        counts: dict[tuple[str, int], list[int]] = {}
        cut: list[PutUpCount] = []
        for p in self.pieces:
            if p.cut_to_length:
                cut.append(PutUpCount(CUT_LABEL, p.length_ft, 1, 0))
            else:
                entry = counts.setdefault((p.label, p.length_ft), [0, 0])
                entry[0] += 1
                entry[1] += p.offcut_ft
        lines = [PutUpCount(label, length, n, offcut)
                 for (label, length), (n, offcut) in counts.items()]
        lines.sort(key=lambda u: -u.length_ft)
        return tuple(lines) + tuple(cut)


# --------------------------------------------------------------------------------------------
# Put-ups for one length (the fluid bound)


def order_putups(need_ft: int, putups: Sequence[PutUp]) -> tuple[tuple[PutUpCount, ...], int]:
    """Put-ups covering ``need_ft`` [ft] with the least left over, then the fewest pieces, as if
    the need were one length that could be cut anywhere (a lower bound for a cut list).

    Returns the counts (largest put-up first, zero counts left out) and the total ordered [ft].
    No put-ups: nothing to count, the need is cut to length. Exact: in a best order each shorter
    put-up appears fewer than lcm(its length, longest length) / its length times, since that many
    could be swapped for fewer longest put-ups of the same total.
    """
    if need_ft <= 0:
        return (), 0
    usable = sorted({p.length_ft: p for p in putups}.values(), key=lambda p: p.length_ft)
    if not usable:
        return (), need_ft
    longest = usable[-1]
    shorter = usable[:-1]
    bounds = [
        range(min(math.ceil(need_ft / p.length_ft),
                  math.lcm(p.length_ft, longest.length_ft) // p.length_ft - 1, 50) + 1)
        for p in shorter
    ]
    best: tuple | None = None
    for counts in itertools.product(*bounds):
        got = sum(c * p.length_ft for c, p in zip(counts, shorter, strict=True))
        n_long = max(0, math.ceil((need_ft - got) / longest.length_ft))
        total = got + n_long * longest.length_ft
        key = (total - need_ft, sum(counts) + n_long, tuple(reversed(counts)))
        if best is None or key < best[0]:
            best = (key, counts + (n_long,), total)
    assert best is not None
    _, counts, total = best
    chosen = tuple(
        PutUpCount(p.label, p.length_ft, c)
        for p, c in sorted(zip(usable, counts, strict=True), key=lambda pc: -pc[0].length_ft)
        if c
    )
    return chosen, total


# --------------------------------------------------------------------------------------------
# Lower bounds


def l2_bound(sizes: Sequence[int], capacity: int) -> int:
    """Martello-Toth L2: the fewest bins of ``capacity`` [ft] that could hold ``sizes`` [ft]
    (each at most ``capacity``). For each threshold a <= capacity / 2 the items longer than
    capacity - a need a bin each, as do those longer than capacity / 2, and the items from a to
    capacity / 2 must fit in what those bins leave or in more bins."""
    if not sizes:
        return 0
    s = sorted(sizes)
    prefix = [0]
    for v in s:
        prefix.append(prefix[-1] + v)
    n = len(s)
    best = math.ceil(prefix[-1] / capacity)
    half = bisect.bisect_right(s, capacity // 2)      # s[:half] <= capacity / 2 (integers)
    for a in {0, *s[:half]}:
        big = bisect.bisect_right(s, capacity - a)     # s[big:] > capacity - a: J1
        n1 = n - big
        n2 = big - half                                # capacity - a >= s > capacity / 2: J2
        sum2 = prefix[big] - prefix[half]
        low = bisect.bisect_left(s, a)                 # a <= s <= capacity / 2: J3
        sum3 = prefix[half] - prefix[low]
        room = n2 * capacity - sum2
        best = max(best, n1 + n2 + max(0, math.ceil((sum3 - room) / capacity)))
    return best


# --------------------------------------------------------------------------------------------
# Packing


def pack_cuts(cuts: Sequence[Cut], putups: Sequence[PutUp], cut_to_length: bool) -> Packing:
    """Pack ``cuts`` into the ``putups`` a size is sold in (and, with ``cut_to_length``, a
    remainder cut to length). No put-ups at all: everything on one piece cut to length."""
    cuts = [c for c in cuts if c.ft > 0]
    label_of: dict[int, str] = {}
    for p in sorted(putups, key=lambda p: p.length_ft):
        label_of.setdefault(p.length_ft, p.label)
    lengths = sorted(label_of)
    if not lengths:
        pieces = (Piece(CUT_LABEL, sum(c.ft for c in cuts), tuple(cuts), True),) if cuts else ()
        return Packing(pieces, len(pieces), 0, "no put-up listed: cut to length")
    longest = lengths[-1]
    too_long = tuple(c for c in cuts if c.ft > longest)
    fit = [c for c in cuts if c.ft <= longest]
    cut_cap = lengths[0] - 1 if cut_to_length else 0
    total = sum(c.ft for c in fit)
    # longest first; ties in walk order, so the same walk packs the same way every time
    order = sorted(range(len(fit)), key=lambda i: -fit[i].ft)
    sizes = [fit[i].ft for i in order]

    bins, spill, method = _search(sizes, lengths, cut_cap) if sizes else ([], [], "nothing to pack")
    pieces = [Piece(label_of[length], length, tuple(fit[order[k]] for k in sorted(items)))
              for length, items in bins]
    pieces.sort(key=lambda p: (-p.length_ft, -p.used_ft))
    if spill:
        kept = tuple(fit[order[k]] for k in sorted(spill))
        pieces.append(Piece(CUT_LABEL, sum(c.ft for c in kept), kept, True))
    pieces += [Piece(CUT_LABEL, c.ft, (c,), True) for c in too_long]

    lb_count = l2_bound(sizes, longest) + len(too_long)
    _, covered = order_putups(max(0, total - cut_cap), [PutUp("", n, ()) for n in lengths])
    lb_offcut = max(0, covered - total)
    return Packing(tuple(pieces), lb_count, lb_offcut, method, too_long)


_Bins = list[tuple[int, list[int]]]     # (put-up length, indices into the sorted sizes)


def _search(sizes: list[int], lengths: list[int], cut_cap: int) -> tuple[_Bins, list[int], str]:
    """The bounded search of the module docstring over ``sizes`` (longest first)."""
    n = len(sizes)
    bins, spill = _first_answer(sizes, lengths, cut_cap)
    # fullest first; the emptiest pieces and the cut-to-length piece are searched again, all of
    # them in a small group
    bins.sort(key=lambda b: sum(sizes[i] for i in b[1]) / b[0], reverse=True)
    tail_bins: _Bins = []
    count = len(spill)
    while bins and (n <= TAIL_MAX_CUTS or not tail_bins
                    or count + len(bins[-1][1]) <= TAIL_MAX_CUTS):
        tail_bins.append(bins.pop())
        count += len(tail_bins[-1][1])
    tail = sorted(spill + [i for _, items in tail_bins for i in items])  # still longest first
    where = {i: k for k, i in enumerate(tail)}
    found, left, complete = _choice_search(
        [sizes[i] for i in tail], lengths, cut_cap,
        [(length, [where[i] for i in items]) for length, items in tail_bins],
        [where[i] for i in spill],
    )
    out = bins + [(length, [tail[k] for k in items]) for length, items in found]
    if n <= EXACT_MAX_CUTS:
        method = "exact search" if complete else "exact search (step limit reached)"
    elif len(tail) == n:
        method = "best-fit decreasing" + ("" if complete else " (search limit reached)")
    else:
        method = "best-fit decreasing, the emptiest pieces searched again" + (
            "" if complete else " (search limit reached)")
    return out, [tail[k] for k in left], method


def _choice_search(sizes: list[int], lengths: list[int], cut_cap: int, bins: _Bins,
                   spill: list[int]) -> tuple[_Bins, list[int], bool]:
    """Better packings of ``sizes`` (longest first) than ``bins`` and ``spill``, over the choices
    of put-ups; exact filling for at most ``EXACT_MAX_CUTS`` cuts. Returns the best packing and
    whether the search ran to its end."""
    n = len(sizes)
    best = _score(sizes, bins, spill)
    exact = n <= EXACT_MAX_CUTS
    complete = True
    work = 0
    choices = _choices(sizes, lengths, cut_cap, best[0])
    if len(choices) >= MAX_CHOICES:
        complete = False
    for choice_lb, min_pieces, counts in choices:
        if (choice_lb, min_pieces) >= best:
            break
        if work > WORK_BUDGET:
            complete = False
            break
        caps = [length for length, c in zip(lengths, counts, strict=False) for _ in range(c)]
        work += n
        assign, left = _best_fit(sizes, caps, cut_cap)
        if exact and (assign is None or left):
            better, rest, finished = _exact_fill(sizes, caps, cut_cap)
            complete = complete and finished
            if better is not None and (assign is None or sum(sizes[i] for i in rest)
                                       <= sum(sizes[i] for i in left)):
                assign, left = better, rest
        if assign is None:
            continue
        found = _shorten(sizes, assign, lengths)
        score = _score(sizes, found, left)
        if score < best:
            best, bins, spill = score, found, left
    return bins, spill, complete


def _score(sizes: list[int], bins: _Bins, spill: list[int]) -> tuple[int, int]:
    """(offcut [ft], pieces): smaller is better, offcut first."""
    offcut = sum(length - sum(sizes[i] for i in items) for length, items in bins)
    return offcut, len(bins) + (1 if spill else 0)


def _first_answer(sizes: list[int], lengths: list[int], cut_cap: int) -> tuple[_Bins, list[int]]:
    """Best-fit decreasing into as many of the longest put-up as it takes, each piece shortened,
    then the emptiest pieces moved to the cut-to-length piece while they fit under ``cut_cap``."""
    longest = lengths[-1]
    keys: list[int] = []        # remaining room of the open pieces, ascending
    owners: list[int] = []      # piece index for each entry of keys
    assign: list[list[int]] = []
    for i, s in enumerate(sizes):
        pos = bisect.bisect_left(keys, s)
        if pos == len(keys):
            assign.append([])
            j, room = len(assign) - 1, longest
        else:
            j, room = owners.pop(pos), keys.pop(pos)
        assign[j].append(i)
        room -= s
        pos = bisect.bisect_left(keys, room)
        keys.insert(pos, room)
        owners.insert(pos, j)
    bins = _shorten(sizes, assign, lengths)
    spill: list[int] = []
    if cut_cap:
        bins.sort(key=lambda b: sum(sizes[i] for i in b[1]))
        moved = 0
        while bins:
            fill = sum(sizes[i] for i in bins[0][1])
            if moved + fill > cut_cap:
                break
            moved += fill
            spill += bins.pop(0)[1]
    return bins, spill


def _shorten(sizes: list[int], assign: list[list[int]], lengths: list[int]) -> _Bins:
    """Drop empty pieces and put each on the shortest put-up that holds what is on it."""
    out: _Bins = []
    for items in assign:
        if not items:
            continue
        fill = sum(sizes[i] for i in items)
        out.append((lengths[bisect.bisect_left(lengths, fill)], items))
    return out


def _choices(sizes: list[int], lengths: list[int], cut_cap: int, best_offcut: int):
    """Choices of how many of each put-up to buy, as (least offcut they could leave, fewest
    pieces, counts per length), best first, that could leave no more than ``best_offcut``.

    A shorter put-up that divides a longer one is never bought that many times over (they could
    be one longer piece holding the same cuts); no length is bought more times than there are
    cuts; the total bought stays within the need plus ``best_offcut``."""
    total = sum(sizes)
    n = len(sizes)
    longest = lengths[-1]
    ceiling = total + best_offcut
    bounds = []
    for length in lengths[:-1]:
        bound = min(n, ceiling // length)
        for other in lengths:
            if other > length and other % length == 0:
                bound = min(bound, other // length - 1)
        bounds.append(bound)
    out = []
    for counts in _bounded_products(bounds, lengths[:-1], ceiling):
        got = sum(c * length for c, length in zip(counts, lengths, strict=False))  # all but the longest
        first = max(0, math.ceil((total - cut_cap - got) / longest))
        for n_long in range(first, min(n, (ceiling - got) // longest) + 1):
            cap = got + n_long * longest
            pieces = sum(counts) + n_long
            if pieces == 0 or pieces > n:
                continue
            lb = max(0, cap - total)
            out.append((lb, pieces + (1 if cap < total else 0), counts + (n_long,)))
            if len(out) >= MAX_CHOICES:
                break
        if len(out) >= MAX_CHOICES:
            break
    out.sort()
    return out


def _bounded_products(bounds: list[int], lengths: list[int], ceiling: int):
    """Every tuple of counts within ``bounds`` whose put-ups add up to at most ``ceiling``."""
    if not bounds:
        yield ()
        return

    def rec(i: int, got: int, prefix: tuple[int, ...]):
        if i == len(bounds):
            yield prefix
            return
        for c in range(bounds[i] + 1):
            more = got + c * lengths[i]
            if more > ceiling:
                break
            yield from rec(i + 1, more, prefix + (c,))

    yield from rec(0, 0, ())


def _best_fit(sizes: list[int], caps: list[int], cut_cap: int) -> tuple[list[list[int]] | None, list[int]]:
    """Best-fit decreasing into the pieces ``caps`` [ft]; cuts that fit nowhere go to the
    cut-to-length piece while it stays within ``cut_cap``. None when they do not."""
    order = sorted(range(len(caps)), key=lambda j: caps[j])
    keys = [caps[j] for j in order]
    owners = list(order)
    assign: list[list[int]] = [[] for _ in caps]
    spill: list[int] = []
    spilled = 0
    for i, s in enumerate(sizes):
        pos = bisect.bisect_left(keys, s)
        if pos == len(keys):
            spilled += s
            if spilled > cut_cap:
                return None, []
            spill.append(i)
            continue
        j, room = owners.pop(pos), keys.pop(pos) - s
        assign[j].append(i)
        pos = bisect.bisect_left(keys, room)
        keys.insert(pos, room)
        owners.insert(pos, j)
    return assign, spill


def _exact_fill(sizes: list[int], caps: list[int], cut_cap: int
                ) -> tuple[list[list[int]] | None, list[int], bool]:
    """Every placement of the cuts on the pieces ``caps`` (pieces with equal room tried once),
    keeping the one that leaves the least for the cut-to-length piece (at most ``cut_cap``).
    Returns the placement (None: none found), the cuts left over and whether it finished."""
    n = len(sizes)
    suffix = [0] * (n + 1)
    for i in range(n - 1, -1, -1):
        suffix[i] = suffix[i + 1] + sizes[i]
    room = list(caps)
    where = [-1] * n
    best: dict = {"spill": None, "where": None}
    steps = [0]

    def dfs(i: int, spilled: int) -> bool:
        """False once the step budget is spent."""
        steps[0] += 1
        if steps[0] > EXACT_NODE_BUDGET:
            return False
        if best["spill"] is not None and spilled >= best["spill"]:
            return True
        if i == n:
            best["spill"], best["where"] = spilled, list(where)
            return True
        s = sizes[i]
        tried: set[int] = set()
        for j, r in enumerate(room):
            if r >= s and r not in tried:
                tried.add(r)
                room[j] -= s
                where[i] = j
                ok = dfs(i + 1, spilled)
                room[j] += s
                if not ok:
                    return False
                if best["spill"] == 0:
                    return True
        if spilled + s <= cut_cap:
            where[i] = -1
            return dfs(i + 1, spilled + s)
        return True

    finished = dfs(0, 0)
    if best["where"] is None:
        return None, [], finished
    assign: list[list[int]] = [[] for _ in caps]
    spill = []
    for i, j in enumerate(best["where"]):
        (spill if j < 0 else assign[j]).append(i)
    return assign, spill, finished
