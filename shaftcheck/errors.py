"""Exceptions of shaftcheck.

Every error a user can cause is a :class:`DesignError` (a ``ValueError``): one line naming the key
path, the offending value with its unit, the rule it breaks and, where it helps, the nearest valid
key or id. The CLI prints ``str(error)`` and exits with status 2; nothing else is shown.
"""

from __future__ import annotations


class ShaftcheckError(ValueError):
    """Base class of every error shaftcheck raises on purpose."""


class DesignError(ShaftcheckError):
    """Bad input: a design file, a material file or a table file breaks a rule.

    ``path`` is the key path (``right.segments[1].wall_mm``) or a file location; ``message`` says
    what is wrong. ``str()`` gives the one line shown to the user.
    """

    def __init__(self, path: str, message: str):
        self.path = path
        self.message = message
        # "key = value ...: rule" reads as one sentence; other messages follow "key: "
        sep = " " if message.startswith("= ") else ": "
        super().__init__(f"{path}{sep}{message}" if path else message)


class UnreachablePoseError(ShaftcheckError):
    """The suspension linkage cannot reach a requested pose (travel, rack)."""

    def __init__(self, side: str, travel_mm: float, rack_mm: float, reason: str):
        self.side = side
        self.travel_mm = travel_mm
        self.rack_mm = rack_mm
        self.reason = reason
        super().__init__(
            f"suspension.{side}: pose travel {travel_mm:+.1f} mm, rack {rack_mm:+.1f} mm "
            f"cannot be reached: {reason}"
        )
