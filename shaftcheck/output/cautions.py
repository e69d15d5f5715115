"""The cautions every verdict, report and the README carry (one wording, used everywhere)."""

CAUTION_LINE = (
    "Caution: engineering estimates from published methods and your inputs. Final sizing, "
    "material and heat treatment, and release rest with qualified engineers, physical testing "
    "(torsional overload and fatigue rigs, vehicle tests) and the applicable standards and "
    "company specifications."
)

CAUTION_PARAGRAPHS = (
    "The numbers in this document are engineering estimates computed from published methods "
    "and from the inputs in the design file. They are only as good as those inputs and as the "
    "validity ranges of the methods, which are named beside each result.",
    "A broken or twisted-off driveshaft can cause loss of vehicle control and injury. Final "
    "sizing, the choice of material and heat treatment (including induction-hardened case "
    "depth) and the release of the part rest with qualified engineers, with physical testing "
    "(torsional overload and fatigue rigs, vehicle tests) and with the applicable standards and "
    "company specifications.",
    "Torque-steer figures come from an idealised quasi-static model (frictionless joints, rigid "
    "links, no steering compliance or assistance) and are meant for comparing designs, not for "
    "predicting what a driver will feel.",
)
