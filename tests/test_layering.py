"""Architecture rule: the mechanics in ``engine`` never import ifcopenshell (DESIGN.md §2)."""

from __future__ import annotations

import pkgutil
import subprocess
import sys
from pathlib import Path

import engine

REPO = Path(__file__).resolve().parents[1]


def test_engine_modules_import_without_ifcopenshell():
    names = sorted(m.name for m in pkgutil.iter_modules(engine.__path__) if m.name != "cli")
    code = (
        "import sys, importlib\n"
        f"for n in {names!r}:\n"
        "    importlib.import_module('engine.' + n)\n"
        "bad = [m for m in sys.modules if m.split('.')[0] in ('ifcopenshell', 'ifc_io')]\n"
        "assert not bad, bad\n"
        "print(len(" + repr(names) + "))\n"
    )
    res = subprocess.run([sys.executable, "-c", code], cwd=REPO, capture_output=True, text=True)
    assert res.returncode == 0, res.stderr
    assert int(res.stdout) >= 5  # model, errors, config, cautions, inspect at least


def test_engine_sources_never_import_ifcopenshell_at_top_level():
    offenders = []
    for path in (REPO / "engine").glob("*.py"):
        for line in path.read_text(encoding="utf-8").splitlines():
            if line.startswith(("import ifcopenshell", "from ifcopenshell", "import ifc_io", "from ifc_io")):
                offenders.append(f"{path.name}: {line}")
    assert offenders == []
