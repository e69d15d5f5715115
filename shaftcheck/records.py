"""Frozen records: the project's frozen dataclasses, at a fraction of the start-up cost.

``@record`` gives a class what this project uses of ``@dataclasses.dataclass(frozen=True)``:
the generated ``__init__`` (defaults, :func:`dataclasses.field`, ``__post_init__``),
:func:`dataclasses.fields`, :func:`dataclasses.replace` and :func:`dataclasses.asdict`,
instances that refuse assignment and deletion (:class:`dataclasses.FrozenInstanceError`),
equality and hash over the compared fields and a repr of the shown fields. ``@record(eq=False)``
keeps identity equality, as ``eq=False`` does.

Why not the standard decorator: it compiles six methods for every class (``__init__``,
``__repr__``, ``__eq__``, ``__hash__``, ``__setattr__``, ``__delattr__``; about 0.5 ms a class
on CPython 3.11), and the ``check`` command defines about ninety classes before it computes
anything. Here only ``__init__`` is compiled; the other five are the shared functions below.

Two differences. A field is write-once rather than never written: the generated ``__init__``
assigns each field once through ``__setattr__``; any later assignment raises (a
``__post_init__`` that derives a field uses ``object.__setattr__``, as with frozen dataclasses).
And :mod:`dataclasses` sees a record as not frozen, so a subclass of a record is made with
``@record`` too (``@dataclass(frozen=True)`` on it raises TypeError).
"""

from __future__ import annotations

from dataclasses import FrozenInstanceError, dataclass, fields

__all__ = ["record"]


def _setattr(self, name, value):
    d = self.__dict__  # fields are plain instance attributes (no slots, no descriptors)
    if name in d or name not in self.__dataclass_fields__:
        raise FrozenInstanceError(f"cannot assign to field {name!r}")
    d[name] = value


def _delattr(self, name):
    raise FrozenInstanceError(f"cannot delete field {name!r}")


def _eq(self, other):
    if other.__class__ is not self.__class__:
        return NotImplemented
    names = type(self).__record_compared__
    return (tuple(getattr(self, n) for n in names)
            == tuple(getattr(other, n) for n in names))


def _hash(self):
    return hash(tuple(getattr(self, n) for n in type(self).__record_hashed__))


def _repr(self):
    shown = ", ".join(f"{n}={getattr(self, n)!r}" for n in type(self).__record_shown__)
    return f"{type(self).__qualname__}({shown})"


def record(cls=None, /, *, eq: bool = True):
    """Class decorator: a frozen dataclass (module docstring). Use as ``@record`` or
    ``@record(eq=False)``."""

    def wrap(c):
        body = dict(vars(c))  # what the class defines itself is kept, as dataclass keeps it
        c = dataclass(c, repr=False, eq=False)
        own = fields(c)
        c.__record_shown__ = tuple(f.name for f in own if f.repr)
        c.__setattr__ = _setattr
        c.__delattr__ = _delattr
        if "__repr__" not in body:
            c.__repr__ = _repr
        if eq:
            c.__record_compared__ = tuple(f.name for f in own if f.compare)
            c.__record_hashed__ = tuple(f.name for f in own
                                        if (f.compare if f.hash is None else f.hash))
            if "__eq__" not in body:
                c.__eq__ = _eq
            if body.get("__hash__") is None:
                c.__hash__ = _hash
        return c

    return wrap if cls is None else wrap(cls)
