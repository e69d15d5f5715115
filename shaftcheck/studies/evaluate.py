"""Evaluate a design: run every study once on a shared context and collect the :class:`Result`.

Each study has the same contract, ``run(design, ctx) -> (StudyResult, list[Check])``; the
context (:class:`~shaftcheck.studies.context.Context`) computes the load cases, the side
stiffness, the corner poses (one solve per side on the union of every grid) and the
intermediate-shaft lengths once. No I/O. The transient torque-steer simulation is a stiff ODE
solve that only the torque-steer command and the report show: it runs only when asked.
"""

from __future__ import annotations

from shaftcheck.studies.context import GEOMETRY_RACK_POINTS, GEOMETRY_TRAVEL_POINTS, Context
from shaftcheck.studies.result import Result


def evaluate(design, *, travel_points: int = GEOMETRY_TRAVEL_POINTS,
             rack_points: int = GEOMETRY_RACK_POINTS, transient: bool = False,
             ctx: Context | None = None) -> Result:
    """Every check of a design (trade-unit checks, SI study results).

    travel_points, rack_points: grid of the geometry study over the travel and rack ranges.
    transient: also run the transient torque-steer study (the report and the torque-steer
    command ask for it). ctx: a context to reuse (it must belong to ``design``).
    """
    from shaftcheck.studies import bearing, duty_cycle, geometry, sides, strength, torque_steer

    ctx = ctx or Context(design, travel_points=travel_points, rack_points=rack_points)
    checks: list = []

    def take(study, legacy=None):
        run = getattr(study, "run", None) or legacy
        res, found = run(design, ctx)
        checks.extend(found)
        return res

    sides_res = take(sides)
    geometry_res = take(geometry)
    bearings_res = take(bearing)
    strength_res = take(strength, _strength_legacy)
    torque_res = take(torque_steer, _torque_steer_legacy)
    duty_res = take(duty_cycle)
    transient_res = None
    if transient and _has_transient_study():
        from shaftcheck.studies import transient as transient_study

        transient_res = take(transient_study)
    notices = list(getattr(design, "notices", ()))
    for res in (strength_res, torque_res, transient_res, duty_res, *bearings_res.values()):
        for n in getattr(res, "notices", ()) or ():
            if n not in notices:
                notices.append(n)
    for b in bearings_res.values():
        for n in getattr(b.life, "notices", ()) or ():
            if n not in notices:
                notices.append(n)
    return Result(design, tuple(checks), tuple(notices), dict(ctx.cases), sides_res,
                  geometry_res, bearings_res, strength_res, torque_res, transient_res,
                  duty_cycle=duty_res)


# --- transitional adapters for studies not yet on the contract (removed when they move) ------
class _Section:
    """A study's JSON section standing in for its typed result."""

    def __init__(self, data: dict, notices=()):
        self.data, self.notices = data, tuple(notices)

    def to_dict(self) -> dict:
        return dict(self.data)


def _strength_legacy(design, ctx):
    from shaftcheck.studies import strength

    data, checks = strength.strength_study(design)
    return _Section(data), checks


def _torque_steer_legacy(design, ctx):
    from shaftcheck.studies import torque_steer

    data = torque_steer.pull_study(design, intermediate_lengths=ctx.intermediate_lengths)
    return _Section(data), torque_steer.pull_checks(design, data)


def design_geometry(design, intermediate_lengths: dict | None = None) -> dict:
    """Joint geometry of both sides at design as the older plain dict (SI)."""
    ctx = Context(design)
    if intermediate_lengths is not None:
        ctx.__dict__["intermediate_lengths"] = dict(intermediate_lengths)
    return {n: {"I": g.inboard_centre, "d": g.output_axis, "O": g.outboard_centre,
                "W": g.wheel_centre, "b": g.spindle_axis, "inboard_angle": g.inboard_angle,
                "outboard_angle": g.outboard_angle, "length": g.length,
                "shaft_axis": g.shaft_axis} for n, g in ctx.design_geometry.items()}


def _has_transient_study() -> bool:
    import importlib.util

    return importlib.util.find_spec("shaftcheck.studies.transient") is not None
