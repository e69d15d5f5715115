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
    if getattr(ctx, "bearing_pose_duty", "") is None:  # a measured history's time at each pose
        ctx.bearing_pose_duty = duty_cycle.bearing_pose_duty(design, ctx.pose_time)
    checks: list = []

    def take(study):
        res, found = study.run(design, ctx)
        checks.extend(found)
        return res

    sides_res = take(sides)
    geometry_res = take(geometry)
    bearings_res = take(bearing)
    strength_res = take(strength)
    torque_res = take(torque_steer)
    duty_res = take(duty_cycle)
    transient_res = None
    if transient:
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
