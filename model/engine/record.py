"""``record``: ``dataclasses.dataclass`` for the model's result shapes, its methods written once.

``dataclass`` writes each class's ``__init__``, ``__repr__``, ``__eq__``, ``__hash__`` and a
frozen class's ``__setattr__`` and ``__delattr__`` as source text and compiles it when the class
is made: 6 ms of every headless command's start for ``RunSpec`` and ``RunResult`` alone (their
35 and 28 fields), paid before a walk is read. ``record`` makes the class with
``dataclass(init=False, repr=False, eq=False)`` (its fields, defaults, ``dataclasses.fields``,
``asdict`` and ``replace`` as before) and gives it those methods from here, read off the
instance's ``__dict__``, with ``dataclass``'s behaviour: every field in its order; a
positional or keyword argument for each field taken by ``__init__``; a default or
``default_factory`` for those not given; ``repr`` and ``compare`` of ``field()`` honoured; a
frozen class hashed by its compared fields and refusing assignment (``FrozenInstanceError``); an
unfrozen one with ``eq`` unhashable. ``__post_init__``, ``InitVar``, ``slots`` and ``kw_only``
are not supported (a class giving them is refused when made).

Type checkers see ``dataclasses.dataclass`` itself (``TYPE_CHECKING``), so the fields and the
generated ``__init__`` are checked as before; ``tests/engine/test_record.py`` checks the two
agree at run time.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import MISSING, FrozenInstanceError, dataclass, fields
from operator import attrgetter
from typing import TYPE_CHECKING, Any, TypeVar

_T = TypeVar("_T")
_set_attr = object.__setattr__


def _record(frozen: bool = False) -> Callable[[type[_T]], type[_T]]:
    def make(cls: type[_T]) -> type[_T]:
        if "__post_init__" in cls.__dict__:
            raise TypeError(f"record {cls.__name__}: __post_init__ is not supported")
        cls = dataclass(init=False, repr=False, eq=False)(cls)
        _give_methods(cls, frozen)
        return cls
    return make


def _give_methods(cls: type, frozen: bool) -> None:
    every = fields(cls)
    name = cls.__name__
    taken = tuple(f.name for f in every if f.init)
    template: dict[str, Any] = {}   # every field in order: its default, or a mark to fill
    factories: dict[str, Callable[[], Any]] = {}
    required: list[str] = []
    for f in every:
        if f.default is not MISSING:
            template[f.name] = f.default
        elif f.default_factory is not MISSING:
            template[f.name] = None
            factories[f.name] = f.default_factory
        else:
            template[f.name] = None
            required.append(f.name)
    allowed = frozenset(taken)

    def __init__(self: Any, *args: Any, **kwargs: Any) -> None:
        if len(args) > len(taken):
            raise TypeError(f"{name}() takes {len(taken)} positional arguments but "
                            f"{len(args)} were given")
        given = dict(zip(taken, args, strict=False))   # fewer args than fields: the first
        for key in kwargs:
            if key not in allowed:
                raise TypeError(f"{name}() got an unexpected keyword argument {key!r}")
            if key in given:
                raise TypeError(f"{name}() got multiple values for argument {key!r}")
        given.update(kwargs)
        missing = [n for n in required if n not in given]
        if missing:
            raise TypeError(f"{name}() missing {len(missing)} required argument(s): "
                            + ", ".join(repr(n) for n in missing))
        values = template.copy()
        for key, make in factories.items():
            if key not in given:
                values[key] = make()
        values.update(given)
        _set_attr(self, "__dict__", values)

    shown = tuple(f.name for f in every if f.repr)

    def __repr__(self: Any) -> str:
        values = self.__dict__
        inner = ", ".join(f"{n}={values[n]!r}" for n in shown)
        return f"{type(self).__qualname__}({inner})"

    compared = tuple(f.name for f in every if f.compare)
    key = attrgetter(*compared) if len(compared) > 1 else (
        (lambda obj: (getattr(obj, compared[0]),)) if compared else (lambda obj: ()))

    def __eq__(self: Any, other: object) -> bool:
        if other.__class__ is not self.__class__:
            return NotImplemented
        return bool(key(self) == key(other))

    methods: dict[str, Any] = {"__init__": __init__, "__repr__": __repr__, "__eq__": __eq__}
    if frozen:
        def __hash__(self: Any) -> int:
            return hash(key(self))

        def __setattr__(self: Any, field_name: str, value: Any) -> None:
            raise FrozenInstanceError(f"cannot assign to field {field_name!r}")

        def __delattr__(self: Any, field_name: str) -> None:
            raise FrozenInstanceError(f"cannot delete field {field_name!r}")

        methods.update(__hash__=__hash__, __setattr__=__setattr__, __delattr__=__delattr__)
        cls.__dataclass_params__.frozen = True   # type: ignore[attr-defined]  # as dataclass says
    else:
        methods["__hash__"] = None   # mutable with eq: unhashable, as dataclass makes it
    for method_name, method in methods.items():
        if method is not None:
            method.__qualname__ = f"{cls.__qualname__}.{method_name}"
        setattr(cls, method_name, method)

if TYPE_CHECKING:
    from dataclasses import dataclass as record
else:
    record = _record
