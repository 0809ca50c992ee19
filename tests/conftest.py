"""Shared test settings: Qt offscreen, and the hypothesis profiles.

Profile "ci" (the default) is derandomised so every run tries the same cases; "full" (set
KINEPOLY_FULL=1) is randomised, and the property tests multiply their case counts by ten
(tests/__init__.py: CASE_FACTOR)."""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

from hypothesis import HealthCheck, settings  # noqa: E402

settings.register_profile("ci", derandomize=True, deadline=None, print_blob=True,
                          suppress_health_check=[HealthCheck.too_slow, HealthCheck.filter_too_much])
settings.register_profile("full", deadline=None,
                          suppress_health_check=[HealthCheck.too_slow, HealthCheck.filter_too_much])
settings.load_profile("full" if os.environ.get("KINEPOLY_FULL") else "ci")
