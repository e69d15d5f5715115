"""Numbers as the terminal shows them: resolution, significant figures, digits that tell apart.

Presentation only, no formula of the engineering lives here. Three rules:

* **Numerical noise is not data.** A value whose magnitude is below the resolution of its unit
  (:data:`RESOLUTION`) prints as ``0``, never as ``1.08e-08 deg`` or ``-0.000 N*m``. The
  resolutions are a project choice, far below what a drawing or a test rig resolves and far
  above the round-off of the computation (about 1e-12 relative).
* **Four significant figures** by default, in fixed notation from the resolution up to 1e7,
  e-notation above.
* **Rounding never hides a difference.** :func:`distinct_pair` adds digits until a value and its
  limit print differently whenever they differ, so a failed check can never read
  "1.00 deg <= 1.00 deg, NOT MET".

The margin of a check (:attr:`shaftcheck.studies.result.Check.margin`) prints through
:func:`fmt_margin`, capped at +-999 % so a huge margin cannot widen its column.
"""

from __future__ import annotations

import math

#: unit -> resolution (smallest magnitude printed as a number; below it the value prints as 0).
#: Project choice: 1e-6 of the trade unit for lengths, angles, torques, forces and percentages.
RESOLUTION: dict[str, float] = {
    "deg": 1e-6,
    "mm": 1e-6,
    "N*m": 1e-6,
    "N": 1e-6,
    "%": 1e-6,
    "MPa": 1e-6,
    "N*m/deg": 1e-6,
    "kg": 1e-6,
    "km": 1e-6,
    "h": 1e-6,
    "rpm": 1e-6,
    "-": 1e-9,
}
#: resolution of a unit not in the table (and of a dimensionless number)
DEFAULT_RESOLUTION = 1e-9
#: significant figures shown by default
SIGNIFICANT = 4
#: beyond this magnitude numbers print in e-notation
E_NOTATION_FROM = 1e7
#: margins beyond +-999 % print capped
MARGIN_CAP_PCT = 999.0
#: most decimals :func:`distinct_pair` may add (float64 holds about 16 significant figures)
MAX_EXTRA_DIGITS = 15


def resolution(unit: str | None) -> float:
    """Resolution of ``unit`` (see :data:`RESOLUTION`)."""
    return RESOLUTION.get(unit or "-", DEFAULT_RESOLUTION)


def is_noise(x: float, unit: str | None = None) -> bool:
    """True when ``x`` is below the resolution of its unit (prints as 0)."""
    return abs(x) < resolution(unit)


def _unsigned_zero(text: str) -> str:
    """'-0.000' -> '0.000': a printed zero never carries a sign."""
    if text.startswith("-") and not any(ch in "123456789" for ch in text.split("e")[0]):
        return text[1:]
    return text


def decimals_for(x: float, sig: int = SIGNIFICANT, unit: str | None = None) -> int:
    """Decimals that show ``x`` to ``sig`` significant figures, none below the resolution."""
    if x == 0 or not math.isfinite(x):
        return 0
    d = sig - 1 - math.floor(math.log10(abs(x)))
    finest = max(0, math.ceil(-math.log10(resolution(unit)) - 1e-9))
    return int(min(max(d, 0), finest))


def fmt_number(x, unit: str | None = None, sig: int = SIGNIFICANT,
               decimals: int | None = None) -> str:
    """``x`` for a table cell: ``-`` for None/NaN, ``0`` below the resolution of ``unit``,
    ``sig`` significant figures (or exactly ``decimals``), e-notation from 1e7."""
    if x is None:
        return "-"
    if isinstance(x, bool) or not isinstance(x, (int, float)):
        try:
            x = float(x)
        except (TypeError, ValueError):
            return str(x)
    x = float(x)
    if math.isnan(x):
        return "-"
    if math.isinf(x):
        return "inf" if x > 0 else "-inf"
    if is_noise(x, unit):
        return "0"
    if abs(x) >= E_NOTATION_FROM:
        return f"{x:.{max(sig - 2, 1)}e}"
    d = decimals_for(x, sig, unit) if decimals is None else decimals
    return _unsigned_zero(f"{x:.{d}f}")


def distinct_pair(value, limit, unit: str | None = None,
                  sig: int = SIGNIFICANT) -> tuple[str, str]:
    """(value, limit) printed with the same decimals, more of them when needed to tell them
    apart: two numbers that differ never print alike (up to the precision of a float).

    >>> distinct_pair(1.004, 1.0, "deg")
    ('1.004', '1.000')
    >>> distinct_pair(1.00004, 1.0, "deg")
    ('1.00004', '1.00000')
    """
    v, lim = float(value), float(limit)
    if not (math.isfinite(v) and math.isfinite(lim)) or abs(v) >= E_NOTATION_FROM \
            or abs(lim) >= E_NOTATION_FROM:
        return fmt_number(v, unit, sig), fmt_number(lim, unit, sig)
    ref = max(abs(v), abs(lim))
    d = decimals_for(ref, sig, unit) if ref > 0 else 0
    for extra in range(MAX_EXTRA_DIGITS + 1):
        sv, sl = f"{v:.{d + extra}f}", f"{lim:.{d + extra}f}"
        if v == lim or sv != sl:
            break
    sv, sl = _unsigned_zero(sv), _unsigned_zero(sl)
    if sv.strip("-0.") == "" and (sv != sl or v == lim):
        sv = "0"  # noise below the shown digits, and the pair still tells apart
    if sl.strip("-0.") == "" and (sv != sl or v == lim):
        sl = "0"
    return sv, sl


def fmt_margin(margin: float, cap_pct: float = MARGIN_CAP_PCT) -> str:
    """A check's margin (a fraction, see ``Check.margin``) in percent: one decimal below 10 %,
    more when it would round to zero, capped at +-``cap_pct`` %, ``n/a`` when undefined."""
    if margin is None or math.isnan(margin) or math.isinf(margin):
        return "n/a"
    pct = 100.0 * margin
    if pct > cap_pct:
        return f">+{cap_pct:.0f}%"
    if pct < -cap_pct:
        return f"<-{cap_pct:.0f}%"
    d = 0 if abs(pct) >= 9.5 else 1
    while pct != 0 and float(f"{pct:.{d}f}") == 0 and d < 6:
        d += 1
    return _unsigned_zero(f"{pct:+.{d}f}") + "%"
