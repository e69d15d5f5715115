"""Write the invented measured duty cycle of the Wren demo: example_designs/wren_line_history.csv.

Nothing here is measured. The history is generated, seeded and deterministic: a sequence of
driving events (cruise, brisk acceleration with a gear shift, full-throttle launch with driveline
shuffle, overrun, cornering with body roll, a parking manoeuvre at full lock) drawn from a fixed
random generator, smoothed and given a little measurement noise. It exists so that the demo and
the tests have a history with the columns a real recording would have (the format is described
in shaftcheck/io/history_csv.py and docs/methods.md §2.4).

    python tools/make_history.py                 # 10 minutes at 100 Hz -> the example file
    python tools/make_history.py --out h.csv --minutes 60 --rate 500

:func:`make_history` returns the arrays in memory (the spectrum benchmark uses it).
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[1]
OUT = ROOT / "example_designs" / "wren_line_history.csv"
SEED = 20261203

#: torque level of the customer-usage mix relative to the event levels below (invented: the
#: events describe a hard proving-ground drive; the demo history is a milder everyday mix)
LEVEL = 0.55
#: event kinds and how often they are drawn (invented)
EVENTS = (("cruise", 0.34), ("accelerate", 0.24), ("overrun", 0.18), ("corner", 0.14),
          ("launch", 0.05), ("park", 0.05))


def _smooth(x: np.ndarray, samples: int) -> np.ndarray:
    """Moving average with a Hann window of ``samples`` (a gentle low-pass), same length."""
    samples = max(int(samples), 1)
    if samples < 3:
        return x
    w = np.hanning(samples)
    w /= w.sum()
    pad = samples // 2
    y = np.convolve(np.pad(x, (pad, samples - 1 - pad), mode="edge"), w, mode="valid")
    return y[: x.size]


def _event(kind: str, rng, rate: float):
    """(duration [s], torque target, rack [mm], roll [mm], road roughness [mm]) of one event;
    the profiles are arrays over the event's samples."""
    if kind == "cruise":
        dur = rng.uniform(15.0, 50.0)
    elif kind == "accelerate":
        dur = rng.uniform(4.0, 9.0)
    elif kind == "launch":
        dur = rng.uniform(2.5, 4.0)
    elif kind == "overrun":
        dur = rng.uniform(3.0, 10.0)
    elif kind == "corner":
        dur = rng.uniform(4.0, 10.0)
    else:
        dur = rng.uniform(8.0, 16.0)
    n = max(int(dur * rate), 2)
    s = np.linspace(0.0, 1.0, n)
    rack = np.zeros(n)
    roll = np.zeros(n)
    rough = 6.0
    if kind == "cruise":
        level = rng.uniform(60.0, 220.0)
        torque = level * (1 + 0.25 * np.sin(2 * np.pi * s * rng.uniform(1, 4)))
        rack = rng.uniform(-8, 8) * np.sin(np.pi * s)
        rough = rng.choice([4.0, 8.0, 18.0], p=[0.5, 0.35, 0.15])
    elif kind == "accelerate":
        peak = rng.uniform(350.0, 850.0)
        torque = peak * np.clip(s / 0.08, 0, 1) * np.clip((1 - s) / 0.1, 0, 1)
        shift = (s > 0.45) & (s < 0.45 + 0.35 / dur)
        torque[shift] = 0.05 * peak
        torque[s > 0.5] *= 0.7  # second gear
    elif kind == "launch":
        peak = rng.uniform(950.0, 1250.0)
        torque = peak * np.clip(s / 0.06, 0, 1) * np.clip((1 - s) / 0.15, 0, 1)
        tt = s * dur
        torque *= 1 + 0.15 * np.exp(-tt / 0.6) * np.sin(2 * np.pi * 4.5 * tt)  # shuffle
        shift = (s > 0.55) & (s < 0.55 + 0.3 / dur)
        torque[shift] = 0.05 * peak
    elif kind == "overrun":
        torque = -rng.uniform(40.0, 180.0) * np.clip(s / 0.1, 0, 1) * np.clip((1 - s) / 0.1, 0, 1)
    elif kind == "corner":
        torque = rng.uniform(100.0, 400.0) * np.ones(n)
        turn = np.sin(np.pi * s) ** 2
        sign = rng.choice([-1.0, 1.0])
        rack = sign * rng.uniform(20.0, 55.0) * turn
        roll = -sign * rng.uniform(12.0, 30.0) * turn
    else:  # park: creeping at full lock, both ways
        torque = rng.uniform(40.0, 150.0) * (0.6 + 0.4 * np.sin(2 * np.pi * s * 3) ** 2)
        rack = rng.uniform(60.0, 70.0) * np.sin(2 * np.pi * s)
        rough = 2.0
    return dur, torque, rack, roll, rough


def make_history(minutes: float = 10.0, rate: float = 100.0, seed: int = SEED) -> dict:
    """The invented history: time [s], torque per side [N*m], travel per side [mm], rack [mm].

    Deterministic for a given (minutes, rate, seed). Torque is the drive torque of each
    halfshaft (open differential: equal shares plus a small difference), travel is jounce
    positive, rack + towards the car's left.
    """
    rng = np.random.default_rng(seed)
    n = int(round(minutes * 60.0 * rate)) + 1
    torque, rack, roll, rough = (np.zeros(n) for _ in range(4))
    kinds, p = zip(*EVENTS, strict=True)
    i, kind = 0, "launch"  # the recording starts with a launch from standstill
    while i < n:
        _, tq, rk, rl, rg = _event(kind, rng, rate)
        kind = rng.choice(kinds, p=p)
        j = min(i + tq.size, n)
        torque[i:j], rack[i:j], roll[i:j] = tq[: j - i], rk[: j - i], rl[: j - i]
        rough[i:j] = rg
        i = j
    torque = _smooth(torque, 0.12 * rate)
    rack = _smooth(rack, 0.5 * rate)
    roll = _smooth(roll, 0.4 * rate)
    body = _smooth(rng.normal(0.0, 1.0, n), 0.6 * rate) * np.sqrt(0.6 * rate)
    travel = {}
    noise = {}
    for k, side in enumerate(("left", "right")):
        hop = _smooth(rng.normal(0.0, 1.0, n), rate / 12.0) * np.sqrt(rate / 12.0)
        road = _smooth(rough, rate) * (0.7 * body + 0.3 * hop)
        travel[side] = np.clip((roll if k == 0 else -roll) + road, -75.0, 85.0)
        noise[side] = _smooth(rng.normal(0.0, 6.0, n), rate / 20.0) * np.sqrt(rate / 20.0) / 2
    time = np.arange(n) / rate
    return {"time_s": time,
            "torque_left_nm": LEVEL * torque * 1.00 + noise["left"],
            "torque_right_nm": LEVEL * torque * 0.985 + noise["right"],
            "travel_left_mm": travel["left"], "travel_right_mm": travel["right"],
            "rack_mm": np.clip(rack, -72.0, 72.0)}


def to_csv(data: dict) -> str:
    """CSV text: the header row with units, time to 0.01 s (0.001 s above 100 Hz), the rest to
    0.1 of their unit."""
    names = list(data)
    t = data["time_s"]
    dt = float(t[1] - t[0]) if t.size > 1 else 1.0
    td = 2 if dt >= 0.01 - 1e-12 else 3
    cols = [np.char.mod(f"%.{td}f" if name == "time_s" else "%.1f",
                        np.round(data[name], td if name == "time_s" else 1) + 0.0)
            for name in names]
    rows = [",".join(r) for r in zip(*cols, strict=True)]
    return ",".join(names) + "\n" + "\n".join(rows) + "\n"


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--out", default=str(OUT))
    ap.add_argument("--minutes", type=float, default=10.0)
    ap.add_argument("--rate", type=float, default=100.0)
    ap.add_argument("--seed", type=int, default=SEED)
    args = ap.parse_args(argv)
    sys.path.insert(0, str(ROOT))
    from shaftcheck.output.files import write_text_atomic

    text = to_csv(make_history(args.minutes, args.rate, args.seed))
    write_text_atomic(args.out, text, overwrite=True)
    print(f"wrote {args.out}: {len(text):,} bytes")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
