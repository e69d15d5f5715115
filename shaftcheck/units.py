"""Unit conversions between SI (inside the code) and the trade units of files and output.

Names say the direction: ``RAD2DEG`` multiplies radians into degrees, ``DEG2RAD`` degrees into
radians; ``NMRAD_TO_NMDEG`` turns a torsional stiffness in N*m/rad into N*m/deg.
"""

import math

RAD2DEG = 180.0 / math.pi
DEG2RAD = math.pi / 180.0
NMRAD_TO_NMDEG = math.pi / 180.0
MM = 1e-3  # metres per millimetre
