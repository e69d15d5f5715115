"""shaftcheck.records: a record behaves as a frozen dataclass does, compared side by side with
``dataclasses.dataclass(frozen=True)`` (the standard library is the oracle)."""

from __future__ import annotations

import copy
import dataclasses
import pickle
from dataclasses import FrozenInstanceError, dataclass, field

import numpy as np
import pytest

from shaftcheck.records import record


def _pair(**options):
    """The same class body as a record and as a standard frozen dataclass."""

    def body():
        class Body:
            a: float
            b: tuple = ()
            c: list = field(default_factory=list)
            hidden: str = field(default="h", repr=False, compare=False)

            def twice(self):
                return 2 * self.a

        return Body

    ours = record(body(), **options)
    theirs = dataclass(body(), frozen=True, **options)
    return ours, theirs


def test_construction_defaults_and_field_tools_match_the_standard_decorator():
    ours, theirs = _pair()
    x, y = ours(1.0, (2,), hidden="z"), theirs(1.0, (2,), hidden="z")
    assert [f.name for f in dataclasses.fields(x)] == [f.name for f in dataclasses.fields(y)]
    assert dataclasses.asdict(x) == dataclasses.asdict(y)
    assert x.c == [] and x.c is not ours(1.0).c  # default_factory: a new list each time
    assert x.twice() == 2.0
    z = dataclasses.replace(x, a=5.0)
    assert (z.a, z.b, z.hidden) == (5.0, (2,), "z") and x.a == 1.0
    assert dataclasses.is_dataclass(x)
    with pytest.raises(TypeError):
        ours()  # the required field is still required


def test_repr_equality_and_hash_match_the_standard_decorator():
    ours, theirs = _pair()
    x, y = ours(1.0, (2,), hidden="p"), theirs(1.0, (2,), hidden="p")
    assert repr(x).replace(ours.__qualname__, "C") == repr(y).replace(theirs.__qualname__, "C")
    assert x == ours(1.0, (2,), hidden="other")  # compare=False field left out, as standard
    assert (y == theirs(1.0, (2,), hidden="other")) is True
    assert x != ours(2.0, (2,)) and (x == y) is False  # other class: not equal
    a, b = ours(1.0, (2,), (3,)), ours(1.0, (2,), (3,), hidden="other")
    a2 = theirs(1.0, (2,), (3,))
    assert hash(a) == hash(b) == hash(a2)  # both hash the tuple of compared fields
    assert len({a, b}) == 1
    with pytest.raises(TypeError):
        hash(x)  # a list field: unhashable, as in the standard frozen dataclass
    with pytest.raises(TypeError):
        hash(y)


def test_instances_refuse_assignment_and_deletion():
    ours, _ = _pair()
    x = ours(1.0)
    with pytest.raises(FrozenInstanceError):
        x.a = 2.0
    with pytest.raises(FrozenInstanceError):
        x.new_attribute = 1
    with pytest.raises(FrozenInstanceError):
        del x.a
    assert x.a == 1.0


def test_eq_false_keeps_identity_equality_like_the_standard_decorator():
    ours, theirs = _pair(eq=False)
    assert ours(1.0) != ours(1.0) and theirs(1.0) != theirs(1.0)
    x = ours(1.0, c=[1])  # identity hash: even a list field does not matter
    assert x == x and hash(x) == object.__hash__(x)


def test_post_init_may_derive_fields_and_arrays_compare_as_in_dataclasses():
    @record
    class Point:
        xyz: np.ndarray
        norm: float = 0.0

        def __post_init__(self):
            object.__setattr__(self, "xyz", np.asarray(self.xyz, float))
            object.__setattr__(self, "norm", float(np.linalg.norm(self.xyz)))

    p = Point([3.0, 4.0, 0.0])
    assert p.norm == 5.0 and p.xyz.dtype == float
    with pytest.raises(ValueError):  # tuple comparison of arrays, exactly as dataclasses does
        bool(p == Point([3.0, 4.0, 0.0]))


def test_copies_and_pickles_round_trip():
    ours = _pair()[0]
    globals()["PickledRecord"] = ours  # pickle finds a class by module and name
    ours.__qualname__ = ours.__name__ = "PickledRecord"
    x = ours(1.5, (1, 2), [3])
    assert pickle.loads(pickle.dumps(x)) == x
    assert copy.deepcopy(x) == x and copy.copy(x) == x
