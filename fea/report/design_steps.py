"""Printing a standard's written-out formula steps (:class:`fea.design.standards.Step`) as calculation lines.

A step's formula is printed twice from its one parsed expression: once in
symbols, once with the check's numbers substituted, then its result.  The
numbers are the JSON design part's (the check's keys and its ``details``); the
constants of the published formula print as ``const:`` sources named by the
step's ``ref`` (see :mod:`fea.report.document`).  Nothing is recomputed here.
"""

from __future__ import annotations

import ast
import math
from dataclasses import dataclass
from typing import Any, Callable

from ..design.standards import PASSES, STANDARDS, Step
from .document import CalcLine, Em, Q, Sub, Sup, T, convert, q, unit_label

__all__ = ["N_CR_SYMBOL", "Check", "Name", "FORMULA_CONSTANTS", "step_line", "printed", "condition", "sym", "with_unit"]

#: The constants each written-out formula may print, by formula (the key after ``const:``): those of the
#: standards' steps.
FORMULA_CONSTANTS: dict[str, frozenset[str]] = {
    ref: frozenset().union(*(r.formula_constants().get(ref, frozenset()) for r in STANDARDS.values()))
    for ref in {ref for r in STANDARDS.values() for ref in r.formula_constants()}}
FORMULA_CONSTANTS[PASSES.ref] = PASSES.constants  # the verdict's bound, common to every standard


def _trim_sig(x: float, sig: int) -> int:
    """The fewest significant figures (at most ``sig``) that show ``x`` as ``sig`` figures would."""
    if not math.isfinite(x) or x == 0:
        return sig
    full = float(f"{x:.{sig - 1}e}")
    for s in range(1, sig):
        if float(f"{x:.{s - 1}e}") == full:
            return s
    return sig


def _decimals_sig(x: float, decimals: int = 3) -> int:
    """Significant figures that show ``x`` with ``decimals`` decimals (at least two figures)."""
    if not math.isfinite(x) or x == 0:
        return 3
    return max(2, decimals + int(math.floor(math.log10(abs(x)))) + 1)


#: The symbol of the critical force N_cr.
N_CR_SYMBOL = (Em("N"), Sub("cr"))


class Check:
    """Access to one check of the JSON design part, as sourced quantities."""

    def __init__(self, c: dict, n: int, u) -> None:
        self.c, self.n, self.u = c, n, u
        self.d = c.get("details") or {}
        self.labels = c.get("labels") or {}

    def src(self, key: str) -> str:
        return f"json:design/checks/{self.n}/{key}"

    def raw(self, key: str) -> Any:
        if key in self.c:
            return self.c[key]
        return self.d.get(key)

    def has(self, key: str) -> bool:
        return self.raw(key) is not None

    def path(self, key: str) -> str:
        return self.src(key) if key in self.c else self.src(f"details/{key}")

    def _dim(self, key: str, unit: str) -> Q:
        v = self.raw(key)
        return q(v, self.path(key), unit, 4 if v is None else _trim_sig(convert(v, unit), 4))

    def force(self, key: str) -> Q:
        return self._dim(key, self.u.force)

    def stress(self, key: str) -> Q:
        return self._dim(key, self.u.stress)

    def area(self, key: str = "A_m2") -> Q:
        return self._dim(key, self.u.area)

    def factor(self, key: str) -> Q:
        """A partial or resistance factor, an input: as given, at least two figures (1.0, 0.90, 1.25)."""
        v = self.raw(key)
        return q(v, self.path(key), "", 4 if v is None else max(2, _trim_sig(v, 4)))

    def num(self, key: str, decimals: int = 3) -> Q:
        """A dimensionless result: three decimals below ten, four figures above."""
        v = self.raw(key)
        sig = 3 if v is None else (_decimals_sig(v, decimals) if abs(v) < 10 else 4)
        return q(v, self.path(key), "", sig)

    def plain(self, key: str, sig: int = 4) -> Q:
        v = self.raw(key)
        return q(v, self.path(key), "", 4 if v is None else _trim_sig(v, sig))

    def text(self, key: str) -> T:
        if key in self.c:
            return T(str(self.c[key]), self.src(key))
        return T(str(self.labels[key]), self.src(f"labels/{key}"))


def sym(base: str, sub: str | T | None = None) -> tuple:
    """A symbol: italic base with an optional subscript."""
    return (Em(base), Sub(sub)) if sub is not None else (Em(base),)


def with_unit(qty: Q) -> tuple:
    """A quantity with its unit: ``2026 kN``."""
    return (qty, "\u2009" + unit_label(qty.unit).replace("^6", "⁶")) if qty.unit else (qty,)


@dataclass(frozen=True)
class Name:
    """How one name of a formula prints: its symbol, and its number as shown (from the check)."""

    symbol: tuple
    show: Callable[[Check], Q | tuple]


# -- printing a parsed formula ---------------------------------------------------------------------

_ATOM, _POW, _UNARY, _PRODUCT, _SLASH, _SUM = 5, 4, 3, 2, 1.5, 1  # _SLASH: a symbol or number written a/b
_OPS = {ast.Add: " + ", ast.Sub: " − ", ast.LtE: " ≤ ", ast.Lt: " < ", ast.GtE: " ≥ ", ast.Gt: " > "}
_UNITS = {"MPa"}


def _wrap(parts: list) -> list:
    """Parentheses, or square brackets around parts that hold parentheses already."""
    inner = any(isinstance(p, str) and p in ("(", "[") for p in parts)  # grouping, not "√(" or "min("
    return ["[", *parts, "]"] if inner else ["(", *parts, ")"]


def _leaf_parts(value: Q | tuple) -> tuple[list, float]:
    """A substituted number: parenthesised in products when negative, in powers when it has a unit."""
    if isinstance(value, Q):
        if value.value is not None and value.value < 0:
            return [*with_unit(value)], _SUM
        return [*with_unit(value)], _POW if value.unit else _ATOM
    return list(value), _ATOM if len(value) == 1 else _SLASH


def _print(node: ast.AST, leaf: Callable[[str], tuple[list, float]], ref: str, source: str,
           times: str) -> tuple[list, float]:
    """Parts and precedence of an expression; ``leaf`` prints a name; ``times`` separates factors."""
    def sub(n: ast.AST, need: int) -> list:
        parts, prec = _print(n, leaf, ref, source, times)
        return _wrap(parts) if prec < need else parts

    if isinstance(node, ast.Expression):
        return _print(node.body, leaf, ref, source, times)
    if isinstance(node, ast.Constant):
        return [T(ast.get_source_segment(source, node) or repr(node.value), f"const:{ref}")], _ATOM
    if isinstance(node, ast.Name):
        return (["π"], _ATOM) if node.id == "pi" else leaf(node.id)
    if isinstance(node, ast.UnaryOp):
        return ["−", *sub(node.operand, _POW)], _UNARY
    if isinstance(node, ast.Compare):
        return [*sub(node.left, _SUM), _OPS[type(node.ops[0])], *sub(node.comparators[0], _SUM)], _SUM
    if isinstance(node, ast.Call):
        name = node.func.id  # type: ignore[attr-defined]
        if name == "sqrt":
            inner, prec = _print(node.args[0], leaf, ref, source, times)
            return (["√", *inner] if prec == _ATOM else ["√(", *inner, ")"]), _ATOM
        args: list = []
        for i, a in enumerate(node.args):
            args += ([", "] if i else []) + _print(a, leaf, ref, source, times)[0]
        return [f"{name}(", *args, ")"], _ATOM
    assert isinstance(node, ast.BinOp), ast.dump(node)
    op = type(node.op)
    if op in (ast.Add, ast.Sub):
        return [*sub(node.left, _SUM), _OPS[op], *sub(node.right, _SUM + 1)], _SUM
    if op is ast.Pow:
        base = sub(node.left, _ATOM)
        if isinstance(node.right, ast.Constant) and node.right.value == 2:
            return [*base, "²"], _POW
        return [*base, Sup(tuple(_print(node.right, leaf, ref, source, times)[0]))], _POW
    if op is ast.Mult and isinstance(node.right, ast.Name) and node.right.id in _UNITS:
        return [*sub(node.left, _ATOM), f" {node.right.id}"], _ATOM
    left = node.left.left if isinstance(node.left, ast.BinOp) and isinstance(node.left.op, ast.Pow) else node.left
    pi_factor = isinstance(left, ast.Name) and left.id == "pi" and (
        times == " " or isinstance(node.right, ast.Call))  # "π √(...)", not "π × √(...)"
    sep = (" " if pi_factor else times) if op is ast.Mult else " / "
    return [*sub(node.left, _PRODUCT), sep, *sub(node.right, _PRODUCT + 1)], _PRODUCT


def printed(step: Step, names: dict[str, Name], k: Check | None = None) -> list:
    """The formula of ``step`` in symbols, or with the numbers of check ``k`` substituted."""
    def leaf(name: str) -> tuple[list, float]:
        n = names[name]
        if k is None:
            has_slash = any(isinstance(p, str) and "/" in p for p in n.symbol)
            return list(n.symbol), _SLASH if has_slash else _ATOM
        return _leaf_parts(n.show(k))

    return _print(step.tree, leaf, step.ref, step.expr, " " if k is None else " × ")[0]


def condition(step: Step, holds: bool) -> list:
    """The comparison and bound of a condition step (``≤ 0.2``, or ``> 0.2`` when it does not hold)."""
    node = step.tree.body
    assert isinstance(node, ast.Compare)
    op = _OPS[type(node.ops[0])] if holds else {" ≤ ": " > ", " < ": " ≥ ", " ≥ ": " < ", " > ": " ≤ "}[
        _OPS[type(node.ops[0])]]
    return [op, *_print(node.comparators[0], lambda n: ([n], _ATOM), step.ref, step.expr, " ")[0]]


def _text(parts) -> str:
    """The plain text of inline parts (to compare two ways of writing a symbol)."""
    out = []
    for p in parts:
        if isinstance(p, (Em, Sub)):
            out.append(_text((p.text,)))
        elif isinstance(p, Sup):
            out.append(_text(p.parts))
        else:
            out.append(p if isinstance(p, str) else getattr(p, "text", str(p)))
    return "".join(out)


def step_line(k: Check, step: Step, names: dict[str, Name], lhs: tuple | None = None, remark: tuple = (),
              result: Q | None = None) -> CalcLine:
    """``lhs = formula = formula with numbers = result``: one written-out step of a check."""
    lhs = names[step.key].symbol if lhs is None else lhs
    shown = names[step.key].show(k) if result is None else result
    res = list(with_unit(shown)) if isinstance(shown, Q) else list(shown)
    formula = printed(step, names)
    same = _text(formula) == _text(lhs)  # "φ Nc = φ Nc = ...": the formula once
    shown_formula = [] if same else [*formula, " = "]
    return CalcLine(lhs, (*shown_formula, *printed(step, names, k), " = ", *res), remark)
