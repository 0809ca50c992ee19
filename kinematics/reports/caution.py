"""The caution every output carries: what the analysis is, and what it is not."""

CAUTION = (
    "Caution: rigid-body analysis only (no deflection, clearance or strength); forces are those of frictionless "
    "rigid bodies and are no strength or fatigue check. Results must be checked by a competent engineer; guarding "
    "and machine design follow local codes and licensed practice."
)
