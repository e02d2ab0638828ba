"""Shared fixtures: where the real public IFC files live (../shared/models beside the repo)."""

from __future__ import annotations

import os
from pathlib import Path

import pytest

REPO = Path(__file__).resolve().parents[1]
SHARED_MODELS = Path(os.environ.get("JOINT_AUDIT_SHARED_MODELS", REPO.parent / "shared" / "models"))
SAMPLES = REPO / "samples"


@pytest.fixture(scope="session")
def shared_models() -> Path:
    if not SHARED_MODELS.is_dir():
        pytest.fail(f"the real IFC files are expected in {SHARED_MODELS} (shared/models beside the repo)")
    return SHARED_MODELS
