"""The engine's layers: no import cycle between its modules, and no import hidden inside a function.

An import inside a function is how a cycle is usually dodged, so both are checked by reading the source with
``ast`` (nothing is imported). No function-level import is allowed.
"""

import ast
import pathlib
import sys

import pytest

ENGINE = pathlib.Path(__file__).resolve().parents[2] / "engine"

# (module, imported name) pairs that may be imported inside a function, each with its reason.
ALLOWED_DEFERRED: set = set()

# Module-size limit of the project's rules (DEVELOPERS.md).
MAX_LINES = 600


def _module_name(path: pathlib.Path) -> str:
    parts = path.relative_to(ENGINE.parent).with_suffix("").parts
    return ".".join(parts[:-1] if parts[-1] == "__init__" else parts)


def _modules() -> dict[str, pathlib.Path]:
    return {_module_name(path): path for path in sorted(ENGINE.rglob("*.py"))}


def _imported(node: ast.AST, module: str, is_package: bool) -> list[str]:
    """The modules an import statement names (``from engine import codes`` names ``engine.codes``)."""
    if isinstance(node, ast.Import):
        return [alias.name for alias in node.names]
    if node.level:  # a relative import: resolve it against this module's package
        base = module.split(".")
        base = base if is_package else base[:-1]
        base = base[: len(base) - (node.level - 1)]
        target = ".".join([*base, node.module] if node.module else base)
    else:
        target = node.module or ""
    return [target] + [f"{target}.{alias.name}" for alias in node.names]


def _imports(module: str, path: pathlib.Path) -> tuple[set[str], set[str], list[tuple[str, int]]]:
    """Engine modules imported at module level and below it, and every import made below it (name, line)."""
    tree = ast.parse(path.read_text(encoding="utf-8"))
    known = _modules()
    is_package = path.name == "__init__.py"
    top, below, deferred = set(), set(), []
    for node in ast.walk(tree):
        if not isinstance(node, (ast.Import, ast.ImportFrom)):
            continue
        names = _imported(node, module, is_package)
        # A package that holds this module (``engine``, the façade on top of every layer, or
        # ``engine.solver``) is already being imported when this module runs: ``from engine import codes``
        # counts as an import of ``engine.codes`` only.
        engine_names = {
            name for name in names if name in known and name != module and not module.startswith(name + ".")
        }
        if node in tree.body:
            top.update(engine_names)
        else:
            below.update(engine_names)
            first = names[:1] if isinstance(node, ast.ImportFrom) else names
            deferred.extend((name, node.lineno) for name in first)
    return top, below, deferred


def _graph(with_deferred: bool = False) -> dict[str, set[str]]:
    """Module -> the engine modules it imports (also those imported inside functions, if asked)."""
    graph = {}
    for module, path in _modules().items():
        top, below, _ = _imports(module, path)
        graph[module] = top | below if with_deferred else top
    # Importing a submodule runs its package's __init__ first.
    for module, edges in graph.items():
        for target in list(edges):
            parent = target.rsplit(".", 1)[0]
            if (
                parent != "engine"
                and parent in graph
                and parent != module
                and not module.startswith(parent + ".")
            ):
                edges.add(parent)
    return graph


def _cycle(graph: dict[str, set[str]]) -> list[str] | None:
    """One import cycle (a list of modules that ends where it starts), or None."""
    state: dict[str, int] = {}
    stack: list[str] = []

    def visit(module: str) -> list[str] | None:
        state[module] = 1
        stack.append(module)
        for target in sorted(graph.get(module, ())):
            if state.get(target) == 1:
                return stack[stack.index(target) :] + [target]
            if target not in state:
                found = visit(target)
                if found:
                    return found
        stack.pop()
        state[module] = 2
        return None

    for module in sorted(graph):
        if module not in state:
            found = visit(module)
            if found:
                return found
    return None


@pytest.mark.parametrize("with_deferred", [False, True])
def test_the_engine_has_no_import_cycle(with_deferred):
    """No chain of imports inside engine/ leads back to where it started, counting those in functions too."""
    graph = _graph(with_deferred)
    assert _cycle(graph) is None, " -> ".join(_cycle(graph))


def test_the_cycle_finder_finds_a_cycle():
    """The cycle finder itself reports a cycle of two modules and passes a chain without one."""
    assert _cycle({"a": {"b"}, "b": {"a"}}) == ["a", "b", "a"]
    assert _cycle({"a": {"b"}, "b": {"c"}, "c": set()}) is None


def test_the_engine_imports_nothing_inside_a_function():
    """Every import in engine/ is at module level, except the documented deferred scipy.optimize."""
    found = [
        f"{module}:{line} imports {name}"
        for module, path in _modules().items()
        for name, line in _imports(module, path)[2]
        if (module, name) not in ALLOWED_DEFERRED
    ]
    assert found == []


def test_a_deferred_import_is_found(tmp_path, monkeypatch):
    """The reader sees an import inside a function (and one inside a method) as deferred."""
    source = tmp_path / "engine" / "sample.py"
    source.parent.mkdir()
    source.write_text(
        "import math\n\ndef f():\n    from engine import case\n\n"
        "class A:\n    def g(self):\n        import json\n"
    )
    monkeypatch.setattr(sys.modules[__name__], "ENGINE", source.parent)
    _, _, deferred = _imports("engine.sample", source)
    assert [name for name, _ in deferred] == ["engine", "json"]


@pytest.mark.parametrize("module", sorted(_modules()))
def test_every_engine_module_is_under_the_size_limit(module):
    """No module of engine/ is longer than 600 lines (the project's rule for every module)."""
    lines = _modules()[module].read_text(encoding="utf-8").count("\n")
    assert lines <= MAX_LINES, f"{module}: {lines} lines"
