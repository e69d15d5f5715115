"""Material records (SI) and the material library in ``materials/*.toml``.

A material file holds ``[materials.<id>]`` tables in trade units (GPa, MPa, kg/m^3); every record
names its source. Loading and validation of the files lives in :mod:`shaftcheck.io.design_file`
(input); this module only holds the record and the finish names used by the fatigue surface
factor.
"""

from __future__ import annotations

from shaftcheck.records import record

#: Surface finishes known to the Marin surface factor (Shigley Table 6-2).
SURFACE_FINISHES = ("ground", "machined", "cold_drawn", "hot_rolled", "as_forged")


@record
class Material:
    """An isotropic steel, in SI units.

    elastic_modulus, shear_modulus, ultimate_strength, yield_strength [Pa]; density [kg/m^3];
    poisson_ratio [-]; surface_finish one of SURFACE_FINISHES; source: where the numbers come
    from; basis: "minimum" | "typical" | "nominal" (how the strength values are meant).
    ``name`` is the open standard designation and condition.
    """

    id: str
    name: str
    elastic_modulus: float
    shear_modulus: float
    poisson_ratio: float
    density: float
    ultimate_strength: float
    yield_strength: float
    surface_finish: str
    source: str
    basis: str = "nominal"
    origin: str = "library"  # "library" or "design"

    @property
    def shear_yield(self) -> float:
        """S_sy = 0.577 S_y [Pa], distortion energy (Shigley ch. 5; ``shigley_ch5_de``)."""
        return 0.577 * self.yield_strength

    @property
    def shear_ultimate(self) -> float:
        """S_su = 0.67 S_ut [Pa] (Shigley eq. 6-58, 2024 release; ``shigley_ssu``)."""
        return 0.67 * self.ultimate_strength
