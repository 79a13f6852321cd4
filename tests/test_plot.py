"""Mode-shape figures: panels, titles, file formats, and no matplotlib on ``import fea``."""

from __future__ import annotations

import os
import subprocess
import sys
import xml.etree.ElementTree as ET

import pytest

from fea import buckling
from fea.errors import ModelError
from fea.model import FREE, RIGID, Column, DistributedLoad, Foundation, LeaningLoad, PointLoad, Restraint, Segment
from fea.plot import draw_column, format_load_factor, plot_modes, plot_planes, plot_sketch, save_figure

from .conftest import E_STEEL, I_DEMO, one_segment


def stepped_column() -> Column:
    """Two segments, partially fixed base, spring at mid-height, loads at the step and the top."""
    return Column(
        segments=(Segment(5.0, E_STEEL, 2.5e-5), Segment(3.0, E_STEEL, 8.0e-6)),
        restraints=(Restraint(0.0, RIGID, 4.0e6), Restraint(4.0, 2.0e5, FREE), Restraint(8.0, RIGID, FREE)),
        point_loads=(PointLoad(5.0, 300e3), PointLoad(8.0, 150e3), PointLoad(8.0, 80e3, permanent=True)),
        title="stepped demo",
    )


def pole() -> Column:
    """Tapered cantilever pole with a foundation strip and a permanent distributed load."""
    return Column(
        segments=(Segment(10.0, E_STEEL, 4.0e-5, I_top=1.0e-5, taper_exponent=3.0),),
        restraints=(Restraint(0.0, RIGID, FREE),),
        foundations=(Foundation(0.0, 2.5, 2.0e6, 8.0e6),),
        point_loads=(PointLoad(10.0, 40e3),),
        distributed_loads=(DistributedLoad(0.0, 10.0, 1.5e3, permanent=True),),
    )


@pytest.fixture(scope="module")
def stepped():
    col = stepped_column()
    return col, buckling(col, n_modes=3)


def mode_axes(fig):
    return [ax for ax in fig.axes if ax.get_label().startswith("mode ")]


def test_import_fea_does_not_import_matplotlib():
    code = "import fea, fea.plot, sys; assert 'matplotlib' not in sys.modules, 'matplotlib imported'"
    env = dict(os.environ, MPLBACKEND="Agg")
    run = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, env=env)
    assert run.returncode == 0, run.stderr


@pytest.mark.parametrize("n_modes", [1, 2, 3])
def test_one_panel_per_mode_plus_model_and_key(stepped, n_modes):
    col, res = stepped
    fig = plot_modes(col, res, n_modes=n_modes)
    assert len(mode_axes(fig)) == n_modes
    labels = [ax.get_label() for ax in fig.axes]
    assert labels.count("model") == 1 and labels.count("key") == 1


def test_more_modes_asked_than_computed_draws_what_there_is():
    col = one_segment()
    res = buckling(col, n_modes=2)
    assert len(mode_axes(plot_modes(col, res, n_modes=5))) == 2


def test_panel_titles_carry_the_load_factors(stepped):
    col, res = stepped
    fig = plot_modes(col, res)
    for k, ax in enumerate(mode_axes(fig)):
        title = ax.get_title()
        assert f"mode {k + 1}" in title
        assert f"λ = {format_load_factor(res.load_factors[k])}" in title


def test_panels_share_the_height_axis_and_label_it(stepped):
    col, res = stepped
    fig = plot_modes(col, res, length_unit=("mm", 1e-3))
    model = next(ax for ax in fig.axes if ax.get_label() == "model")
    assert model.get_ylabel() == "height [mm]"
    for ax in mode_axes(fig):
        assert ax.get_ylim() == model.get_ylim()
    ticks = [t.get_text() for t in model.get_yticklabels()]
    assert "8000" in ticks and "0" in ticks


def test_load_labels_use_the_display_units(stepped):
    col, res = stepped
    fig = plot_modes(col, res, force_unit=("kN", 1e3))
    texts = [t.get_text() for ax in fig.axes for t in ax.texts]
    joined = "\n".join(texts)
    assert "300 kN" in joined
    assert "80 kN perm." in joined
    assert "200 kN/m" in joined          # lateral spring
    assert "4 MN*m/rad" in joined      # rotational spring


def test_format_load_factor():
    assert format_load_factor(12.3912) == "12.39"
    assert format_load_factor(0.851349) == "0.8513"
    assert format_load_factor(1234.6) == "1235"     # 4 significant figures
    assert format_load_factor(2.1e6) == "2.1·10⁶"


def test_figure_fits_an_a4_page(stepped):
    col, res = stepped
    w, h = plot_modes(col, res).get_size_inches()
    assert 6.5 <= w <= 10.0 and h <= 9.0


def test_plot_planes_groups_and_names_the_governing_plane():
    major = one_segment(I=4 * I_DEMO, base=(RIGID, RIGID))
    minor = Column(segments=(Segment(4.0, E_STEEL, I_DEMO),),
                   restraints=(Restraint(0.0, RIGID), Restraint(2.0, RIGID), Restraint(4.0, RIGID)),
                   point_loads=(PointLoad(4.0, 1.0),), leaning_loads=(LeaningLoad(4.0, 0.5, 4.0),))
    r_major, r_minor = buckling(major, axis="major"), buckling(minor, axis="minor")
    fig = plot_planes([("major", major, r_major), ("minor", minor, r_minor)], n_modes=2)
    assert len(mode_axes(fig)) == 4
    assert [ax.get_label() for ax in fig.axes].count("model") == 2
    gov = "major" if r_major.load_factor < r_minor.load_factor else "minor"
    lam = min(r_major.load_factor, r_minor.load_factor)
    title = fig._suptitle.get_text()
    assert f"governing: {gov} axis" in title and format_load_factor(lam) in title
    headings = [t.get_text() for t in fig.texts]
    assert "major axis" in " ".join(headings) and "minor axis" in " ".join(headings)
    assert f"{gov} axis (governs)" in headings


def test_plot_planes_refuses_bad_input(stepped):
    col, res = stepped
    with pytest.raises(ModelError, match="no bending planes"):
        plot_planes([])
    with pytest.raises(ModelError, match="expected \\(axis_label, column, result\\)"):
        plot_planes([(col, res)])
    with pytest.raises(ModelError, match="unknown keyword"):
        plot_planes([("y", col, res)], colour="red")


def test_result_of_another_column_is_refused(stepped):
    col, res = stepped
    with pytest.raises(ModelError, match="does not belong"):
        plot_modes(one_segment(), res)


def test_bad_units_refused(stepped):
    col, res = stepped
    with pytest.raises(ModelError, match="force_unit"):
        plot_modes(col, res, force_unit="kN")


def test_draw_into_given_axes(stepped):
    from matplotlib.figure import Figure

    col, res = stepped
    fig = Figure(figsize=(8, 5))
    axes = fig.subplots(1, 3)
    out = plot_modes(col, res, ax_list=axes)
    assert out is fig
    assert [ax.get_label() for ax in axes] == ["model", "mode 1", "mode 2"]
    with pytest.raises(ModelError, match="ax_list"):
        plot_modes(col, res, ax_list=axes[:1])


@pytest.mark.parametrize("ext", ["png", "svg", "pdf", "PNG"])
def test_save_each_format(tmp_path, stepped, ext):
    col, res = stepped
    path = save_figure(plot_modes(col, res), tmp_path / f"modes.{ext}")
    data = path.read_bytes()
    assert data
    kind = ext.lower()
    if kind == "png":
        assert data.startswith(b"\x89PNG\r\n\x1a\n")
    elif kind == "svg":
        root = ET.fromstring(data)
        assert root.tag.endswith("svg") and b"<svg" in data
    else:
        assert data.startswith(b"%PDF")
    assert [p.name for p in tmp_path.iterdir()] == [path.name]   # no temporary file left behind


def test_pole_with_foundation_and_distributed_load(tmp_path):
    col = pole()
    res = buckling(col, n_modes=2)
    fig = plot_modes(col, res, n_modes=2)
    texts = "\n".join(t.get_text() for ax in fig.axes for t in ax.texts)
    assert "foundation" in texts and "MN/m²" in texts and "q = 1.5 kN/m perm." in texts
    assert save_figure(fig, tmp_path / "pole.png").stat().st_size > 0


def test_bad_extension_raises_and_writes_nothing(tmp_path, stepped):
    col, res = stepped
    fig = plot_modes(col, res, n_modes=1)
    with pytest.raises(ModelError, match=r"expected \.png, \.svg or \.pdf") as info:
        save_figure(fig, tmp_path / "modes.jpg")
    assert info.value.field == "plot"
    with pytest.raises(ModelError):
        save_figure(fig, tmp_path / "modes")
    assert list(tmp_path.iterdir()) == []


def test_failed_write_leaves_no_file(tmp_path, stepped, monkeypatch):
    col, res = stepped
    fig = plot_modes(col, res, n_modes=1)

    def boom(*args, **kwargs):
        raise RuntimeError("disk full")

    monkeypatch.setattr(fig, "savefig", boom)
    with pytest.raises(RuntimeError, match="disk full"):
        save_figure(fig, tmp_path / "modes.png")
    assert list(tmp_path.iterdir()) == []


def test_missing_folder_refused(tmp_path, stepped):
    col, res = stepped
    with pytest.raises(ModelError, match="does not exist"):
        save_figure(plot_modes(col, res, n_modes=1), tmp_path / "nowhere" / "modes.png")


def test_many_segments_and_stations_keep_tick_labels_apart():
    segs = tuple(Segment(1.0 + 0.2 * i, E_STEEL, I_DEMO * (1 + i)) for i in range(6))
    col = Column(segments=segs,
                 restraints=(Restraint(0.0, RIGID, RIGID), Restraint(0.5, 1e5), Restraint(3.1, 2e5, 1e5),
                             Restraint(sum(s.length for s in segs), RIGID)),
                 point_loads=tuple(PointLoad(x, 1e3 * (i + 1), permanent=i % 2 == 1)
                                   for i, x in enumerate((1.0, 2.2, 3.6, 5.2, 7.0, 9.0))))
    res = buckling(col, n_modes=3)
    from matplotlib.backends.backend_agg import FigureCanvasAgg

    fig = plot_modes(col, res)
    model = next(ax for ax in fig.axes if ax.get_label() == "model")
    canvas = FigureCanvasAgg(fig)
    canvas.draw()
    r = canvas.get_renderer()
    boxes = [t.get_window_extent(r) for t in model.get_yticklabels() if t.get_text()]
    assert len(boxes) >= 3
    for a, b in zip(boxes, boxes[1:]):
        assert not a.overlaps(b)
    # nor do the load labels on the right or the spring and I labels on the left
    for side in ("left", "right"):
        boxes = [t.get_window_extent(r) for t in model.texts if t.get_ha() == side]
        assert boxes
        for i, a in enumerate(boxes):
            for b in boxes[i + 1:]:
                assert not a.overlaps(b)


# -- one drawing of the column (issue 10) ---------------------------------------------------------

LIGHT_MODULES = ("modes", "column", "symbols", "key", "labels", "layout", "text", "style", "output", "imperfect")


def test_plot_modules_import_without_matplotlib():
    """A caller may hold a figure function without loading matplotlib (the pipeline's list of analyses does)."""
    code = ("import sys\n" + "".join(f"import fea.plot.{m}\n" for m in LIGHT_MODULES)
            + "from fea.plot.modes import plot_modes, plot_planes, plot_sketch\n"
            + "from fea.plot import draw_column, save_figure\n"
            + "assert 'matplotlib' not in sys.modules, 'matplotlib imported'")
    run = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         env=dict(os.environ, MPLBACKEND="Agg"))
    assert run.returncode == 0, run.stderr


def test_sketch_is_the_model_panel_of_the_mode_figure(stepped):
    col, res = stepped
    sketch = plot_sketch([("major", col), ("minor", pole())])
    labels = [ax.get_label() for ax in sketch.axes]
    assert labels.count("model") == 2 and labels.count("key") == 1 and not mode_axes(sketch)
    assert [t.get_text() for t in sketch.texts] == ["major axis", "minor axis"]
    # the same labels, in the same number format, as the model panel beside the modes
    model = next(ax for ax in plot_modes(col, res).axes if ax.get_label() == "model")
    drawn = next(ax for ax in sketch.axes if ax.get_label() == "model")
    assert [t.get_text() for t in drawn.texts] == [t.get_text() for t in model.texts]
    assert [t.get_text() for t in drawn.get_yticklabels()] == [t.get_text() for t in model.get_yticklabels()]
    with pytest.raises(ModelError, match="no bending planes"):
        plot_sketch([])
    with pytest.raises(ModelError, match="expected \\(axis_label, column\\)"):
        plot_sketch([("major", col, res)])


def test_draw_column_on_given_axes(stepped):
    from matplotlib.figure import Figure

    col, _ = stepped
    ax = Figure(figsize=(3, 5)).add_axes((0.2, 0.1, 0.75, 0.8))
    assert draw_column(ax, col, force_unit=("kN", 1e3)) is ax
    assert ax.get_label() == "model" and "300 kN" in "\n".join(t.get_text() for t in ax.texts)


def test_report_sketch_is_drawn_by_the_plot_package():
    from fea.io.case import load_case
    from fea.report.sketch import column_sketch

    case = load_case(os.path.join(os.path.dirname(__file__), "..", "cases", "crane_column.toml"))
    svg = column_sketch(case, case.display)
    root = ET.fromstring(svg)
    assert root.tag.endswith("svg") and root.get("viewBox")
    assert 'id="sketch-' in svg and "<text" not in svg   # a matplotlib figure, its text drawn as outlines


def test_number_format_of_the_drawing():
    from fea.plot.text import format_number

    assert format_number(310e3 / 1e3) == "310"
    assert format_number(7.8) == "7.8"
    assert format_number(-0.5) == "−0.5"
    assert format_number(2.0e6) == "2·10⁶"
    assert format_number(0.26, 2) == "0.26"
