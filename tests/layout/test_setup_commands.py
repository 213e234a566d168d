"""The README's set-up commands: each makes its own virtual environment (a stock
Debian/Ubuntu Python refuses a plain `pip install` as an externally managed
environment, PEP 668), and CI (.ci/run) runs exactly the README's test command."""
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]


def readme_commands():
    text = (ROOT / "README.md").read_text("utf-8")
    return [line.strip() for line in text.splitlines()
            if line.startswith("    python3 ") and "pip install" in line]


def test_readme_commands_install_into_a_venv_in_the_checkout():
    commands = readme_commands()
    assert len(commands) == 2, commands
    for command in commands:
        assert command.startswith("python3 -m venv .venv && .venv/bin/python -m pip install -e ")
        assert "python3 -m pip" not in command  # never the system Python's pip


def test_ci_runs_exactly_the_readme_test_command():
    (test_command,) = [c for c in readme_commands() if "pytest" in c]
    ci = (ROOT / ".ci" / "run").read_text("utf-8").splitlines()
    assert "set -euo pipefail" in ci  # a failing step fails the job
    assert test_command in ci, test_command
