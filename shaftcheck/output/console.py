"""Terminal output of the commands (rich tables). Presentation only: no formula lives here."""

from __future__ import annotations

import math
from contextlib import contextmanager

from rich.console import Console
from rich.table import Table

from shaftcheck.output.cautions import CAUTION_LINE
from shaftcheck.units import NMRAD_TO_NMDEG

console = Console()


def fmt(x) -> str:
    """A value for a table cell: about four significant figures."""
    if x is None:
        return "-"
    if isinstance(x, float):
        if math.isnan(x):
            return "-"
        if math.isinf(x):
            return "inf"
        if x != 0 and (abs(x) >= 1e6 or abs(x) < 1e-3):
            return f"{x:.3g}"
        if abs(x) >= 100:
            return f"{x:,.1f}"
        return f"{x:.3f}" if abs(x) < 10 else f"{x:.2f}"
    return str(x)


def _margin(m: float) -> str:
    if math.isinf(m):
        return "-"
    return f"{100 * m:+.0f} %"


def print_check(result) -> None:
    d = result.design
    t = Table(title=f"{d.project.name} - rev {d.project.revision} ({d.project.date})",
              title_justify="left", show_lines=False, expand=True)
    t.add_column("check (governing location)", ratio=1, overflow="fold")
    t.add_column("side", no_wrap=True)
    t.add_column("value", justify="right", no_wrap=True)
    t.add_column("limit", justify="right", no_wrap=True)
    t.add_column("margin", justify="right", no_wrap=True)
    t.add_column("verdict", no_wrap=True)
    for c in result.checks:
        unit = "" if c.unit == "-" else f" {c.unit}"
        where = f"\n[dim]{c.location}[/dim]" if c.location else ""
        t.add_row(f"{c.title}{where}", c.side, fmt(c.value) + unit,
                  ("<= " if c.sense == "max" else ">= ") + fmt(c.limit) + unit,
                  _margin(c.margin),
                  "[green]met[/green]" if c.passed else "[bold red]NOT MET[/bold red]")
    console.print(t)
    s = result.sides
    console.print(
        f"stiffness: left {s.left.stiffness.whole * NMRAD_TO_NMDEG:.1f} N*m/deg, right "
        f"{s.right.stiffness.whole * NMRAD_TO_NMDEG:.1f} N*m/deg, mismatch "
        f"{s.mismatch_pct:.2f} % of the mean; design torque "
        f"{s.left.design_torque:.0f} N*m per side")
    for n in result.notices:
        console.print(f"note: {n}")
    n_fail = len(result.failed)
    if n_fail == 0:
        console.print(f"[bold green]VERDICT: all {len(result.checks)} checks met[/bold green]")
    else:
        console.print(f"[bold red]VERDICT: {n_fail} of {len(result.checks)} checks NOT met"
                      "[/bold red]")
    console.print(CAUTION_LINE, style="yellow")


def print_materials(mats: dict) -> None:
    console.print("[bold]shaftcheck material library[/bold] (a design's own \\[materials] table "
                  "shadows these ids)", markup=True, highlight=False)
    for k, m in mats.items():
        console.print(f"\n[bold]{k}[/bold]  {m.name}", highlight=False)
        console.print(f"  E {m.elastic_modulus / 1e9:.0f} GPa, G {m.shear_modulus / 1e9:.1f} GPa, "
                      f"nu {m.poisson_ratio:.3f}, {m.density:.0f} kg/m^3; S_ut "
                      f"{m.ultimate_strength / 1e6:.0f} MPa, S_y {m.yield_strength / 1e6:.0f} MPa "
                      f"({m.basis}); finish {m.surface_finish}", highlight=False)
        console.print(f"  source: {m.source}", highlight=False, markup=False)
    console.print("\nValues marked [M] are from memory: verify them in the named source before "
                  "release.", markup=False)


def print_sizes(p, top: int) -> None:
    d = p.to_dict(top)
    console.print(f"resize {d['side']} segment [{d['segment_index']}] ({d['segment']}) to match "
                  f"{d['target_stiffness_nm_per_deg']:.1f} N*m/deg (now "
                  f"{d['current_stiffness_nm_per_deg']:.1f}, mismatch "
                  f"{d['current_mismatch_pct']:.2f} %)")
    t = Table(title="proposals, lightest first (mass of the resized segment)",
              title_justify="left")
    for col in ("proposal", "section", "kg", "mismatch", "shear", "static SF"):
        t.add_column(col, no_wrap=col != "section", justify="left" if col in
                     ("proposal", "section") else "right")
    for r in d["free"] + d["standard"]:
        t.add_row(r["kind"], r["section"], f"{r['mass_kg']:.2f}", f"{r['mismatch_pct']:.2f} %",
                  f"{r['nominal_shear_mpa']:.0f} MPa", f"{r['static_safety']:.2f}")
    console.print(t)
    console.print("shear: nominal at the design torque; static SF: S_sy / nominal shear (no "
                  "stress concentration; run check for the full assessment)")
    console.print(f"standard sizes: {d['standard_origin']}")
    console.print(CAUTION_LINE, style="yellow")


def print_bearing(b: dict) -> None:
    console.print(f"intermediate shaft on the {b['side']} side: length {b['length_mm']:.1f} mm "
                  f"({'placed by shaftcheck' if b['placed'] else 'given in the design'})")
    c = b["bearing_centre_mm"]
    console.print(f"bearing centre (vehicle axes): x {c[0]:.1f}, y {c[1]:.1f}, z {c[2]:.1f} mm")
    ok = b["criterion_met"]
    console.print(f"largest left-right angle difference over travel: "
                  f"{b['max_angle_difference_deg']:.3f} deg (limit "
                  f"{b['angle_difference_limit_deg']:.2f} deg) -> "
                  + ("[green]met[/green]" if ok else "[bold red]cannot be met[/bold red]"))
    t = Table(title="joint angles over wheel travel, rack centred (deg)", title_justify="left")
    for col in ("travel mm", "L inboard", "R inboard", "L outboard", "R outboard"):
        t.add_column(col, justify="right")
    a = b["angles"]
    for i, tr in enumerate(a["travel_mm"]):
        t.add_row(f"{tr:+.0f}", *(f"{a[k][i]:.2f}" for k in
                                  ("left_inboard_deg", "right_inboard_deg",
                                   "left_outboard_deg", "right_outboard_deg")))
    console.print(t)
    lo = b["loads"]
    console.print(f"bearing radial load at design torque: {lo['radial_load_design_n']:.0f} N; "
                  f"equivalent duty-cycle load {lo['equivalent_load_n']:.0f} N")
    life = b["life"]
    console.print(f"basic rating life L10 (ISO 281): {fmt(life['l10_million_rev'])} million rev, "
                  f"{fmt(life['l10_hours'])} h at {life['speed_rpm']:.0f} rpm, "
                  f"{fmt(life['l10_km'])} km")
    console.print(CAUTION_LINE, style="yellow")


def print_sweep(data: dict) -> None:
    for side in ("left", "right"):
        for key, label, unit in (("inboard_angle_deg", "inboard joint angle", "deg"),
                                 ("outboard_angle_deg", "outboard joint angle", "deg"),
                                 ("plunge_mm", "plunge (+ longer)", "mm")):
            t = Table(title=f"{side} side: {label} [{unit}]; rows wheel travel [mm], columns "
                      "rack travel [mm]", title_justify="left")
            t.add_column("travel", justify="right")
            for r in data["rack_mm"]:
                t.add_column(f"{r:+.0f}", justify="right")
            for i, tr in enumerate(data["travel_mm"]):
                t.add_row(f"{tr:+.0f}", *(f"{v:.1f}" for v in data[side][key][i]))
            console.print(t)


def _signed(x: float, decimals: int) -> str:
    """A signed number with fixed decimals; a value that rounds to zero prints as 0 (never as
    -0.000 or as numerical noise such as 8e-09)."""
    r = round(float(x), decimals)
    if r == 0.0:
        return f"{0.0:.{decimals}f}"
    return f"{r:+.{decimals}f}"


def print_torque_steer(ts, transient=None, checks=()) -> None:
    """The torque-steer study (a TorqueSteerResult, SI) in trade units, at most 80 columns:
    budget by mechanism, worst cases, split friction, transient and the study's checks."""
    import textwrap

    def line(text: str = "") -> None:
        console.print(text, markup=False, highlight=False, soft_wrap=True)

    def row(label, values, decimals=1, width=36):
        cells = "".join(f"{_signed(v, d):>9}" for v, d in zip(values, decimals, strict=True))
        line(f"  {label:<{width}}{cells}")

    for text in textwrap.wrap(
            f"Torque steer at the design torque {ts.design_torque:.0f} N*m per side. Moments "
            "about the steering axes in N*m, positive steers left; \"wheel\" is the "
            "steering-wheel torque, the pull felt at the wheel, positive to the left (no "
            "friction, no assistance).", 78):
        line(text)
    line()
    line(f"  {'budget at the design position':<36}{'left':>9}{'right':>9}{'net':>9}"
         f"{'wheel':>9}")
    for m in (*ts.mechanisms, ts.all_mechanisms):
        label = "all mechanisms" if m.key == "all" else m.short_label
        row(label, (m.left, m.right, m.net, m.steering_wheel), (1, 1, 1, 3))
    row("ideal joints, rigid mounts (headline)", (ts.left.total, ts.right.total,
                                                  ts.left.total + ts.right.total,
                                                  ts.steering_wheel_torque), (1, 1, 1, 3))
    mounts = next((m for m in ts.mechanisms if m.roll_angle is not None), None)
    if mounts is not None:
        line(f"  powertrain roll angle on its mounts at design: "
             f"{_signed(math.degrees(mounts.roll_angle), 3)} deg")
    line(f"  rack force at design (headline): {_signed(ts.rack_force, 1)} N")
    line()
    line(f"  {'worst case at design torque':<30}{'wheel N*m':>10}  {'where':<22}dominant")
    for w in ts.worst_cases:
        if round(w.steering_wheel_torque, 3) == 0.0:
            line(f"  {w.condition:<30}{_signed(0.0, 3):>10}  below 0.0005 N*m everywhere")
            continue
        line(f"  {w.condition:<30}{_signed(w.steering_wheel_torque, 3):>10}  {w.where:<22}"
             f"{w.short_dominant}")
    sm = ts.split_mu
    if sm is not None:
        tbr = "locked" if math.isinf(sm.torque_bias_ratio) else f"TBR {sm.torque_bias_ratio:g}"
        line()
        line(f"  split friction (mu {sm.mu_low:g} / {sm.mu_high:g}, {tbr}), design position:")
        for c in sm.cases:
            line(f"    low friction {c.low_side:<5}: wheel torques {c.torque_left:.0f} / "
                 f"{c.torque_right:.0f} N*m, steering wheel "
                 f"{_signed(c.steering_wheel_torque, 3)} N*m")
    if transient is not None:
        tr = transient
        diff, t_diff = tr.peak(tr.torque_difference)
        sw, t_sw = tr.peak(tr.steering_wheel_torque)
        line()
        line(f"  transient ({tr.differential} differential, {tr.end_time * 1e3:.0f} ms after "
             f"a {tr.carrier_torque:.0f} N*m step at the carrier):")
        line(f"    peak wheel-torque difference {abs(diff):.2f} N*m at {t_diff * 1e3:.0f} ms; "
             f"peak steering-wheel")
        line(f"    torque {_signed(sw, 3)} N*m at {t_sw * 1e3:.0f} ms")
        for text in textwrap.wrap(tr.statement, 76):
            line(f"    {text}")
    if checks:
        line()
        for c in checks:
            verdict = "met" if c.passed else "NOT MET"
            line(f"  {c.id:<32}{c.value:>8.3f} <= {c.limit:g} {c.unit:<5} {verdict}")
            for text in textwrap.wrap(c.location, 72):
                line(f"      {text}")
    console.print(CAUTION_LINE, style="yellow")


def print_tolerance(res: dict) -> None:
    t = Table(title=f"Monte Carlo of tolerances, {res['samples']} samples (seed {res['seed']})",
              title_justify="left")
    for col in ("quantity", "nominal", "mean", "-3 sigma", "+3 sigma", "over limit"):
        t.add_column(col, justify="right" if col != "quantity" else "left")
    labels = {"stiffness_mismatch_pct": "stiffness mismatch [%]",
              "inboard_angle_difference_deg": "inboard angle difference [deg]",
              "outboard_angle_difference_deg": "outboard angle difference [deg]"}
    for q in res["quantities"]:
        t.add_row(labels.get(q["name"], q["name"]), fmt(q["nominal"]), fmt(q["mean"]),
                  fmt(q["p_low"]),
                  fmt(q["p_high"]), f"{100 * q['fraction_over_limit']:.2f} %")
    console.print(t)
    console.print(CAUTION_LINE, style="yellow")


@contextmanager
def progress_bar(label: str, total: int):
    """A transient progress bar on stderr (stdout stays clean); yields ``update(done, total)``."""
    from rich.progress import Progress

    bar = Progress(console=Console(stderr=True), transient=True)
    task = bar.add_task(label, total=total)
    with bar:
        yield lambda done, _total: bar.update(task, completed=done)
