"""The engine stays pure numerics: it never loads the page's libraries (style.md, habit 1).

``engine/`` imports only numpy, scipy and the standard library (project rule). A fresh interpreter imports
the engine, solves a case and reports which modules were loaded; a source scan catches imports that a
single run would not reach.
"""

from __future__ import annotations

import ast
import json
import re
import subprocess
import sys
from pathlib import Path

REPO = Path(__file__).resolve().parents[2]
ENGINE = REPO / "engine"
FORBIDDEN = ("panel", "bokeh", "param")
ALLOWED = {"numpy", "scipy", "engine", "__future__"} | set(sys.stdlib_module_names)

# Run in a fresh interpreter: import the engine, use its public functions (a lazy import inside a function
# would only show up then), and print the loaded top-level modules that belong to the page's libraries.
_PROBE = """
import json, sys

class _Watch:
    # Records every attempt to import a page library, even when it is not installed or the attempt is
    # wrapped in try/except, and then lets the normal import machinery carry on.
    tried = set()
    def find_spec(self, name, path=None, target=None):
        if name.split(".")[0] in {forbidden!r}:
            self.tried.add(name.split(".")[0])
        return None

watch = _Watch()
sys.meta_path.insert(0, watch)
{preamble}
import engine
case = engine.Case.from_dict({{
    "schema": 1, "length": 4.0, "EI": 2.0e6, "supports": {{"left": "pinned", "right": "pinned"}},
    "axial_force": 1.0e5, "loads": [{{"type": "uniform", "q": 1.0e3}}],
    "imperfection": {{"shape": "sine", "amplitude": 0.004}},
}})
engine.solve(case)
engine.critical_loads(case)
engine.sweep(case, [0.0, 1.0e5])
engine.Case.from_json(case.to_json())
loaded = {{name.split(".")[0] for name in sys.modules}} & set({forbidden!r})
print(json.dumps(sorted(loaded | watch.tried)))
"""


def _loaded_forbidden_modules(preamble: str = "") -> list[str]:
    code = _PROBE.format(preamble=preamble, forbidden=FORBIDDEN)
    completed = subprocess.run(
        [sys.executable, "-c", code], cwd=REPO, capture_output=True, text=True, timeout=120, check=False
    )
    assert completed.returncode == 0, completed.stderr
    return json.loads(completed.stdout.strip().splitlines()[-1])


def _engine_sources() -> list[Path]:
    sources = sorted(ENGINE.rglob("*.py"))
    assert sources, f"no engine sources under {ENGINE}"
    return sources


def test_importing_and_using_the_engine_loads_no_page_library():
    """A fresh interpreter using the engine neither tries to import nor holds panel, bokeh or param."""
    assert _loaded_forbidden_modules() == []


def test_the_probe_sees_an_attempted_import_of_a_page_library():
    """The probe reports param when something tries to import it, installed or not, so the check can fail."""
    preamble = "try:\n    import param\nexcept ImportError:\n    pass"
    assert "param" in _loaded_forbidden_modules(preamble=preamble)


def test_the_probe_sees_a_page_library_already_in_sys_modules():
    """The probe reports bokeh when a module of that name sits in sys.modules."""
    preamble = "import types\nsys.modules['bokeh'] = types.ModuleType('bokeh')"
    assert "bokeh" in _loaded_forbidden_modules(preamble=preamble)


def test_engine_sources_have_no_import_line_for_a_page_library():
    """No line of engine/*.py imports panel, bokeh or param, directly or through importlib."""
    names = "|".join(FORBIDDEN)
    statement = re.compile(rf"^\s*(?:from\s+({names})\b|import\s+.*\b({names})\b)")
    dynamic = re.compile(rf"""(?:import_module|__import__)\(\s*["']({names})\b""")
    offending = []
    for path in _engine_sources():
        for number, line in enumerate(path.read_text(encoding="utf-8").splitlines(), start=1):
            if statement.search(line) or dynamic.search(line):
                offending.append(f"{path.relative_to(REPO)}:{number}: {line.strip()}")
    assert offending == []


def test_engine_imports_only_numpy_scipy_and_the_standard_library():
    """Every import statement in engine/ names numpy, scipy, the standard library or the engine itself."""
    offending = []
    for path in _engine_sources():
        tree = ast.parse(path.read_text(encoding="utf-8"), filename=str(path))
        for node in ast.walk(tree):
            if isinstance(node, ast.Import):
                modules = [alias.name for alias in node.names]
            elif isinstance(node, ast.ImportFrom):
                if node.level:  # a relative import stays inside the package
                    continue
                modules = [node.module or ""]
            else:
                continue
            for module in modules:
                if module.split(".")[0] not in ALLOWED:
                    offending.append(f"{path.relative_to(REPO)}:{node.lineno}: {module}")
    assert offending == []


def test_solving_a_case_imports_no_scipy():
    """Start-up (issue 10): `scipy.optimize` cost about 0.5 s to import, inside the served page's first
    request. The engine finds its roots itself (`engine/roots.py`), so neither `import engine` nor the first
    critical load and solve loads any of scipy, and the root found is Euler's pinned-pinned load, EI·π²/L²."""
    code = (
        "import sys, math, json\n"
        "import engine\n"
        "before = sorted(n for n in sys.modules if n.split('.')[0] == 'scipy')\n"
        "case = engine.Case.from_dict({'schema': 1, 'length': 4.0, 'EI': 2.0e6,"
        " 'supports': {'left': 'pinned', 'right': 'pinned'}, 'axial_force': 1.0e5,"
        " 'loads': [{'type': 'uniform', 'q': 1.0e3}]})\n"
        "first = float(engine.critical_loads(case).critical_loads[0])\n"
        "engine.solve(case)\n"
        "after = sorted(n for n in sys.modules if n.split('.')[0] == 'scipy')\n"
        "print(json.dumps([before, after, first / (2.0e6 * math.pi ** 2 / 16.0)]))\n"
    )
    completed = subprocess.run(
        [sys.executable, "-c", code], cwd=REPO, capture_output=True, text=True, timeout=120, check=False
    )
    assert completed.returncode == 0, completed.stderr
    before, after, ratio = json.loads(completed.stdout.strip().splitlines()[-1])
    assert before == []
    assert after == []
    # Euler, pinned-pinned (Timoshenko & Gere, Theory of Elastic Stability, §2.1)
    assert abs(ratio - 1.0) < 1e-9


def test_importing_the_engine_leaves_tempfile_until_a_case_is_saved(tmp_path):
    """`import engine` loads no `tempfile` (it brings shutil, random and the compression modules with it):
    `save_case` makes its temporary file itself, and the file it writes reads back as the same case."""
    code = (
        "import sys, json, os\n"
        "import engine\n"
        "loaded = sorted(n for n in ('tempfile', 'shutil', 'bz2', 'lzma') if n in sys.modules)\n"
        "case = engine.Case.from_dict({'schema': 1, 'length': 4.0, 'EI': 2.0e6,"
        " 'supports': {'left': 'pinned', 'right': 'pinned'}, 'loads': []})\n"
        "path = os.path.join(sys.argv[1], 'a.json')\n"
        "engine.save_case(case, path)\n"
        "print(json.dumps([loaded, engine.load_case(path) == case]))\n"
    )
    completed = subprocess.run(
        [sys.executable, "-c", code, str(tmp_path)],
        cwd=REPO,
        capture_output=True,
        text=True,
        timeout=120,
        check=False,
    )
    assert completed.returncode == 0, completed.stderr
    loaded, same = json.loads(completed.stdout.strip().splitlines()[-1])
    assert loaded == [] and same
    assert sorted(path.name for path in tmp_path.iterdir()) == ["a.json"]  # no temporary file left behind
