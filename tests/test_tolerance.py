"""The tolerance study streams its samples: exact running statistics, histogram percentiles within
their stated resolution, memory that does not grow with the number of samples (issue 16).

Reference values are computed here with numpy on all the samples kept in memory (a run small
enough to keep): ``numpy.mean``, ``numpy.std`` (population, ``ddof=0``) and ``numpy.percentile``
with its default "linear" method (numpy reference documentation, ``numpy.percentile``). These are
independent computations of the same statistics, not regression values.
"""

from __future__ import annotations

import json
import math
import tracemalloc

import numpy as np
import pytest
from conftest import TUBULAR, run_cli

from shaftcheck.methods.tolerance_sampling import RunningSummary
from shaftcheck.studies.tolerance import (
    CHUNK,
    MAX_SAMPLES,
    P_HIGH,
    P_LOW,
    QUANTITIES,
    run,
    tolerance_chunks,
    tolerance_study,
)

N = 2 * CHUNK + 7001  # three chunks, the last one partial


@pytest.fixture(scope="module")
def streamed():
    from shaftcheck.io.design_file import load_design

    design = load_design(TUBULAR)
    res = tolerance_study(design, N, seed=7)
    kept = {q: np.concatenate([c[q] for c in tolerance_chunks(design, N, seed=7)])
            for q in QUANTITIES}
    return design, res, kept


def test_stream_is_the_study_s_samples(streamed):
    _, res, kept = streamed
    assert all(len(kept[q]) == N for q in QUANTITIES) and res["samples"] == N


@pytest.mark.parametrize("name", QUANTITIES)
def test_mean_std_and_share_over_the_limit_are_exact(streamed, name):
    _, res, kept = streamed
    q = next(x for x in res["quantities"] if x["name"] == name)
    x = kept[name]
    # running sums against numpy's two-pass sums: equal to rounding (1e-12 relative)
    assert q["mean"] == pytest.approx(float(np.mean(x)), rel=1e-12)
    assert q["std"] == pytest.approx(float(np.std(x)), rel=1e-10)
    assert q["fraction_over_limit"] == float(np.count_nonzero(x > q["limit"])) / N  # exact
    assert q["minimum"] == float(x.min()) and q["maximum"] == float(x.max())


@pytest.mark.parametrize("name", QUANTITIES)
def test_percentiles_within_the_stated_resolution(streamed, name):
    _, res, kept = streamed
    q = next(x for x in res["quantities"] if x["name"] == name)
    lo, hi = np.percentile(kept[name], [P_LOW, P_HIGH])
    assert q["p_resolution"] > 0
    assert abs(q["p_low"] - lo) <= q["p_resolution"], (q["p_low"], lo)
    assert abs(q["p_high"] - hi) <= q["p_resolution"], (q["p_high"], hi)
    # and the resolution is fine compared with the spread it describes
    assert q["p_resolution"] < 1e-3 * (q["maximum"] - q["minimum"])


def test_json_keys_are_kept():
    proc = run_cli("tolerance", TUBULAR, "-n", "500", "--json")
    assert proc.returncode in (0, 1), proc.stderr
    data = json.loads(proc.stdout)
    for key in ("samples", "seed", "tolerances_mm", "basis", "quantities", "percentiles",
                "criterion", "verdict", "sensitivity_method", "sampled_inputs"):
        assert key in data
    assert data["percentiles"] == {"p_low": P_LOW, "p_high": P_HIGH}
    for q in data["quantities"]:
        for key in ("name", "label", "unit", "nominal", "mean", "std", "p_low", "p_high",
                    "limit", "fraction_over_limit", "share_over_limit_pct", "p_resolution",
                    "first_order_sum", "share_noise"):
            assert isinstance(q[key], (int, float, str)), key
        assert q["unit"] in ("%", "deg") and isinstance(q["passed"], bool)
        assert len(q["sensitivity"]) == data["sampled_inputs"]
    assert data["max_samples"] == MAX_SAMPLES
    # the exit status is the verdict: 0 every share within the criterion, 1 some share above
    assert proc.returncode == (0 if data["verdict"] == "pass" else 1)


def test_same_seed_same_result_and_progress_reaches_n(tubular_design):
    calls = []
    a = tolerance_study(tubular_design, 3000, seed=3, progress=lambda d, n: calls.append((d, n)))
    assert a == tolerance_study(tubular_design, 3000, seed=3)
    assert a != tolerance_study(tubular_design, 3000, seed=4)
    assert calls[-1] == (3000, 3000)
    assert [d for d, _ in calls] == sorted(d for d, _ in calls)


def test_memory_does_not_grow_with_the_number_of_samples(tubular_design):
    """Peak traced memory (numpy arrays included) for 2 and for 10 chunks: kept samples would
    make the second five times the first; streaming keeps them equal within 30 %."""

    def peak(n):
        tracemalloc.start()
        try:
            tolerance_study(tubular_design, n, seed=1)
            return tracemalloc.get_traced_memory()[1]
        finally:
            tracemalloc.stop()

    small, large = peak(2 * CHUNK), peak(10 * CHUNK)
    assert large < 1.3 * small, (small, large)


# --- the running summary on its own ---------------------------------------------------------------
def test_histogram_widens_both_ways_and_stays_within_resolution():
    """Later chunks reach far outside the first chunk's range on both sides."""
    rng = np.random.default_rng(11)
    chunks = [rng.uniform(0.0, 1.0, 5000), rng.normal(0.5, 3.0, 5000),
              rng.uniform(-40.0, 2.0, 5000), rng.uniform(0.9, 55.0, 3000)]
    s = RunningSummary(limit=1.0)
    for c in chunks:
        assert s.add(c) == 0
    x = np.concatenate(chunks)
    first_resolution = 2.0 * (chunks[0].max() - chunks[0].min()) / s.bins
    assert s.resolution > first_resolution  # the range was widened
    assert s.count == x.size and s.over == int(np.count_nonzero(x > 1.0))
    for q in (0.0, 0.135, 1.0, 25.0, 50.0, 99.0, 99.865, 100.0):
        assert abs(s.percentile(q) - np.percentile(x, q)) <= s.resolution, q
    assert s.mean == pytest.approx(x.mean(), rel=1e-12)
    assert s.std == pytest.approx(x.std(), rel=1e-12)


def test_constant_stream_gives_exact_percentiles():
    s = RunningSummary()
    for _ in range(3):
        s.add(np.full(1000, 2.5))
    assert s.percentile(P_LOW) == 2.5 and s.percentile(P_HIGH) == 2.5 and s.std == 0.0


def test_non_finite_values_are_counted_and_left_out():
    s = RunningSummary(limit=0.0)
    assert s.add(np.array([1.0, math.nan, -1.0, math.inf])) == 2
    assert s.count == 2 and s.mean == 0.0 and s.over == 1


# --- the share over each limit against tolerance_out_of_limit_max_pct sets the exit status ------
def _with_criteria(tmp_path, **criteria):
    from conftest import write_modified

    def edit(data):
        data.setdefault("criteria", {}).update(criteria)

    return write_modified(tmp_path, TUBULAR, edit)


@pytest.mark.parametrize("criterion, code", [(50.0, 0), (0.0, 1)])
def test_exit_status_follows_the_share_over_the_limit(tmp_path, criterion, code):
    """The tubular example's mismatch has some samples over its limit of 5 % (its percentile
    p99.865 is above 5 %): allowed with a criterion of 50 % (exit 0), not with 0 % (exit 1)."""
    path = _with_criteria(tmp_path, tolerance_out_of_limit_max_pct=criterion)
    proc = run_cli("tolerance", path, "-n", "5000", "--json")
    data = json.loads(proc.stdout)
    mismatch = next(q for q in data["quantities"] if q["name"] == "stiffness_mismatch_pct")
    assert mismatch["share_over_limit_pct"] > 0.0
    assert proc.returncode == code, proc.stderr
    assert data["criterion"]["tolerance_out_of_limit_max_pct"] == criterion
    assert mismatch["passed"] is (code == 0)


def test_share_over_limit_is_compared_with_the_criterion(tubular_design):
    import dataclasses

    res, checks = run(tubular_design, n=4000, seed=2)
    assert [c.id for c in checks] == [f"tolerance_{q}_over_limit" for q in QUANTITIES]
    for q, c in zip(res.quantities, checks, strict=True):
        assert c.value == pytest.approx(100.0 * q.fraction_over_limit)
        assert c.limit == tubular_design.criteria.tolerance_out_of_limit_max_pct
        assert c.passed is q.passed(c.limit) and c.unit == "%"
    assert res.passed is all(c.passed for c in checks)
    # the criterion comes from the design's [criteria]
    strict = dataclasses.replace(tubular_design, criteria=dataclasses.replace(
        tubular_design.criteria, tolerance_out_of_limit_max_pct=0.0))
    assert not run(strict, n=4000, seed=2)[0].passed


def test_criterion_default_and_its_basis_are_stated():
    import shaftcheck.model.criteria as criteria
    from shaftcheck.model.limits import TABLES

    assert criteria.Criteria().tolerance_out_of_limit_max_pct == 0.135
    # 0.135 % is the one-sided normal tail beyond 3 standard deviations, Phi(-3), the basis the
    # criteria table states (computed here with math.erfc, independent of the code)
    assert 100.0 * 0.5 * math.erfc(3.0 / math.sqrt(2.0)) == pytest.approx(0.135, abs=5e-4)
    assert "tolerance_out_of_limit_max_pct     0.135" in criteria.__doc__
    spec = next(t for t in TABLES if t.schema == "criteria")
    assert spec.key("tolerance_out_of_limit_max_pct").default == 0.135


# --- console table -------------------------------------------------------------------------------
def test_console_table_labels_percentiles_and_shows_unit_and_limit_on_every_row(monkeypatch):
    monkeypatch.setenv("COLUMNS", "80")
    proc = run_cli("tolerance", TUBULAR, "-n", "3000")
    assert proc.returncode in (0, 1), proc.stderr
    lines = proc.stdout.splitlines()
    head = next(i for i, ln in enumerate(lines) if ln.startswith("output"))
    assert "p0.135" in lines[head] and "p99.865" in lines[head] and "limit" in lines[head]
    assert "sigma" not in lines[head]
    rows = lines[head + 2:head + 5]
    for row, unit in zip(rows, ("%", "deg", "deg"), strict=True):
        cells = row.split()
        assert unit in cells, row
        assert cells[-1] in ("met", "MET")  # "met" or "NOT MET"
    assert "0.135th and 99.865th percentiles" in " ".join(proc.stdout.split())
    assert "What drives the spread" in proc.stdout
    assert not proc.stderr  # piped: no progress for a short run


def test_progress_only_on_a_terminal_or_for_long_runs(monkeypatch, capsys):
    from shaftcheck.output import tolerance_table as tt

    monkeypatch.setattr(tt.sys.stderr, "isatty", lambda: False, raising=False)
    with tt.progress(tt.PROGRESS_LOG_MIN - 1) as update:
        assert update is None
    with tt.progress(tt.PROGRESS_LOG_MIN) as update:
        for done in range(0, tt.PROGRESS_LOG_MIN + 1, CHUNK):
            update(done, tt.PROGRESS_LOG_MIN)
        update(tt.PROGRESS_LOG_MIN, tt.PROGRESS_LOG_MIN)
    out, err = capsys.readouterr()
    assert not out  # never on stdout
    assert len(err.splitlines()) == 5 and err.splitlines()[-1].endswith(
        f"{tt.PROGRESS_LOG_MIN:,} of {tt.PROGRESS_LOG_MIN:,} samples")


# --- sensitivity ranking on the design ----------------------------------------------------------
@pytest.mark.parametrize("name", ["tubular_design", "intermediate_design"])
def test_shares_follow_what_each_output_depends_on(request, name):
    """The mismatch depends on the sections only, the angle differences on the joint centres
    only; for these near-linear signed differences single dimensions explain nearly all the
    variance (the first-order shares sum to 1 within 0.02)."""
    design = request.getfixturevalue(name)
    res, _ = run(design, n=60000, seed=4)
    for q in res.quantities:
        by = dict(q.by_tolerance)
        if q.name == "stiffness_mismatch_pct":
            assert by.get("joint_centre", 0.0) == 0.0
        else:
            assert by.get("diameter", 0.0) == by.get("wall", 0.0) == by.get("length", 0.0) == 0
        assert q.first_order_sum == pytest.approx(1.0, abs=0.02), q.name
        assert [s.share for s in q.shares] == sorted((s.share for s in q.shares), reverse=True)


def test_largest_share_is_the_dimension_with_the_largest_linear_effect(tubular_design):
    """An independent local estimate: the mismatch's change per standard deviation of each
    section dimension by central differences on the nominal design (the study's own sampling
    function, one dimension moved at a time); the squared effects, normalised, rank the
    dimensions as a linear model would. The largest must be the study's first."""
    from shaftcheck.methods.tolerance_sampling import evaluate, sampling_plan
    from shaftcheck.studies.context import Context

    plan = sampling_plan(tubular_design, Context(tubular_design).design_geometry)
    z = np.zeros((plan.size, 2 * plan.size), dtype=np.float32)
    for i in range(plan.size):
        z[i, 2 * i], z[i, 2 * i + 1] = 0.01, -0.01
    y = evaluate(plan, z).signed[0]
    effect = (y[0::2] - y[1::2]) / 0.02
    linear = effect**2 / np.sum(effect**2)
    res, _ = run(tubular_design, n=60000, seed=4)
    q = res.quantities[0]
    share = {s.input: s.share for s in q.shares}
    top = plan.inputs[int(np.argmax(linear))].name
    assert q.shares[0].input == top
    for i, inp in enumerate(plan.inputs):
        assert share[inp.name] == pytest.approx(linear[i], abs=0.01), inp.name


def test_report_field_and_json(tubular_design):
    from shaftcheck.studies.evaluate import evaluate
    from shaftcheck.studies.tolerance import REPORT_SAMPLES, REPORT_SEED, with_tolerance

    result = with_tolerance(evaluate(tubular_design), n=2000)
    assert result.tolerance.samples == 2000 and result.tolerance.seed == REPORT_SEED
    assert result.to_dict()["tolerance"]["quantities"][0]["name"] == QUANTITIES[0]
    assert REPORT_SAMPLES >= 100_000


def test_report_section_shows_percentiles_limits_shares_and_ranking(tubular_design):
    """The report renders the typed result: every output's row with its unit, the limit, the
    share over it with the verdict against the criterion, and the ranking's largest share."""
    import io

    import pypdf

    from shaftcheck.report.document import build_pdf
    from shaftcheck.studies.evaluate import evaluate
    from shaftcheck.studies.tolerance import with_tolerance

    result = with_tolerance(evaluate(tubular_design), n=3000, seed=2)
    reader = pypdf.PdfReader(io.BytesIO(build_pdf(result)))
    text = " ".join(" ".join((p.extract_text() or "").split()) for p in reader.pages)
    start = text.index("Manufacturing tolerances 3,000 builds sampled")
    page = text[start:start + 6000]
    for label in ("p0.135", "p99.865", "Limit", "Over limit", "What drives the spread",
                  "stiffness mismatch", "inboard angle difference", "deg", "%"):
        assert label in page, label
    tol = result.tolerance
    top = tol.quantities[0].shares[0]
    assert top.input in page
    assert f"{100 * min(top.share, 1.0):.1f} %" in page
    mismatch = tol.quantities[0]
    assert ("NOT MET" in page) is (not tol.passed)
    assert f"{100 * mismatch.fraction_over_limit:.3f} %" in page
    # without the study the section says it was not run
    plain = pypdf.PdfReader(io.BytesIO(build_pdf(evaluate(tubular_design))))
    plain_text = " ".join(" ".join((p.extract_text() or "").split()) for p in plain.pages)
    assert "The tolerance study was not run for this result" in plain_text


@pytest.mark.parametrize("k, n", [(0, 300), (2, 300), (146, 20000), (20000, 20000), (7, 11)])
def test_share_interval_is_scipy_s_wilson_interval(k, n):
    """Oracle: scipy.stats.binomtest(k, n).proportion_ci(method="wilson") (scipy reference
    documentation), to rounding."""
    from scipy.stats import binomtest

    from shaftcheck.methods.tolerance_sampling import wilson_interval

    ci = binomtest(k, n).proportion_ci(confidence_level=0.95, method="wilson")
    lo, hi = wilson_interval(k, n)
    assert lo == pytest.approx(ci.low, abs=1e-12) and hi == pytest.approx(ci.high, abs=1e-12)


def test_an_uncertain_verdict_is_flagged(tubular_design):
    res, _ = run(tubular_design, n=300, seed=1)
    q = res.quantities[1]  # no sample over the limit, but 300 samples cannot show 0.135 %
    assert q.fraction_over_limit == 0.0
    assert q.verdict_is_uncertain(res.out_of_limit_max_pct, res.samples)
    d = res.to_dict()["quantities"][1]
    assert d["verdict_uncertain"] is True and d["share_over_limit_ci95_pct"][0] == 0.0
    big, _ = run(tubular_design, n=20000, seed=1)
    assert not big.quantities[1].verdict_is_uncertain(big.out_of_limit_max_pct, big.samples)
