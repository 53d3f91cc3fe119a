"""Size one run: ``evaluate(RunSpec) -> RunResult``, split by rule.

The phase conductor is the smallest size (14 AWG Cu, 12 AWG Al and up; NEC 2023) that carries
the load, is protected by the device and meets the drop targets, then the EGC and the raceway:

- ``spec``: the spec checked, the field named when it cannot be evaluated;
- ``currents``: the design current (NEC 210.19(A)(1), 215.2(A)(1)) and the device (240.6(A),
  210.20(A), 215.3); the seam where a kind of load with an article of its own plugs in;
- ``columns``: the cached table columns: Table 310.16 with the terminal column (110.14(C)(1)),
  the corrections (310.15(B)(1), (C)(1)) and the device limits (240.4(B)-(D)), and the
  impedance columns of Ch. 9 Tables 8 and 9;
- ``pick``: the conductor: ampacity, protection (240.4), drop (informational notes to 210.19(A)
  and 215.2(A)), the job's minimum size, parallel sets (310.10(G));
- ``egc``: Table 250.122 with 250.122(A), (B) and (F);
- ``raceway``: the raceway type and its trade size (Ch. 9 Tables 1, 4 and 5);
- ``evaluate``: the rules in order, and the result.

Terminals (110.14(C)(1)) are taken by the circuit rating: 60 C for a device of 100 A or less,
75 C above; equipment marked otherwise (75 C lugs on a small breaker, or lugs marked for 14-1 AWG
on a larger one) is given with ``RunSpec.terminal_temp``. Pure: no I/O.

Public API: ``evaluate`` (and ``evaluate_picked``: with the least drop of the sizes it passed
over), ``forget_loads`` (the caches keyed by a run's load emptied),
``SizingError``, ``resolve_raceway``, ``START_SIZE``,
``PARALLEL_MIN_SIZE``, ``FAMILY_REPRESENTATIVE``.
"""

from gaugewalk.model.engine.sizing.columns import PARALLEL_MIN_SIZE, START_SIZE
from gaugewalk.model.engine.sizing.evaluate import evaluate, evaluate_picked
from gaugewalk.model.engine.sizing.kinds import forget_loads
from gaugewalk.model.engine.sizing.raceway import FAMILY_REPRESENTATIVE, resolve_raceway
from gaugewalk.model.engine.sizing.spec import SizingError

__all__ = ["FAMILY_REPRESENTATIVE", "PARALLEL_MIN_SIZE", "START_SIZE", "SizingError", "evaluate",
           "evaluate_picked", "forget_loads", "resolve_raceway"]
