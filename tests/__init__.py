import os

# KINEPOLY_FULL=1 runs every property test on ten times as many cases (randomised, see tests/conftest.py).
CASE_FACTOR = 10 if os.environ.get("KINEPOLY_FULL") else 1
