"""Terminal output of ``shaftcheck spectrum``: the counting, the bins and the TOML block.

Presentation only: prints a :class:`~shaftcheck.studies.duty_cycle.SpectrumResult` (SI torques
are N*m already) in at most the console width, and writes the ``[[loads.spectrum]]`` block a
design file takes (:func:`spectrum_toml`).
"""

from __future__ import annotations

from shaftcheck.output.console import console
from shaftcheck.output.layout import Col, print_lines, print_table, print_text


def _count(x: float) -> str:
    return f"{x:,.0f}" if x >= 1000 else f"{x:.4g}"


def _scale_text(res) -> str:
    if not res.scaled:
        return ("Scale-up: none given (--distance-km and --life-km); the cycles are as "
                "measured (1 repeat).")
    return (f"Scale-up: design life {res.life / 1e3:,.6g} km / recorded distance "
            f"{res.distance / 1e3:,.6g} km = {_count(res.repeats)} repeats of the history.")


def spectrum_toml(res) -> str:
    """The ``[[loads.spectrum]]`` entries of ``res`` as TOML text to paste into a design file
    (with a comment naming the source and the scale-up)."""
    b = res.binned
    name = res.source if len(res.source) <= 70 else "..." + res.source[-67:]
    lines = ["# duty cycle: rainflow count (ASTM E1049-85) of", f"#   {name}",
             f"# {len(b.range_edges) - 1} range x {len(b.mean_edges) - 1} mean bins, each at "
             "its largest range and |mean|;", f"# {_count(res.repeats)} repeats of the history"]
    if not b.bins:
        lines.append("# no cycle with a torque range: nothing to write")
    for x in b.bins:
        lines += ["[[loads.spectrum]]", f"torque_min_nm = {x.torque_min:.1f}",
                  f"torque_max_nm = {x.torque_max:.1f}", f"cycles = {x.cycles:.1f}"]
    return "\n".join(lines) + "\n"


def print_spectrum(res, toml_written: str | None = None, chart_written: str | None = None
                   ) -> None:
    """The counting per side, the scale-up, the bins and the TOML block (or where it went)."""
    print_text(console, f"Rainflow count (ASTM E1049-85) of {res.source}: {res.samples:,} "
               f"samples over {res.duration:,.2f} s.", hanging="  ")
    rows = [[s, f"{c.reversals:,}", f"{c.cycles:,.1f}", f"{c.torque_min:.1f}",
             f"{c.torque_max:.1f}", f"{c.largest_range:.1f}"] for s, c in res.sides.items()]
    print_table(console, "", [Col("side", key=True), Col("reversals", "right"),
                              Col("cycles", "right"), Col("T min [N*m]", "right"),
                              Col("T max [N*m]", "right"), Col("largest range", "right")], rows)
    print_text(console, _scale_text(res), hanging="  ")
    b = res.binned
    print_lines(console, [""])
    sides = list(res.sides)
    rows = [[str(i), f"{x.torque_min:.1f}", f"{x.torque_max:.1f}",
             *(f"{x.counted.get(s, 0.0):,.1f}" for s in sides), f"{x.cycles:,.0f}"]
            for i, x in enumerate(b.bins)]
    print_table(console, f"[[loads.spectrum]] bins: {len(b.range_edges) - 1} ranges x "
                f"{len(b.mean_edges) - 1} means, each at its largest range and largest |mean|; "
                "cycles = larger side x repeats, rounded up",
                [Col("bin", "right", key=True), Col("T min [N*m]", "right"),
                 Col("T max [N*m]", "right"), *(Col(f"{s} counted", "right") for s in sides),
                 Col("cycles", "right")], rows)
    if b.dropped:
        print_text(console, f"{b.dropped:,.1f} cycles of zero range left out.", hanging="  ")
    print_lines(console, [""])
    if toml_written:
        print_text(console, f"wrote the [[loads.spectrum]] block to {toml_written}",
                   hanging="  ")
    else:
        print_text(console, "Paste into the design file (or give [loads] torque_history = "
                   f"\"{res.source}\" to use every counted cycle):", hanging="  ")
        print_lines(console, spectrum_toml(res).splitlines())
    if chart_written:
        print_text(console, f"wrote the histogram chart to {chart_written}", hanging="  ")
