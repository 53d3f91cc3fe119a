"""What one run's calculation takes (``RunSpec``) and gives back (``RunResult``).

``with_fields(obj, **changes)``: ``dataclasses.replace`` for these frozen shapes, without their
``__init__``.

These two shapes are the contract between the engine (``gaugewalk.model.engine.sizing.evaluate``) and everything
that consumes it: the walk file's job computation, the app, the takeoff, the reports and
``gaugewalk calc --json``. Units are in the field names or comments: [A], [V], [ft], [%], [C].
"""

from dataclasses import asdict, field
from typing import Literal, NamedTuple, TypeVar

from gaugewalk.model.engine.record import record
from gaugewalk.model.engine.vocabulary import (
    LoadKind,
    Material,
    Method,
    MotorDesign,
    MotorDevice,
    WelderType,
)


class Circuit(NamedTuple):
    """How a load is connected, resolved to what the drop formula and the raceway need.

    ``volts`` is the nominal voltage the load is connected at; percent drop is against it.
    ``drop_factor`` multiplies I*R*L: 2 for a two-wire single-phase circuit, sqrt(3) for a
    three-phase circuit, 1 for each leg of a balanced multiwire circuit whose neutral carries no
    current (its percent is then against the line-to-neutral voltage).
    ``drop_angle_deg``: where the current the drop follows is not in phase with the load current
    (a leg of a two-circuit multiwire on a wye, whose neutral carries the other leg's current
    too: the drop phasor is sqrt(3) I at 30 degrees either side), the drop is taken at the load's
    angle plus and minus this, the worse of the two (``gaugewalk.model.engine.drop``).
    """

    label: str                 # e.g. "208 V 3-phase", "120 V line-to-neutral"
    volts: float               # [V] nominal voltage the load is connected at
    phases: Literal[1, 3]      # 1 or 3: how amps follow from VA
    line_volts: float          # [V] voltage used to turn VA into amps (line-to-line for 3-phase)
    drop_factor: float         # multiplier k in VD = k * I * Z * L / 1000
    hots: int                  # ungrounded conductors
    neutral: bool              # a grounded (neutral) conductor is run
    neutral_is_ccc: bool       # the neutral counts as current-carrying (NEC 310.15(E))
    drop_angle_deg: float = 0.0  # [deg] shift of the drop phasor from the load current
    notes: tuple[str, ...] = ()  # what the connection implies (NEC 210.4(B), 110.15)


class Equipment(NamedTuple):
    """What a load is, with the nameplate values its kind's rules read (NEC Articles 422, 424,
    430, 440, 625, 630, 695); see ``gaugewalk.model.engine.sizing.kinds``. None of a field: not given.
    Units in brackets."""

    kind: LoadKind = "general"
    hp: float | None = None                 # [hp] motor rating (Tables 430.248, 430.250)
    motor_device: MotorDevice = "inverse-time"  # Table 430.52(C)(1) column
    code_letter: str | None = None          # Table 430.7(B) locked-rotor code letter
    design: MotorDesign = "B"               # NEMA design letter (Table 430.251(B))
    mca_a: float | None = None              # [A] nameplate minimum circuit ampacity (440.4(B))
    mocp_a: float | None = None             # [A] nameplate maximum overcurrent protection
    i1eff_a: float | None = None            # [A] welder effective primary current (630.11(A))
    i1max_a: float | None = None            # [A] welder maximum primary current (630.12(A))
    rated_a: float | None = None            # [A] welder rated primary current
    duty_cycle_pct: float | None = None     # [%] welder duty cycle (Table 630.11(A))
    welder_type: WelderType = "nonmotor"    # Table 630.11(A) column
    tank_gal: float | None = None           # [gal] water heater storage (422.13)
    yokes: int | None = None                # receptacle yokes at 180 VA each (220.14(I))
    continuous: bool | None = None          # the run's own say; None: the kind's default
    lra_a: float | None = None              # [A] nameplate locked-rotor current, where stated


@record(frozen=True)
class RunSpec:
    """Everything needed to size one run. Defaults are the job defaults gaugewalk ships."""

    circuit: Circuit
    amps: float                            # [A] load current (whole circuit, all sets together)
    length_ft: float                       # [ft] one-way route length
    continuous: bool = False               # load runs 3 h or more: 125% for sizing (NEC 210.19, 215.2)
    continuous_amps: float | None = None   # [A] continuous share if only part is continuous
    distributed: bool = False              # load spread evenly along the run: drop at half length
    material: Material = "cu"
    insulation: str = "THHN/THWN-2"
    terminal_temp: int | None = None       # [C] 60/75/90; None: NEC 110.14(C)(1) by rating and size
    conductor_temp_c: float = 75.0         # [C] for resistance (NEC Ch. 9 Table 8 note 2)
    method: Method = "ac"
    pf: float = 0.85                       # power factor for the AC method
    raceway: str = "EMT"                   # raceway type (gaugewalk.tables.raceway.fill) or family
    ambient_c: float = 30.0                # [C] NEC 310.15(B)(1)
    rooftop: bool = False                  # in sunlight less than 7/8 in above a roof: 33 C
                                           # added to ambient_c (NEC 310.15(B)(2))
    ccc: int | None = None                 # current-carrying conductors in the raceway; None: from circuit
    sets: int = 1                          # conductors in parallel per phase (NEC 310.10(G))
    size: str | None = None                # a size the user fixed; None: pick the smallest that works
    ocpd_a: int | None = None              # a breaker/fuse the user fixed; None: next standard rating
    max_drop_pct: float = 3.0              # [%] this run (informational notes to 210.19, 215.2)
    upstream_drop_pct: float = 0.0         # [%] drop from the service to this run's source
    max_total_drop_pct: float = 5.0        # [%] service to load
    egc: bool = True                       # run an equipment grounding conductor
    egc_material: Material | None = None   # None: same as the phase conductors
    egc_bare: bool = False                 # a bare EGC (Ch. 9 Table 8 area) instead of insulated
    stranded: bool = True                  # stranded conductors (Ch. 9 Table 8 DC resistance)
    min_size: str | None = None            # smallest size the job allows (a job specification,
                                           # e.g. 12 AWG for power; common practice), None: no floor
    equipment: Equipment | None = None     # the load's kind and nameplate; None: general
    load_notes: tuple[str, ...] = ()       # what reading the load took as given (a power
                                           # factor the run does not give), said in the notes
    starting_drop_pct: float = 15.0        # [%] motor starting-drop target (common practice)
    neutral_amps: float | None = None      # [A] a feeder's neutral load, the largest line-to-
                                           # neutral load on one line (NEC 220.61(A)): it is then
                                           # sized for it; None: the neutral is the phase size
    min_ampacity_a: float | None = None    # [A] the conductors' ampacity must be at least this,
                                           # with no next size up (e.g. NEC 240.21(C): transformer
                                           # secondary conductors not below the device they end
                                           # in); None: no such rule
    motor_feeder_max_a: float | None = None  # [A] a feeder supplying motors alone: the most its
                                           # device may be (NEC 430.62(A)); set, the device is
                                           # picked up to it and protects the conductors by
                                           # Article 430 Part V (240.4(G)); None: not such a feeder
    lugs_bus_a: int | None = None          # [A] the bus of the main-lugs-only panel a feeder of
                                           # motors feeds: its picked device stays at or below it
                                           # (NEC 408.36)
    bonding_jumper: bool = False           # a transformer's secondary conductors ahead of their
                                           # first device: the wire run with them is the supply-
                                           # side bonding jumper, and the neutral no smaller
                                           # (NEC 250.30(A)(2), (3), Table 250.102(C)(1))


@record(frozen=True)
class RunResult:
    """The answer for one run. ``problems`` are sentences a foreman understands; ``ok`` is
    True when there are none."""

    size: str                      # phase conductor size, e.g. "4/0 AWG" (per set)
    sets: int
    material: Material
    method: Method
    amps: float                    # [A] load current
    design_amps: float             # [A] what the terminals must carry: noncontinuous + 125% of
                                   # continuous, or the load kind's rule (430.22, 440.4(B)...)
    required_ampacity_a: float     # [A] what the conductors must carry after corrections
    ampacity_a: float              # [A] corrected, terminal-limited ampacity of all sets together
    min_ampacity_size: str         # smallest size meeting ampacity alone
    ocpd_a: int                    # [A] the device the load's rule asked for (or the one fixed)
    voltage_drop_v: float          # [V]
    voltage_drop_pct: float        # [%] of circuit.volts
    total_drop_pct: float          # [%] upstream_drop_pct + voltage_drop_pct
    egc_size: str | None           # NEC Table 250.122 with 250.122(B); None when no EGC
    neutral_size: str | None       # same as phase unless a rule says otherwise; None without neutral
    raceway: str                   # raceway type
    raceway_size: str | None       # trade size, e.g. "1-1/4"; None when nothing fits
    raceway_fill_pct: float        # [%] of the raceway's internal area
    governed_by: str               # "ampacity" | "voltage drop" | "fixed size" | "overcurrent device"
    margins: dict[str, float] = field(default_factory=dict)  # e.g. {"ampacity_a": 12.0, "drop_pct": 0.8}
    conductors: dict[str, int] = field(default_factory=dict)  # per set: {"hot": 3, "neutral": 1, "egc": 1}
    problems: tuple[str, ...] = ()
    notes: tuple[str, ...] = ()    # rules applied, e.g. "NEC 240.4(D): 12 AWG Cu limited to 20 A"
    load_kind: str = "general"     # the load's kind (``gaugewalk.model.engine.vocabulary``)
    kind_rule: str = ""            # the sections that sized it, e.g. "NEC 430.22, 430.52(C)(1)"
    flc_a: float | None = None     # [A] motor full-load current used (Table 430.248 or 430.250)
    locked_rotor_a: float | None = None     # [A] motor locked-rotor current used for starting
    starting_drop_pct: float | None = None  # [%] drop while the motor starts (this run)

    @property
    def ok(self) -> bool:
        return not self.problems

    @property
    def within_limits(self) -> bool:
        """Its ampacity enough and its drop within both targets (``margins``), whatever other
        problem it has (data missing, a device, a rule of its place)."""
        m = self.margins
        return (self.ampacity_a + 1e-9 >= self.required_ampacity_a
                and m.get("drop_pct", 0.0) >= -1e-9 and m.get("total_drop_pct", 0.0) >= -1e-9)

    def to_dict(self) -> dict:
        data = asdict(self)
        data["ok"] = self.ok
        data["problems"] = list(self.problems)
        data["notes"] = list(self.notes)
        return data


_T = TypeVar("_T")
_new_object = object.__new__
_set_attr = object.__setattr__


def with_fields(obj: _T, **changes: object) -> _T:
    """A copy of a frozen dataclass of this module (none has ``__post_init__``, slots or cached
    properties) with ``changes`` set: ``dataclasses.replace`` without the per-field
    ``object.__setattr__`` of a frozen ``__init__`` (ten times its cost on ``RunSpec``). Every
    name must be a field."""
    values = obj.__dict__.copy()
    for name in changes:
        if name not in values:
            raise TypeError(f"{type(obj).__name__} has no field {name!r}")
    values.update(changes)
    copy = _new_object(type(obj))
    _set_attr(copy, "__dict__", values)
    return copy
