"""The caution every output carries: what the analysis is, and what it is not."""

CAUTION = (
    "Caution: rigid-body kinematics only (no deflection, clearance, dynamics or strength). Results must be "
    "checked by a competent engineer; guarding and machine design follow local codes and licensed practice."
)
