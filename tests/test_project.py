"""The project from the outside: the README's commands, CI, and the built wheel."""

from __future__ import annotations

import re
import subprocess
import sys
import zipfile
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
TEST_COMMAND = 'python -m pip install -e ".[test]" && python -m pytest'


def quick_start_commands() -> list[str]:
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    section = text.split("## Quick start", 1)[1].split("\n## ", 1)[0]
    return re.findall(r"```sh\n(.*?)\n```", section, flags=re.S)


def test_readme_quick_start_has_exactly_two_commands() -> None:
    commands = quick_start_commands()
    assert len(commands) == 2
    assert commands[0].startswith("python -m pip install -e . && ")
    assert commands[1] == TEST_COMMAND


def test_ci_runs_the_readme_test_command() -> None:
    script = (ROOT / ".ci" / "run").read_text(encoding="utf-8")
    assert TEST_COMMAND in script
    assert "ruff check" in script and "mypy syscurve" in script


@pytest.mark.slow
def test_the_wheel_ships_all_three_packages_and_their_data(tmp_path: Path) -> None:
    result = subprocess.run(
        [sys.executable, "-m", "pip", "wheel", str(ROOT), "--no-deps", "-q", "-w", str(tmp_path)],
        capture_output=True,
        text=True,
        timeout=300,
        check=False,
    )
    assert result.returncode == 0, result.stderr
    wheel = next(tmp_path.glob("syscurve-*.whl"))
    names = set(zipfile.ZipFile(wheel).namelist())
    for required in (
        "syscurve/__init__.py",
        "syscurve/data/example.toml",
        "dashboard/__init__.py",
        "pump_data/__init__.py",
        "pump_data/inline-booster-a-2900.csv",
    ):
        assert required in names
    for asset in (ROOT / "dashboard" / "assets").glob("*"):
        assert f"dashboard/assets/{asset.name}" in names
