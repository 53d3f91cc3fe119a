"""Motor branch short-circuit and ground-fault protection: NEC 2023 Table 430.52(C)(1), with the
limits of 430.52(C)(1)(b) and 430.52(C)(3).

Table 430.52(C)(1), "Maximum Rating or Setting of Motor Branch-Circuit Short-Circuit and
Ground-Fault Protective Devices", gives a percent of the motor's table full-load current
(430.6(A)(1)) by motor type and device type. Numbering: the table was "Table 430.52" and the two
rules below were 430.52(C)(1) Exceptions No. 1 and No. 2 in the 2017 and earlier editions; the
2020 edition moved them to Table 430.52(C)(1) and 430.52(C)(1)(a) and (b), kept in 2023 (from
memory, and the numbering public references of the 2020-2023 code use).

- 430.52(C)(1)(a) (``NEXT_SIZE_UP``): where the percentage does not give a standard rating of a
  fuse or nonadjustable breaker (240.6(A)) or a possible setting of an adjustable one, the next
  higher standard rating or setting is permitted. The rule code applies it.
- 430.52(C)(1)(b) (``STARTING_CURRENT``): where that rating will not carry the motor's starting
  current, it may be increased, but never above: nontime-delay fuses of 600 A or less, 400 %;
  time-delay (dual-element) fuses, 225 %; inverse time breakers, 400 % of a full-load current of
  100 A or less and 300 % above 100 A; fuses rated 601 to 6000 A, 300 % (``starting_limit``).
- 430.52(C)(3) (``INSTANTANEOUS``): an instantaneous-trip breaker is permitted only if adjustable
  and part of a listed combination motor controller; where the table setting will not carry the
  starting current it may be raised to at most 1300 % (1700 % for Design B energy-efficient
  motors); settings above 800 % (1100 %) need an engineering evaluation showing the need.

Footnotes of the table (summarised): (1) the nontime-delay fuse column also applies to time-delay
Class CC fuses; (2) the inverse time column also covers nonadjustable inverse time breakers, which
430.52(C)(1)(a) and (b) may modify; (3) low-torque, low-speed synchronous motors (usually 450 rpm
or lower) that start unloaded do not need more than 200 %.

Sources: percentages typed from memory and checked against two public code projects that carry
the 2020-2023 table; the single-phase, polyphase, synchronous and wound-rotor rows also against a
reprint of the older Table 430-152, whose dc instantaneous-trip cell reads 200 % where the current
table and this module read 250 % (from memory). The (C)(1)(b) and (C)(3) limits from memory,
matching those projects and a trade article on the 2020-era rules. The row for Design B
energy-efficient motors (1100 % instantaneous) dates from the 2014 edition, which replaced Design
E (from memory).
"""

from typing import NamedTuple

from gaugewalk.tables.errors import TableLookupError, choices

TABLE_430_52 = "Table 430.52(C)(1)"
NEXT_SIZE_UP = "430.52(C)(1)(a)"
STARTING_CURRENT = "430.52(C)(1)(b)"
INSTANTANEOUS = "430.52(C)(3)"

DEVICES: dict[str, str] = {
    "nontime-delay-fuse": "nontime-delay fuse",
    "dual-element-fuse": "dual-element (time-delay) fuse",
    "instantaneous-trip": "instantaneous-trip breaker",
    "inverse-time": "inverse time breaker",
}
"""Device keys and the words for them; the columns of Table 430.52(C)(1), in its order."""

MOTOR_TYPES: dict[str, str] = {
    "single-phase": "single-phase motor",
    "squirrel-cage": "ac polyphase squirrel-cage motor other than Design B energy-efficient",
    "design-b-energy-efficient": "Design B energy-efficient squirrel-cage motor",
    "synchronous": "synchronous motor",
    "wound-rotor": "wound-rotor motor",
    "dc": "dc motor (constant voltage)",
}
"""Motor type keys and the words for them; the rows of Table 430.52(C)(1), in its order."""

# NEC 2023 Table 430.52(C)(1) [percent of full-load current]: motor type -> (nontime-delay fuse,
# dual-element fuse, instantaneous-trip breaker, inverse time breaker).
TABLE_430_52_PERCENT: dict[str, tuple[int, int, int, int]] = {
    "single-phase": (300, 175, 800, 250),
    "squirrel-cage": (300, 175, 800, 250),
    "design-b-energy-efficient": (300, 175, 1100, 250),
    "synchronous": (300, 175, 800, 250),
    "wound-rotor": (150, 150, 800, 150),
    "dc": (150, 150, 250, 150),
}

INVERSE_TIME_STARTING_BREAKPOINT_A = 100.0
"""[A] 430.52(C)(1)(b)(3): inverse time breakers may go to 400 % of a full-load current of 100 A
or less, 300 % above."""

LARGE_FUSE_MIN_A = 601
"""[A] 430.52(C)(1)(b)(4): fuses rated 601 to 6000 A, at most 300 %."""


def _device(device: str) -> str:
    if device not in DEVICES:
        raise TableLookupError(f"no motor branch device '{device}' in {TABLE_430_52}; devices "
                               f"are {choices(DEVICES)}")
    return device


def _motor_type(motor_type: str) -> str:
    if motor_type not in MOTOR_TYPES:
        raise TableLookupError(f"no motor type '{motor_type}' in {TABLE_430_52}; types are "
                               f"{choices(MOTOR_TYPES)}")
    return motor_type


def branch_device_percent(motor_type: str, device: str) -> int:
    """Maximum rating or setting of the motor branch short-circuit and ground-fault device [%] of
    the table full-load current, NEC Table 430.52(C)(1). Keys are those of ``MOTOR_TYPES`` and
    ``DEVICES``; 430.52(C)(1)(a) (next size up) is for the rule code to apply."""
    return TABLE_430_52_PERCENT[_motor_type(motor_type)][list(DEVICES).index(_device(device))]


class DeviceLimit(NamedTuple):
    """A ceiling for the branch device: ``percent`` of the full-load current and the ``section``
    that sets it."""
    percent: int
    section: str


def starting_limit(device: str, flc_a: float, motor_type: str = "squirrel-cage",
                   fuse_rating_a: float | None = None) -> DeviceLimit:
    """The most the branch device may be raised to [% of full-load current ``flc_a`` [A]] where
    the Table 430.52(C)(1) rating, next size up included, will not carry the starting current:
    430.52(C)(1)(b) for fuses and inverse time breakers, 430.52(C)(3) for instantaneous trip.

    ``fuse_rating_a`` [A]: a nontime-delay fuse rated 601 A or more is held to 300 %
    (430.52(C)(1)(b)(4)) instead of 400 %; without it a fuse of 600 A or less is assumed.
    """
    _device(device)
    _motor_type(motor_type)
    if isinstance(flc_a, bool) or not isinstance(flc_a, (int, float)) or not flc_a > 0:
        raise TableLookupError(f"a full-load current must be a positive number of amperes, "
                               f"not {flc_a!r}")
    if device == "nontime-delay-fuse":
        if fuse_rating_a is not None and fuse_rating_a >= LARGE_FUSE_MIN_A:
            return DeviceLimit(300, f"{STARTING_CURRENT}(4)")
        return DeviceLimit(400, f"{STARTING_CURRENT}(1)")
    if device == "dual-element-fuse":
        return DeviceLimit(225, f"{STARTING_CURRENT}(2)")
    if device == "inverse-time":
        return DeviceLimit(400 if flc_a <= INVERSE_TIME_STARTING_BREAKPOINT_A else 300,
                           f"{STARTING_CURRENT}(3)")
    return DeviceLimit(1700 if motor_type == "design-b-energy-efficient" else 1300, INSTANTANEOUS)


def instantaneous_evaluation_threshold(motor_type: str) -> int:
    """[%] 430.52(C)(3): instantaneous-trip settings above this (800 %, or 1100 % for Design B
    energy-efficient motors) need an engineering evaluation showing the need."""
    return 1100 if _motor_type(motor_type) == "design-b-energy-efficient" else 800
