"""Terminal output of the commands. Presentation only: no formula lives here.

Every function follows the width rules of :mod:`shaftcheck.output.layout` (no line longer than
the console, box drawing and colour only on a terminal, wide tables only when it is wide) and
prints numbers through :mod:`shaftcheck.output.numbers` (noise prints as 0, a value and its
limit never print alike when they differ, margins capped).
"""

from __future__ import annotations

import math
from contextlib import contextmanager

from shaftcheck.output.cautions import CAUTION_LINE
from shaftcheck.output.layout import Col, print_lines, print_table, print_text, width_of
from shaftcheck.output.numbers import (
    MARGIN_CAP_PCT,
    RESOLUTION,
    distinct_pair,
    fmt_margin,
    fmt_number,
)
from shaftcheck.output.terminal import make_console
from shaftcheck.units import NMRAD_TO_NMDEG

#: rich's Console on a terminal, a plain writer on a pipe (shaftcheck.output.terminal)
console = make_console()

#: a terminal at least this wide gets the check table with full titles in a box
WIDE = 120
VERDICT_STYLE = {"met": "green", "NOT MET": "bold red"}


def fmt(x, unit: str | None = None) -> str:
    """A value for a table cell: four significant figures, 0 below the resolution of ``unit``
    (see :mod:`shaftcheck.output.numbers`)."""
    return fmt_number(x, unit)


def print_caution() -> None:
    """The safety caution, wrapped to the console width."""
    print_text(console, CAUTION_LINE, hanging="", style="yellow")


# --- check ---------------------------------------------------------------------------------------
def short_id(c) -> str:
    """A check's id without its side (the side has its own column)."""
    parts = c.id.split("_")
    if c.side in ("left", "right") and c.side in parts:
        parts.remove(c.side)
    return "_".join(parts)


def check_cells(c) -> tuple[str, str, str]:
    """(value, '<= limit' or '>= limit', unit) of a check: digits enough to tell value and limit
    apart, noise as 0."""
    unit = "" if c.unit == "-" else c.unit
    if c.value is None or (isinstance(c.value, float) and math.isnan(c.value)):
        value, limit = "-", fmt_number(c.limit, c.unit)
    else:
        value, limit = distinct_pair(c.value, c.limit, c.unit)
    return value, ("<= " if c.sense == "max" else ">= ") + limit, unit


def _resolution_text() -> str:
    by_res: dict[float, list[str]] = {}
    for unit, res in RESOLUTION.items():
        if unit != "-":
            by_res.setdefault(res, []).append(unit)
    return "; ".join(f"{_power(res)} {', '.join(units)}" for res, units in sorted(by_res.items()))


def _power(x: float) -> str:
    """1e-06 -> '1e-6'."""
    mant, exp = f"{x:.0e}".split("e")
    return f"{mant}e{int(exp)}"


def check_legend() -> list[str]:
    """The conventions of the check table, printed under it."""
    return [
        "check: its id in --json output, without the side. margin: the share of the limit "
        "still free, (limit - value)/|limit| under an upper limit (<=) and (value - limit)/"
        f"|limit| over a lower limit (>=); negative = not met; beyond {MARGIN_CAP_PCT:.0f} % "
        f"shown as >+{MARGIN_CAP_PCT:.0f}%.",
        f"Values below the resolution of their unit ({_resolution_text()}) print as 0; where a "
        "value and its limit would print alike, digits are added until they differ.",
        "Stiffness mismatch: 100 |k_left - k_right| / mean of the two sides' whole stiffness. "
        "Rack travel: positive = rack towards the car's left (+y). Steering-wheel torque: "
        "positive = pull towards a left turn (the driver holds against it).",
    ]


def _detail(c) -> str | None:
    """The indented line under a check: its governing location, and, when the check has no
    value or lies outside its method (a refused computation), the reason from its note; first
    its governing variant when the design has [[variants]]."""
    parts = [c.governing_text] if c.governing_text else []
    parts += [c.location] if c.location else []
    if (math.isnan(c.value) or c.outside_method) and c.note:
        parts.append(c.note)
    return "; ".join(parts) or None


def _check_wide(result, title: str) -> None:
    from rich.table import Table  # a wide terminal only: piped output never builds a box
    from rich.text import Text

    t = Table(title=title, title_justify="left", expand=True)
    t.add_column("check (id, governing location)", ratio=1, overflow="fold")
    for col in ("side", "value", "limit", "margin", "verdict"):
        t.add_column(col, no_wrap=True, justify="right" if col in ("value", "limit", "margin")
                     else "left")
    for c in result.checks:
        value, limit, unit = check_cells(c)
        u = f" {unit}" if unit else ""
        cell = Text(c.title)
        detail = _detail(c)
        cell.append(f"\n{c.id}" + (f": {detail}" if detail else ""), style="dim")
        verdict = "met" if c.passed else "NOT MET"
        t.add_row(cell, c.side, value + u, limit + u, fmt_margin(c.margin),
                  Text(verdict, style=VERDICT_STYLE[verdict]))
    console.print(t)


def _check_compact(result, title: str) -> None:
    cols = [Col("check", key=True), Col("side"), Col("value", "right", gap=1),
            Col("limit", "right", gap=1), Col("unit", gap=1), Col("margin", "right"),
            Col("verdict")]
    rows, details = [], []
    for c in result.checks:
        value, limit, unit = check_cells(c)
        rows.append([short_id(c), c.side, value, limit, unit, fmt_margin(c.margin),
                     "met" if c.passed else "NOT MET"])
        details.append(_detail(c))

    def style(r, i):
        return VERDICT_STYLE[rows[r][6]] if i == 6 else None

    print_table(console, title, cols, rows, details=details, style=style)


def print_check(result) -> None:
    """The check table: one line per check (and its governing location indented below) in 80
    columns or a CI log; a boxed table with full titles on a terminal of at least WIDE columns.
    Then the legend, the stiffness summary, the notices, the verdict and the caution."""
    d = result.design
    title = f"{d.project.name} - rev {d.project.revision} ({d.project.date})"
    if console.is_terminal and width_of(console) >= WIDE:
        _check_wide(result, title)
    else:
        _check_compact(result, title)
    print_lines(console, [""])
    for text in check_legend():
        print_text(console, text, hanging="  ", style="dim")
    s = result.sides
    print_text(console,
               f"stiffness: left {s.left.stiffness.whole * NMRAD_TO_NMDEG:.1f} N*m/deg, right "
               f"{s.right.stiffness.whole * NMRAD_TO_NMDEG:.1f} N*m/deg, mismatch "
               f"{fmt_number(s.mismatch_pct, '%')} % of the mean; design torque "
               f"{s.left.design_torque:.0f} N*m per side")
    if getattr(result, "variants", None) is not None:
        print_variants(result.variants)
    for n in result.notices:
        print_text(console, f"note: {n}")
    failed = result.failed
    if not failed:
        print_text(console, f"VERDICT: all {len(result.checks)} checks met", style="bold green")
    else:
        print_text(console, f"VERDICT: {len(failed)} of {len(result.checks)} checks NOT met: "
                   + ", ".join(c.id + (f" ({c.governing_text})" if c.governing_text else "")
                               for c in failed), style="bold red")
    print_caution()


def print_variants(v) -> None:
    """One line per case of a vehicle line (base design and [[variants]]): verdict, failed
    checks, its worst check and margin; then which case the summary figures belong to."""
    print_lines(console, [""])
    rows = []
    for case in v.cases:
        w = case.worst
        failed = sum(not c.passed for c in case.checks)
        rows.append([case.name, "met" if case.verdict == "pass" else "NOT MET",
                     str(failed), short_id(w) + (f" {w.side}" if w.side in ("left", "right")
                                                 else "") if w else "-",
                     fmt_margin(w.margin) if w else "-"])

    def style(r, i):
        return VERDICT_STYLE[rows[r][1]] if i == 1 else None

    print_table(console, f"variants: each check above is the worst of these {len(rows)}",
                [Col("variant", key=True), Col("verdict"), Col("failed", "right"),
                 Col("worst check"), Col("margin", "right")], rows, style=style)
    print_text(console, f"governing variant (smallest margin of all): {v.governing}; the "
               "stiffness line and design torque above are its figures")


# --- materials -------------------------------------------------------------------------------
def print_materials(mats: dict) -> None:
    """The material library, each entry with its continuation lines indented."""
    print_text(console, "shaftcheck material library (a design's own [materials] table shadows "
               "these ids)", style="bold")
    for k, m in mats.items():
        print_lines(console, [""])
        print_text(console, f"{k}  {m.name}", hanging="    ", style="bold")
        print_text(console,
                   f"E {m.elastic_modulus / 1e9:.0f} GPa, G {m.shear_modulus / 1e9:.1f} GPa, nu "
                   f"{m.poisson_ratio:.3f}, {m.density:.0f} kg/m^3; S_ut "
                   f"{m.ultimate_strength / 1e6:.0f} MPa, S_y {m.yield_strength / 1e6:.0f} MPa "
                   f"({m.basis}); finish {m.surface_finish}", indent="  ", hanging="    ")
        print_text(console, f"source: {m.source}", indent="  ", hanging="    ")
    print_lines(console, [""])
    print_text(console, "Values marked [M] are from memory: verify them in the named source "
               "before release.")


# --- size ----------------------------------------------------------------------------------------
def _strip_side(check_id: str) -> str:
    return "_".join(t for t in check_id.split("_") if t not in ("left", "right"))


def _proposal_rows(ranked) -> tuple[list, list]:
    rows, details = [], []
    for p in ranked:
        r = p.to_dict()
        section = r["section"].rsplit(", ", 1)[0]  # the length is the segment's, shown above
        verdict = "passes" if r["passes_all_checks"] else (
            "fails " + ", ".join(r["failed_checks"]) if r["checked"] else "not checked")
        rows.append([section, "std" if r["standard_size"] else "free", f"{r['mass_kg']:.3f}",
                     fmt_number(r["mismatch_pct"], "%"),
                     fmt_margin(r["governing_margin"]) if r["governing_margin"] is not None
                     else "n/a", _strip_side(r["governing_check"]) or "-"])
        details.append("; ".join(x for x in (verdict if not r["passes_all_checks"] else "",
                                             r["note"]) if x) or None)
    return rows, details


def print_sizes(p, top: int, caution: bool = True) -> None:
    """Proposals for one side, lightest first, each with its governing strength margin."""
    d = p.to_dict(top)
    print_text(console,
               f"{d['side']} side: resize segment [{d['segment_index']}] ({d['segment']}) to "
               f"match {d['target_stiffness_nm_per_deg']:.1f} N*m/deg (now "
               f"{d['current_stiffness_nm_per_deg']:.1f}, mismatch "
               f"{fmt_number(d['current_mismatch_pct'], '%')} %, limit "
               f"{fmt_number(d['mismatch_limit_pct'], '%')} %); {d['kind']} sections")
    ranked = p.ranked(top)
    rows, details = _proposal_rows(ranked)
    cols = [Col("section", key=True), Col("size"), Col("kg", "right"),
            Col("mismatch %", "right"), Col("margin", "right"), Col("governing check")]

    def style(r, i):
        return None if i != 4 else ("green" if ranked[r].passes else "bold red")

    print_table(console, "proposals, lightest first (mass of the resized segment)", cols, rows,
                details=details if any(details) else None, style=style)
    best = p.lightest_passing(top)
    print_text(console, "lightest that passes every check: " + (
        best.segment.describe() + f", {best.mass:.3f} kg" if best else
        "none - the governing check is not in this segment; see shaftcheck check"))
    for r in d["rejected"]:
        print_text(console, f"not proposed: {r['kind']} {r['section']}: {r['reason']}")
    print_text(console, "size: std = a standard size, free = solved for zero mismatch. margin: "
               "the smallest margin of the side's strength checks (static, abuse, fatigue, "
               "damage, buckling, whirl) re-run with the new section, as in check; "
               f"{d['standard_within_limit']} of {d['standard_evaluated']} standard sizes meet "
               "the mismatch limit.", hanging="  ", style="dim")
    print_text(console, f"standard sizes: {d['standard_origin']}", hanging="  ", style="dim")
    if caution:
        print_caution()


def print_no_proposal(side: str, reason: str) -> None:
    """Why a side has no proposal (one wrapped line)."""
    print_text(console, f"{side} side: no proposal - {reason}")


def print_pair(pp) -> None:
    """The two-sided sizing: free optimum and a standard pair."""
    d = pp.to_dict()
    print_text(console, "both sides resized to one common stiffness (zero mismatch) for the "
               "least total mass with every strength check met; " + d["note"])
    cols = [Col("option", key=True), Col("side"), Col("section"), Col("size"),
            Col("kg", "right"), Col("N*m/deg", "right")]
    rows, details = [], []
    for o in (pp.free, pp.standard):
        if o is None:
            continue
        od = o.to_dict()
        for n in ("left", "right"):
            s = od[n]
            rows.append([od["label"] if n == "left" else "", n,
                         s["section"].rsplit(", ", 1)[0], "std" if s["standard_size"] else "free",
                         f"{s['mass_kg']:.3f}", f"{s['side_stiffness_nm_per_deg']:.1f}"])
            details.append(None)
        verdict = "passes every check" if o.passes else "fails " + ", ".join(o.failed)
        details[-1] = (f"total {o.total_mass:.3f} kg (now {pp.current_mass:.3f} kg), mismatch "
                       f"{fmt_number(o.mismatch_pct, '%')} %, margin "
                       f"{fmt_margin(o.governing_margin)} ({o.governing_check}): {verdict}")
    print_table(console, "two-sided proposals", cols, rows, details=details)
    print_text(console, "margin: the smallest margin of both sides' strength checks re-run with "
               "the new sections, as in check.", hanging="  ", style="dim")
    print_caution()


# --- bearing -------------------------------------------------------------------------------------
def print_bearing(b: dict) -> None:
    how = "placed by shaftcheck" if b["placed"] else "given in the design"
    print_text(console, f"intermediate shaft on the {b['side']} side: length "
               f"{b['length_mm']:.1f} mm ({how})")
    c = b["bearing_centre_mm"]
    print_text(console, f"bearing centre (vehicle axes): x {c[0]:.1f}, y {c[1]:.1f}, z "
               f"{c[2]:.1f} mm")
    ok = b["criterion_met"]
    value, limit = distinct_pair(b["max_angle_difference_deg"], b["angle_difference_limit_deg"],
                                 "deg")
    print_text(console, f"largest left-right angle difference over travel: {value} deg (limit "
               f"{limit} deg) -> " + ("met" if ok else "cannot be met"),
               style=None if ok else "bold red")
    a = b["angles"]
    cols = [Col("travel mm", "right", key=True)] + [
        Col(h, "right") for h in ("L inboard", "R inboard", "L outboard", "R outboard")]
    rows = [[f"{tr:+.0f}", *(fmt_number(a[k][i], "deg", decimals=2) for k in
                             ("left_inboard_deg", "right_inboard_deg", "left_outboard_deg",
                              "right_outboard_deg"))]
            for i, tr in enumerate(a["travel_mm"])]
    print_table(console, "joint angles over wheel travel (+ jounce), rack centred [deg]", cols,
                rows)
    lo = b["loads"]
    print_text(console, f"bearing radial load at design torque and pose: "
               f"{lo['radial_load_design_n']:.0f} N; shaft weight {lo['shaft_weight_n']:.1f} N")
    g = b["governing"]
    print_text(console, f"governing duty point: {g['state']}, {g['speed_kmh']:.0f} km/h, "
               f"{g['torque_nm']:.0f} N*m, travel {g['travel_mm']:+.0f} mm, rack "
               f"{g['rack_mm']:+.0f} mm: Fr {g['radial_load_n']:.0f} N, Fa "
               f"{g['axial_load_n']:.0f} N, X {g['x']:.2f}, Y {g['y']:.2f}, P "
               f"{g['equivalent_load_n']:.0f} N", hanging="  ")
    print_text(console, f"mean equivalent load over the duty P_m = X Fr + Y Fa, cubic mean: "
               f"{lo['equivalent_load_n']:.0f} N", hanging="  ")
    life = b["life"]
    more = "> " if life.get("l10_km_capped") else ""
    print_text(console, f"basic rating life L10 (ISO 281): {fmt(life['l10_million_rev'])} "
               f"million rev, {more}{fmt(life['l10_km'], 'km')} km, "
               f"{fmt(life['l10_hours'], 'h')} h at the duty's mean {life['speed_rpm']:.0f} rpm",
               hanging="  ")
    for n in b.get("notices", ()):
        print_text(console, f"note: {n}", hanging="  ")
    print_caution()


# --- sweep ---------------------------------------------------------------------------------------
def print_sweep(data: dict) -> None:
    """Joint angles and plunge of both sides: one table per quantity, rows wheel travel, columns
    rack travel (split into blocks when the columns do not fit)."""
    print_text(console, "rows: wheel travel [mm], + = jounce; columns: rack travel [mm], + = rack "
               "towards the car's left (+y)", hanging="  ")
    for side in ("left", "right"):
        for key, label, unit in (("inboard_angle_deg", "inboard joint angle", "deg"),
                                 ("outboard_angle_deg", "outboard joint angle", "deg"),
                                 ("plunge_mm", "plunge (+ longer)", "mm")):
            cols = [Col("travel", "right", key=True)] + [
                Col(f"{r:+.0f}", "right") for r in data["rack_mm"]]
            rows = [[f"{tr:+.0f}", *(fmt_number(v, unit, decimals=1)
                                     for v in data[side][key][i])]
                    for i, tr in enumerate(data["travel_mm"])]
            print_lines(console, [""])
            print_table(console, f"{side} {label} [{unit}]", cols, rows)


def _signed(x: float, decimals: int) -> str:
    """A signed number with fixed decimals; a value that rounds to zero prints as 0 (never as
    -0.000 or as numerical noise such as 8e-09)."""
    r = round(float(x), decimals)
    if r == 0.0:
        return f"{0.0:.{decimals}f}"
    return f"{r:+.{decimals}f}"


#: decimals of a steering-axis moment and of a steering-wheel torque [N*m] in the torque-steer
#: tables; a steering-wheel torque that rounds to 0 at these decimals prints as 0.000
MOMENT_DECIMALS, WHEEL_DECIMALS = 1, 3


def _verdict_style(rows: list, col: int):
    def style(r, i):
        return VERDICT_STYLE.get(rows[r][col]) if i == col else None

    return style


def print_torque_steer(ts, transient=None, checks=()) -> None:
    """The torque-steer study (a TorqueSteerResult, SI) in trade units, by the width rules of
    :mod:`shaftcheck.output.layout`: budget by mechanism, worst cases, split friction, transient
    and the study's checks (the same check cells as ``check``), then the caution."""
    md, wd = MOMENT_DECIMALS, WHEEL_DECIMALS
    print_text(console, f"Torque steer at the design torque {ts.design_torque:.0f} N*m per "
               "side. Moments about the steering axes [N*m], positive steers left; wheel: the "
               "steering-wheel torque [N*m], the pull felt at the wheel, positive = pull "
               "towards a left turn (no friction, no assistance).", hanging="")
    print_lines(console, [""])
    rows = []
    for m in (*ts.mechanisms, ts.all_mechanisms):
        rows.append(["all mechanisms" if m.key == "all" else m.short_label,
                     _signed(m.left, md), _signed(m.right, md), _signed(m.net, md),
                     _signed(m.steering_wheel, wd)])
    rows.append(["ideal joints, rigid mounts (headline)", _signed(ts.left.total, md),
                 _signed(ts.right.total, md), _signed(ts.left.total + ts.right.total, md),
                 _signed(ts.steering_wheel_torque, wd)])
    print_table(console, "", [Col("budget at the design position", key=True),
                              Col("left", "right"), Col("right", "right"), Col("net", "right"),
                              Col("wheel", "right")], rows)
    mounts = next((m for m in ts.mechanisms if m.roll_angle is not None), None)
    if mounts is not None:
        print_text(console, "powertrain roll angle on its mounts at design: "
                   f"{_signed(math.degrees(mounts.roll_angle), 3)} deg", indent="  ")
    print_text(console, f"rack force at design (headline): {_signed(ts.rack_force, 1)} N",
               indent="  ")

    print_lines(console, [""])
    rows = []
    below = 0.5 * 10.0**-wd
    for w in ts.worst_cases:
        if round(w.steering_wheel_torque, wd) == 0.0:
            rows.append([w.condition, _signed(0.0, wd), f"below {below:g} N*m everywhere", "-"])
        else:
            rows.append([w.condition, _signed(w.steering_wheel_torque, wd), w.where,
                         w.short_dominant])
    print_table(console, "worst case at the design torque", [
        Col("condition", key=True), Col("wheel N*m", "right"), Col("where"),
        Col("dominant mechanism")], rows)

    sm = ts.split_mu
    if sm is not None:
        tbr = "locked" if math.isinf(sm.torque_bias_ratio) else (
            f"torque bias ratio {sm.torque_bias_ratio:g}")
        print_lines(console, [""])
        rows = [[c.low_side, f"{c.torque_left:.0f}", f"{c.torque_right:.0f}",
                 _signed(c.steering_wheel_torque, wd)] for c in sm.cases]
        print_table(console, f"split friction (mu {sm.mu_low:g} / {sm.mu_high:g}, {tbr}), design "
                    "position", [Col("low-friction side", key=True),
                                 Col("left wheel N*m", "right"), Col("right wheel N*m", "right"),
                                 Col("wheel N*m", "right")], rows)

    if transient is not None:
        tr = transient
        diff, t_diff = tr.peak(tr.torque_difference)
        sw, t_sw = tr.peak(tr.steering_wheel_torque)
        print_lines(console, [""])
        print_text(console, f"transient ({tr.differential} differential, 0 to "
                   f"{tr.end_time * 1e3:.0f} ms after a {tr.carrier_torque:.0f} N*m step at "
                   f"the carrier): peak wheel-torque difference {fmt_number(abs(diff), 'N*m')} "
                   f"N*m at {t_diff * 1e3:.0f} ms; peak steering-wheel torque "
                   f"{_signed(sw, wd)} N*m at {t_sw * 1e3:.0f} ms.", hanging="")
        if tr.statement:
            print_text(console, tr.statement, indent="  ", hanging="  ")

    if checks:
        print_lines(console, [""])
        rows, details = [], []
        for c in checks:
            value, limit, unit = check_cells(c)
            rows.append([short_id(c), c.side, value, limit, unit, fmt_margin(c.margin),
                         "met" if c.passed else "NOT MET"])
            details.append(c.location or None)
        print_table(console, "checks", [
            Col("check", key=True), Col("side"), Col("value", "right", gap=1),
            Col("limit", "right", gap=1), Col("unit", gap=1), Col("margin", "right"),
            Col("verdict")], rows, details=details, style=_verdict_style(rows, 6))
        print_text(console, "value: the largest |steering-wheel torque| of the condition; the "
                   "indented line says where and the dominant mechanism. margin as in check.",
                   hanging="  ", style="dim")
    print_caution()


def share_pct(fraction: float) -> str:
    """A share of samples in percent, two decimals; a share above zero never prints as 0.00."""
    pct = 100.0 * fraction
    if 0 < pct < 0.005:
        return "<0.01 %"
    if 99.995 < pct < 100:
        return ">99.99 %"
    return f"{pct:.2f} %"


# print_tolerance lives in shaftcheck.output.tolerance_table (the tolerance table and ranking)


@contextmanager
def progress_bar(label: str, total: int):
    """A transient progress bar on stderr (stdout stays clean); yields ``update(done, total)``."""
    from rich.console import Console
    from rich.progress import Progress

    bar = Progress(console=Console(stderr=True), transient=True)
    task = bar.add_task(label, total=total)
    with bar:
        yield lambda done, _total: bar.update(task, completed=done)
