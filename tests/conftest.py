"""Shared fixtures: where the real public IFC files live (../shared/models beside the repo)."""

from __future__ import annotations

import os
import sys
from pathlib import Path

import pytest

REPO = Path(__file__).resolve().parents[1]
SHARED_MODELS = Path(os.environ.get("JOINT_AUDIT_SHARED_MODELS", REPO.parent / "shared" / "models"))
SAMPLES = REPO / "samples"

# test-data builders shared by test modules (tests are collected with --import-mode=importlib)
if str(Path(__file__).parent) not in sys.path:
    sys.path.insert(0, str(Path(__file__).parent))


@pytest.fixture(scope="session")
def shared_models() -> Path:
    if not SHARED_MODELS.is_dir():
        pytest.fail(f"the real IFC files are expected in {SHARED_MODELS} (shared/models beside the repo)")
    return SHARED_MODELS
