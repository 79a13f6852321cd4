"""Issue 13, the bullets not held elsewhere: labels that do not collide on the demo sketches, the docs the
field asked for, and demo data consistent with what the case files say.
"""

from __future__ import annotations

import math
import re
from itertools import combinations
from pathlib import Path

import pytest

from fea.pipeline import load_case

ROOT = Path(__file__).resolve().parents[1]
CASES = sorted((ROOT / "cases").glob("*.toml"))


def _overlaps(fig) -> tuple[list[tuple[str, str]], int]:
    """Pairs of non-empty texts whose drawn boxes overlap, per axes (and the figure's own texts), and the number
    of texts looked at."""
    from matplotlib.backends.backend_agg import FigureCanvasAgg

    canvas = FigureCanvasAgg(fig)
    canvas.draw()
    renderer = canvas.get_renderer()
    out, seen = [], 0
    for holder in [fig, *fig.axes]:
        boxes = [(t.get_text(), t.get_window_extent(renderer)) for t in holder.texts
                 if t.get_visible() and t.get_text().strip()]
        seen += len(boxes)
        for (ta, a), (tb, b) in combinations(boxes, 2):
            if a.overlaps(b) and a.intersection(a, b).width > 1 and a.intersection(a, b).height > 1:
                out.append((ta, tb))
    return out, seen


@pytest.mark.parametrize("path", CASES, ids=lambda p: p.stem)
def test_sketch_labels_do_not_collide(path):
    """The column sketch of every demo case: no two labels drawn over each other (loads, springs, heights)."""
    import matplotlib.pyplot as plt

    from fea.plot import plot_sketch

    case = load_case(str(path))
    d = case.display
    fig = plot_sketch([(a, c) for a, c in case.planes], length_unit=(d.length, d.length_si),
                      force_unit=(d.force, d.force_si))
    try:
        pairs, seen = _overlaps(fig)
        assert seen >= 2 and pairs == []  # at least the load and a height label are drawn
    finally:
        plt.close(fig)


def test_foundation_docs_give_the_subgrade_conversion():
    text = (ROOT / "docs" / "foundations.md").read_text(encoding="utf-8")
    # a soil report's subgrade modulus [force/length^3] times the pile width gives the modulus per length
    assert re.search(r"k\s*=\s*k_s\s*(x|×|\*|·)\s*", text), "the conversion k = k_s x width is not written out"
    assert "width" in text.lower() and "1.8 T" in text and "common practice" in text


def test_design_docs_name_the_net_area_of_every_tension_check():
    table = [ln for ln in (ROOT / "docs" / "design.md").read_text(encoding="utf-8").splitlines()
             if ln.startswith('| `"') and any(m in ln for m in ("Perry-Robertson", "Rankine-Gordon", "working-stress"))]
    assert len(table) == 3 and all("A_net" in ln for ln in table)


def _tube_I(D: float, t: float) -> float:
    """Second moment of area of a round tube, pi (D^4 - (D - 2t)^4) / 64 (plane geometry)."""
    return math.pi * (D**4 - (D - 2 * t) ** 4) / 64


@pytest.mark.parametrize("name", ["pile_in_soft_soil.toml", "tapered_pole.toml"])
def test_demo_tubes_have_the_second_moment_of_their_stated_size(name):
    """Every `I... = "..." # D x t mm tube` line of a demo case agrees with the tube it names, to 1 %."""
    lines = (ROOT / "cases" / name).read_text(encoding="utf-8").splitlines()
    found = 0
    for ln in lines:
        m = re.match(r'\s*I\w*\s*=\s*"([\d.e+]+) mm\^4"\s*#\s*([\d.]+) x ([\d.]+) mm tube', ln)
        if m:
            found += 1
            assert float(m.group(1)) == pytest.approx(_tube_I(float(m.group(2)), float(m.group(3))), rel=0.01), ln
    assert found >= 1


def test_demo_data_says_where_it_follows_a_standard_size():
    """Demo files are invented; where a size is taken from a standard series, the file says so."""
    assert "standard rolled size" in (ROOT / "cases" / "crooked_post.toml").read_text(encoding="utf-8")
    head = (ROOT / "cases" / "demo_catalogue.csv").read_text(encoding="utf-8").split("name,")[0]
    assert "standard sizes" in head and "NOT real product data" in head
    for path in CASES:
        assert re.search(r"DEMO|invented", path.read_text(encoding="utf-8")[:600]), path.name
