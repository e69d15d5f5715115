"""Torsional stress-concentration factors against published chart values.

Every check value here is printed in a publication named beside it; the project's curve fits
(``shaftcheck.methods.stress_concentration``) are called with the published geometry.

Tolerance 5 % throughout, for two reasons: the published values are read off Peterson-type charts
and printed to two decimals, and a polynomial fit of such a chart reproduces it only to a few
percent. A cell where the fit and the table differ by more than 5 % is not tested here; such cells
are listed in tests/validation/README.md as findings with their numbers.
"""

from __future__ import annotations

import pytest

from shaftcheck.methods.stress_concentration import shoulder_fillet_kts, u_groove_kts

CHART_TOLERANCE = 0.05  # relative; see the module docstring

# --- U-groove in a round shaft, torsion ---------------------------------------------------------
# J. Carvill, *Mechanical Engineer's Data Handbook*, Butterworth-Heinemann (1993), p. 22,
# "Torsion of grooved shaft (values of K)", K = tau_max / (16 T / (pi d^3)), d = root diameter.
# Columns r/d, rows D/d. Cells used: those where the fit is defined (0.25 <= t/r <= 50, t = groove
# depth) and agrees with the table within 5 %; the five cells at r/d <= 0.03 with D/d >= 1.3 where
# the fit falls 5.2-10.3 % below the table are findings (README); four cells lie outside the fit
# (t/r < 0.25: D/d = 1.05 at r/d >= 0.15, D/d = 1.10 at r/d = 0.30).
CARVILL_RD = (0.02, 0.03, 0.04, 0.06, 0.10, 0.15, 0.20, 0.30)
CARVILL_GROOVE = {
    1.05: (2.01, 1.80, 1.65, 1.52, 1.38, 1.30, 1.25, 1.20),
    1.10: (2.20, 1.95, 1.81, 1.63, 1.45, 1.35, 1.29, 1.22),
    1.20: (2.43, 2.12, 1.94, 1.72, 1.51, 1.39, 1.32, 1.24),
    1.30: (2.58, 2.20, 2.00, 1.76, 1.54, 1.41, 1.33, 1.24),
    1.50: (2.69, 2.25, 2.03, 1.79, 1.56, 1.42, 1.34, 1.25),
    2.00: (2.80, 2.30, 2.05, 1.80, 1.57, 1.43, 1.34, 1.25),
}
#: (D/d, r/d) cells left out because the fit differs from the table by more than 5 % (findings)
CARVILL_FINDINGS = {(1.30, 0.02), (1.50, 0.02), (1.50, 0.03), (2.00, 0.02), (2.00, 0.03)}


def _carvill_cells(valid: bool):
    for D_d, row in CARVILL_GROOVE.items():
        for r_d, k in zip(CARVILL_RD, row, strict=True):
            in_fit = 0.25 <= (D_d - 1.0) / 2.0 / r_d <= 50.0
            if in_fit and (D_d, r_d) not in CARVILL_FINDINGS and valid:
                yield pytest.param(D_d, r_d, k, id=f"D/d={D_d}-r/d={r_d}")
            elif not in_fit and not valid:
                yield pytest.param(D_d, r_d, k, id=f"D/d={D_d}-r/d={r_d}")


@pytest.mark.parametrize("D_d, r_d, published", list(_carvill_cells(valid=True)))
def test_u_groove_against_carvill_table(D_d, r_d, published):
    d = 25e-3  # any size: K depends on the ratios only
    k = u_groove_kts(D_d * d, d, r_d * d)
    assert k.valid
    assert k.value == pytest.approx(published, rel=CHART_TOLERANCE)


@pytest.mark.parametrize("D_d, r_d, published", list(_carvill_cells(valid=False)))
def test_u_groove_outside_fit_is_flagged(D_d, r_d, published):
    # Carvill p. 22 has these cells; the fit does not cover them (t/r < 0.25) and must say so
    # rather than return a number as if it were valid.
    d = 25e-3
    assert not u_groove_kts(D_d * d, d, r_d * d).valid


def test_carvill_finding_cells_are_still_below_the_table():
    """The cells left out above (README findings): the fit is 5-11 % below Carvill p. 22.

    This pins the finding, not a published value: if the fit is replaced and these cells come
    within 5 %, move them into the checked table and delete this test."""
    for D_d, r_d in sorted(CARVILL_FINDINGS):
        published = CARVILL_GROOVE[D_d][CARVILL_RD.index(r_d)]
        ratio = u_groove_kts(D_d, 1.0, r_d).value / published
        assert 0.89 < ratio < 0.95, (D_d, r_d, ratio)


# --- shoulder fillet, torsion -----------------------------------------------------------------
# J. M. Gere, *Mechanics of Materials*, Instructor's Solutions Manual, Problem 3.11-3 (edition
# not identified from the copy read; its p. 255 holds section 3.11, "Stress concentrations in
# torsion"): a full
# quarter-circular fillet (R = (D2 - D1)/2) on a stepped shaft, D2 = 1.0 in; K read from the
# book's Fig. 3-48 (a Peterson chart): D1 = 0.7 in -> 1.20, 0.8 in -> 1.29, 0.9 in -> 1.41.
@pytest.mark.parametrize("D1_in, published", [(0.7, 1.20), (0.8, 1.29), (0.9, 1.41)])
def test_shoulder_fillet_against_gere(D1_in, published):
    D2, D1 = 1.0 * 25.4e-3, D1_in * 25.4e-3
    k = shoulder_fillet_kts(D2, D1, (D2 - D1) / 2.0)
    assert k.valid
    assert k.value == pytest.approx(published, rel=CHART_TOLERANCE)
