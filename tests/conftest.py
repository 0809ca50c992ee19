"""Shared test setup: Qt runs offscreen (set before any Qt module loads)."""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
