"""``record`` (``gaugewalk.model.engine.record``) behaves as the standard library's
``dataclasses.dataclass`` it stands in for: the same class body made both ways is built,
compared, hashed, shown and refused alike (Python documentation, ``dataclasses``); and the
model's shapes made with it keep every field ``dataclasses.fields`` lists."""

from __future__ import annotations

import dataclasses
from dataclasses import FrozenInstanceError, field

import pytest

from gaugewalk.model.engine.contract import Circuit, RunResult, RunSpec
from gaugewalk.model.engine.record import _record
from gaugewalk.model.walk.compute import JobResult
from gaugewalk.model.walk.phases import PlaceOutcome


def _body():
    class Shape:
        a: int
        b: str
        c: float = 1.5
        d: list = field(default_factory=list)
        e: dict = field(default_factory=dict, repr=False)
        f: object = field(default=None, compare=False)
    return Shape


def _both(frozen: bool):
    """The same class made by ``dataclasses.dataclass`` (the reference) and by ``record``."""
    return dataclasses.dataclass(frozen=frozen)(_body()), _record(frozen=frozen)(_body())


CALLS = [((1, "x"), {}), ((1,), {"b": "y", "c": 2.0}), ((), {"a": 3, "b": "z", "d": [1]}),
         ((1, "x", 3.0, [2], {"k": 1}, "other"), {})]


@pytest.mark.parametrize("frozen", [False, True])
@pytest.mark.parametrize(("args", "kwargs"), CALLS)
def test_built_shown_compared_as_dataclass(frozen, args, kwargs):
    ref_cls, rec_cls = _both(frozen)
    ref, rec = ref_cls(*args, **kwargs), rec_cls(*args, **kwargs)
    assert dataclasses.asdict(rec) == dataclasses.asdict(ref)
    assert list(vars(rec)) == [f.name for f in dataclasses.fields(ref_cls)]   # field order
    assert repr(rec) == repr(ref).replace(ref_cls.__qualname__, rec_cls.__qualname__)
    twin = rec_cls(*args, **kwargs)
    assert rec == twin and not (rec != twin)
    assert (rec == rec_cls(9, "other")) == (ref == ref_cls(9, "other"))
    # a field left out of comparison does not make two unequal, as in dataclass
    same = dataclasses.replace(rec, f="else") == rec
    assert same == (dataclasses.replace(ref, f="else") == ref)
    assert rec.__eq__(object()) is NotImplemented
    if frozen:   # both hash the tuple of the compared fields (a list among them: neither)
        try:
            expected = hash(ref)
        except TypeError:
            with pytest.raises(TypeError):
                hash(rec)
        else:
            assert hash(rec) == expected
        plain_ref, plain_rec = ref_cls(1, "x", d=(), e=None), rec_cls(1, "x", d=(), e=None)
        assert hash(plain_rec) == hash(plain_ref)
    else:
        with pytest.raises(TypeError):
            hash(rec)
        with pytest.raises(TypeError):
            hash(ref)


def test_each_instance_gets_its_own_default_factory_value():
    _, rec_cls = _both(False)
    one, two = rec_cls(1, "x"), rec_cls(2, "y")
    one.d.append(1)
    assert two.d == []


@pytest.mark.parametrize("frozen", [False, True])
@pytest.mark.parametrize(("args", "kwargs"), [
    ((), {}), ((1,), {}), ((1, "x"), {"a": 2}), ((1, "x"), {"nope": 1}),
    ((1, "x", 1.0, [], {}, None, "extra"), {})])
def test_bad_calls_refused_as_dataclass_refuses(frozen, args, kwargs):
    ref_cls, rec_cls = _both(frozen)
    with pytest.raises(TypeError):
        ref_cls(*args, **kwargs)
    with pytest.raises(TypeError):
        rec_cls(*args, **kwargs)


def test_frozen_refuses_assignment_and_deletion():
    ref_cls, rec_cls = _both(True)
    for obj in (ref_cls(1, "x"), rec_cls(1, "x")):
        with pytest.raises(FrozenInstanceError):
            obj.a = 2
        with pytest.raises(FrozenInstanceError):
            del obj.a
    assert dataclasses.fields(rec_cls) and rec_cls.__dataclass_params__.frozen


def test_post_init_refused():
    class WithPost:
        a: int

        def __post_init__(self) -> None:
            pass

    with pytest.raises(TypeError, match="__post_init__"):
        _record()(WithPost)


@pytest.mark.parametrize("shape", [RunSpec, RunResult, JobResult, PlaceOutcome])
def test_model_shapes_keep_every_field(shape):
    names = [f.name for f in dataclasses.fields(shape)]
    assert names and len(set(names)) == len(names)
    if shape is RunSpec:
        circuit = Circuit("120 V", 120.0, 1, 120.0, 2.0, 1, True, True)
        spec = RunSpec(circuit, 16.0, 100.0, continuous=True)
        assert list(vars(spec)) == names
        assert spec.material == "cu" and spec.continuous and spec.egc   # defaults kept
        with pytest.raises(FrozenInstanceError):
            spec.amps = 1.0
    elif shape is JobResult:
        one, two = JobResult(), JobResult()
        assert one == two and one.runs is not two.runs
