"""The benchmark's own reading of what it runs: the instruction count valgrind's callgrind
reports (``bench/commands.py``, ``--instructions``), read from its standard error as valgrind
3.19 writes it (the lines below are its output for ``python -c pass`` on this machine)."""

from __future__ import annotations

from bench.commands import collected_instructions

CALLGRIND_TAIL = "\n".join([
    "==3321== Command: .venv/bin/python -c pass",
    "==3321== ",
    "==3321== For interactive control, run 'callgrind_control -h'.",
    "==3321== ",
    "==3321== Events    : Ir",
    "==3321== Collected : 87949447",
    "==3321== ",
    "==3321== I   refs:      87,949,447",
    ""])


def test_the_count_callgrind_collected_is_read():
    assert collected_instructions(CALLGRIND_TAIL) == 87_949_447


def test_a_report_without_the_count_gives_none():
    # a program valgrind could not run, or a report cut short
    assert collected_instructions("valgrind: /nowhere: No such file or directory\n") is None
    assert collected_instructions(CALLGRIND_TAIL.replace("Collected", "Gathered")) is None
