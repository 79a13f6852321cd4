"""``[reliability]`` and ``stanchion reliability``: laws, sampling, statistics, the strength of sampled columns,
identical results however the samples are run, and the table's error messages.

The Dask cluster the test starts itself (two worker processes on 127.0.0.1) is started once for the module.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import numpy as np
import pytest

from fea.batch.distributions import EULER_GAMMA, make_distribution
from fea.batch.sampling import cholesky_factor, sample_values
from fea.batch.statistics import failure_probability, fractile, moments, reliability_index
from tests.conftest import run_cli

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "cases" / "reliability_crooked_column.toml"

#: A very stocky post without a bow (invented for the tests): its second-order first yield is the squash load.
STOCKY = """\
# DEMO (invented for a test): a very stocky post, straight, area and section modulus given
title = "stocky post (test)"
[material]
E = "210 GPa"
fy = "355 MPa"
[[segment]]
length = "0.6 m"
I = "20e6 mm^4"
A = "8000 mm^2"
[[restraint]]
at = "base"
lateral = "rigid"
[[restraint]]
at = "top"
lateral = "rigid"
[[load]]
at = "top"
axial = "100 kN"
[imperfection]
bow = "0 mm"
W = "200e3 mm^3"
analysis = "second-order"
[reliability]
samples = 200
seed = 7
strength = "first-yield"
[[reliability.variable]]
key = "material.fy"
distribution = "normal"
mean = "355 MPa"
sd = "20 MPa"
"""


def _phi(x: float) -> float:
    return 0.5 * math.erfc(-x / math.sqrt(2.0))


# -- laws and sampling -------------------------------------------------------------------------------------------

@pytest.mark.parametrize("kind, params", [
    ("normal", dict(mean=10.0, sd=2.0)),
    ("lognormal", dict(mean=3e6, cov=0.6)),
    ("uniform", dict(lower=0.15, upper=0.45)),
    ("gumbel", dict(mean=450e3, cov=0.25)),
])
def test_each_law_is_the_inverse_of_its_cdf_of_phi(kind, params):
    # x = F^-1(Phi(z)) for every law, so F(x) = Phi(z): the transformation of the Gaussian copula
    d = make_distribution(kind, "v", **params)
    z = np.linspace(-5, 5, 41)
    x = d.from_normal(z)
    assert np.allclose(d.cdf(x), [_phi(v) for v in z], rtol=1e-9, atol=1e-14)
    assert np.all(np.diff(x) > 0)


def test_laws_moments_match_their_parameters():
    # lognormal: zeta^2 = ln(1 + V^2), lambda = ln m - zeta^2/2; Gumbel (largest values): mean u + gamma beta,
    # sd pi beta / sqrt(6) (Melchers, Structural Reliability Analysis and Prediction, appendix of distributions;
    # from memory)
    ln = make_distribution("lognormal", "v", mean=300e6, cov=0.08)
    assert ln.mean == pytest.approx(300e6, rel=1e-12) and ln.sd == pytest.approx(24e6, rel=1e-12)
    gu = make_distribution("gumbel", "v", mean=450e3, cov=0.25)
    assert gu.a == pytest.approx(450e3 - EULER_GAMMA * 112.5e3 * math.sqrt(6) / math.pi, rel=1e-12)
    assert gu.mean == pytest.approx(450e3, rel=1e-12) and gu.sd == pytest.approx(112.5e3, rel=1e-12)
    # the sample moments of each law within their sampling errors (sample of 4000, fixed seed)
    for d in (ln, gu, make_distribution("uniform", "v", lower=0.15, upper=0.45)):
        x = np.array([sample_values([d], 11, i)[0] for i in range(4000)])
        m = moments(x)
        assert abs(m.mean - d.mean) < 4 * d.sd / math.sqrt(x.size)
        assert abs(m.sd - d.sd) < 0.08 * d.sd


def test_a_sample_depends_only_on_the_seed_and_its_index():
    dists = [make_distribution("normal", "v", mean=0.0, sd=1.0), make_distribution("gumbel", "v", mean=5.0, sd=1.0)]
    a = [sample_values(dists, 42, i) for i in range(50)]
    b = [sample_values(dists, 42, i) for i in reversed(range(50))][::-1]
    assert all(np.array_equal(x, y) for x, y in zip(a, b))
    assert not np.array_equal(sample_values(dists, 43, 0), a[0])


def test_correlation_of_the_normal_variables():
    # u = L z has correlation R (L the lower Cholesky factor of R); with normal marginals the variables have it too
    R = ((1.0, 0.6), (0.6, 1.0))
    dists = [make_distribution("normal", "v", mean=0.0, sd=1.0)] * 2
    L = cholesky_factor(R)
    x = np.array([sample_values(dists, 5, i, L) for i in range(5000)])
    r = np.corrcoef(x.T)[0, 1]
    assert abs(r - 0.6) < 4 * (1 - 0.36) / math.sqrt(5000)


# -- statistics -----------------------------------------------------------------------------------------------------

@pytest.mark.parametrize("rho", [0.0, 0.4])
def test_linear_limit_state_in_normal_variables(rho):
    # g = R - S with R, S normal: pf = Phi(-beta), beta = (mu_R - mu_S) / sqrt(s_R^2 + s_S^2 - 2 rho s_R s_S)
    # (Cornell's reliability index; Melchers, Structural Reliability Analysis and Prediction, chapter on
    # second-moment methods; from memory).  Sampled with the tool's own sampling and statistics.
    mu_r, s_r, mu_s, s_s = 9.0, 1.5, 5.0, 1.2
    beta = (mu_r - mu_s) / math.sqrt(s_r**2 + s_s**2 - 2 * rho * s_r * s_s)
    dists = [make_distribution("normal", "R", mean=mu_r, sd=s_r), make_distribution("normal", "S", mean=mu_s, sd=s_s)]
    L = cholesky_factor(((1.0, rho), (rho, 1.0)))
    n = 20000
    xs = np.array([sample_values(dists, 2026, i, L) for i in range(n)])
    k = int(np.sum(xs[:, 0] - xs[:, 1] < 0))
    p = failure_probability(k, n, 0.99)
    exact = _phi(-beta)
    assert abs(p.pf - exact) < 3.5 * math.sqrt(exact * (1 - exact) / n)
    assert p.lower <= exact <= p.upper
    assert p.beta_lower <= beta <= p.beta_upper
    assert p.beta == pytest.approx(reliability_index(p.pf))
    assert abs(p.beta - beta) < 3.5 * p.beta_se


def test_lognormal_limit_state():
    # ln R - ln S is normal: beta = (lambda_R - lambda_S) / sqrt(zeta_R^2 + zeta_S^2), pf = Phi(-beta), exact for
    # lognormal R and S (Melchers, chapter on second-moment methods; from memory)
    R = make_distribution("lognormal", "R", mean=2.0, cov=0.2)
    S = make_distribution("lognormal", "S", mean=1.0, cov=0.3)
    beta = (R.a - S.a) / math.hypot(R.b, S.b)
    n = 20000
    xs = np.array([sample_values([R, S], 3, i) for i in range(n)])
    k = int(np.sum(xs[:, 0] < xs[:, 1]))
    exact = _phi(-beta)
    assert abs(k / n - exact) < 3.5 * math.sqrt(exact * (1 - exact) / n)


def test_fractile_interval_from_order_statistics():
    from scipy.special import bdtr

    x = np.arange(1.0, 201.0)  # sorted values 1..200: x_(k) = k
    f = fractile(x[::-1], 0.05, 0.95)
    assert f.rank == 10 and f.value == 10.0
    # coverage P(r <= B <= s - 1) >= 0.95 with B ~ binomial(200, 0.05), and the interval cannot shrink by a rank
    cov = bdtr(f.upper_rank - 1, 200, 0.05) - bdtr(f.lower_rank - 1, 200, 0.05)
    assert cov >= 0.95
    assert bdtr(f.lower_rank, 200, 0.05) > 0.025 and bdtr(f.upper_rank - 2, 200, 0.05) < 0.975
    assert (f.lower, f.upper) == (float(f.lower_rank), float(f.upper_rank))
    small = fractile(np.arange(30.0), 0.05, 0.95)
    assert small.lower is None  # 30 samples cannot bound the 5% fractile from below at 95%


def test_no_failure_gives_an_upper_bound():
    p = failure_probability(0, 1000, 0.95)
    assert p.pf == 0 and math.isinf(p.beta) and p.lower == 0
    # exact one-sided bound of a binomial proportion with no event: 1 - (alpha/2)^(1/n) (Clopper-Pearson)
    assert p.upper == pytest.approx(1 - 0.025 ** (1 / 1000), rel=1e-9)


# -- the command ------------------------------------------------------------------------------------------------------

@pytest.fixture(scope="module")
def cluster():
    """A local Dask cluster of two worker processes on the loopback address, started once for the module."""
    distributed = pytest.importorskip("distributed")
    with distributed.LocalCluster(host="127.0.0.1", n_workers=2, processes=True, threads_per_worker=1,
                                  dashboard_address=None) as c:
        yield c


@pytest.fixture()
def stocky(tmp_path) -> Path:
    p = tmp_path / "stocky.toml"
    p.write_text(STOCKY, encoding="utf-8")
    return p


def test_normal_fy_passes_to_the_squash_load(stocky, tmp_path):
    # A straight, very stocky column yields first at the squash load N = A fy (elastic theory: its critical load is
    # far higher; any mechanics text): each sample's first-yield load factor is A fy / P, so a normal fy gives a
    # normal strength with mean A mu / P and 5% fractile A (mu - 1.645 sigma) / P
    out = run_cli("reliability", str(stocky), "--serial", "--json", str(tmp_path / "r.json"))
    assert out.returncode == 0, out.stderr
    data = json.loads((tmp_path / "r.json").read_text())["reliability"]
    A, P, mu, sd = 8000e-6, 100e3, 355e6, 20e6
    for s in data["sample_values"]:
        assert s["strength"] == pytest.approx(A * s["values_si"][0] / P, rel=1e-9)
    st = data["statistics"]
    assert abs(st["mean"] - A * mu / P) < 3 * st["mean_standard_error"]
    f = st["fractile"]
    assert f["lower"] <= A * (mu - 1.6448536269514722 * sd) / P <= f["upper"]
    assert [s["index"] for s in data["sample_values"]] == list(range(200))


def _samples(path: Path) -> tuple[list, dict]:
    d = json.loads(path.read_text())["reliability"]
    return d["sample_values"], d["statistics"]


def test_serial_local_cluster_and_scheduler_agree(stocky, tmp_path, cluster):
    runs = {"serial": ["--serial"], "local": ["--workers", "2", "--chunk", "5"],
            "scheduler": ["--scheduler", cluster.scheduler_address, "--chunk", "3"]}
    got = {}
    for name, opts in runs.items():
        f = tmp_path / f"{name}.json"
        out = run_cli("reliability", str(stocky), "--samples", "24", *opts, "--json", str(f))
        assert out.returncode == 0, (name, out.stderr)
        got[name] = _samples(f)
    assert got["serial"] == got["local"] == got["scheduler"]  # bit for bit


def test_nonlinear_strength_identical_on_the_cluster(tmp_path, cluster):
    # the demo's crooked column (fully nonlinear ultimate load), a few samples in this process and on the cluster
    a, b = tmp_path / "a.json", tmp_path / "b.json"
    assert run_cli("reliability", str(DEMO), "--samples", "4", "--serial", "--json", str(a)).returncode in (0, 1)
    out = run_cli("reliability", str(DEMO), "--samples", "4", "--scheduler", cluster.scheduler_address, "--chunk",
                  "1", "--json", str(b))
    assert out.returncode in (0, 1), out.stderr
    sa, sb = _samples(a)[0], _samples(b)[0]
    assert [s["index"] for s in sb] == [0, 1, 2, 3]
    for x, y in zip(sa, sb):
        assert x["values_si"] == y["values_si"]
        assert y["strength"] == pytest.approx(x["strength"], rel=1e-12, abs=0)


def test_demo_outputs_and_figures(tmp_path):
    out = run_cli("reliability", str(DEMO), "--samples", "6", "--serial", "--csv", str(tmp_path / "s.csv"),
                  "--plot", str(tmp_path / "h.png"), "--json", str(tmp_path / "r.json"))
    assert out.returncode == 0, out.stderr
    assert (tmp_path / "h.png").stat().st_size > 0 and (tmp_path / "h-cdf.png").stat().st_size > 0
    lines = (tmp_path / "s.csv").read_text().splitlines()
    assert lines[0].startswith("index,restraint[1].rotation [N*m/rad],imperfection.bow [m]") and len(lines) == 7
    d = json.loads((tmp_path / "r.json").read_text())["reliability"]
    assert d["failure"]["n"] == 6 and d["design_load"]["load_factor"] == 1.0
    assert "reliability index beta" in out.stdout


def test_check_parses_and_ignores_the_table():
    out = run_cli("check", str(DEMO), "--json")
    assert out.returncode == 0, out.stderr
    assert "reliability" not in json.loads(out.stdout)


def test_a_sample_without_strength_is_counted_and_named(tmp_path):
    # a normal E wide enough to give negative values: those samples are refused by the case-file checks
    text = STOCKY.replace('samples = 200', 'samples = 40').replace(
        'key = "material.fy"\ndistribution = "normal"\nmean = "355 MPa"\nsd = "20 MPa"',
        'key = "material.E"\ndistribution = "normal"\nmean = "210 GPa"\nsd = "150 GPa"')
    p = tmp_path / "wide.toml"
    p.write_text(text, encoding="utf-8")
    out = run_cli("reliability", str(p), "--serial", "--json", str(tmp_path / "w.json"))
    assert out.returncode == 1
    d = json.loads((tmp_path / "w.json").read_text())
    missing = [s for s in d["reliability"]["sample_values"] if s["strength"] is None]
    assert missing and all("material.E" in s["message"] for s in missing)
    assert d["reliability"]["statistics"]["n_without_strength"] == len(missing)
    assert any("left out of the statistics" in w for w in d["warnings"])


@pytest.mark.parametrize("change, field", [
    (('samples = 200', 'sample = 200'), "reliability.sample: unknown key; did you mean `samples`?"),
    (('distribution = "normal"', 'distribution = "weibull"'), "reliability.variable[1].distribution: "),
    (('key = "material.fy"', 'key = "restraint[5].rotation"'), "reliability.variable[1].key: "),
    (('key = "material.fy"', 'key = "segment[x].fy"'), "reliability.variable[1].key: "),
    (('sd = "20 MPa"', 'sd = "20 MPa"\ncov = 0.1'), "reliability.variable[1].sd: "),
    (('mean = "355 MPa"', 'mean = "355 kN"'), "reliability.variable[1].mean: "),
    (('strength = "first-yield"', 'strength = "ultimatum"'), "reliability.strength: "),
    (('seed = 7', 'seed = -1'), "reliability.seed: "),
    (('seed = 7', 'seed = 7\ndesign_load = "0 kN"'), "reliability.design_load: "),
    (('seed = 7', 'seed = 7\ncorrelation = [[1.0, 0.2], [0.2, 1.0]]'), "reliability.correlation: "),
    (('distribution = "normal"\nmean = "355 MPa"\nsd = "20 MPa"', 'distribution = "lognormal"\nmean = "-355 MPa"\n'
      'cov = 0.1'), "reliability.variable[1].mean: "),
    (('distribution = "normal"\nmean = "355 MPa"\nsd = "20 MPa"', 'distribution = "uniform"\nlower = "400 MPa"\n'
      'upper = "300 MPa"'), "reliability.variable[1].upper: "),
])
def test_bad_reliability_tables(tmp_path, change, field):
    p = tmp_path / "bad.toml"
    p.write_text(STOCKY.replace(*change), encoding="utf-8")
    for cmd in ("check", "reliability"):
        out = run_cli(cmd, str(p), "--serial") if cmd == "reliability" else run_cli(cmd, str(p))
        assert out.returncode == 2, (cmd, out.stdout, out.stderr)
        assert out.stderr.count("\n") == 1 and field in out.stderr, out.stderr


def test_correlation_must_be_positive_definite(tmp_path):
    text = STOCKY + ('\n[[reliability.variable]]\nkey = "material.E"\ndistribution = "normal"\nmean = "210 GPa"\n'
                     'cov = 0.03\n')
    text = text.replace("seed = 7", "seed = 7\ncorrelation = [[1.0, 1.0], [1.0, 1.0]]")
    p = tmp_path / "pd.toml"
    p.write_text(text, encoding="utf-8")
    out = run_cli("check", str(p))
    assert out.returncode == 2 and "reliability.correlation: is not positive definite" in out.stderr


def test_a_design_force_needs_fixed_loads(tmp_path):
    text = STOCKY.replace("seed = 7", 'seed = 7\ndesign_load = "150 kN"') + (
        '\n[[reliability.variable]]\nkey = "load[1].axial"\ndistribution = "gumbel"\nmean = "100 kN"\ncov = 0.2\n')
    p = tmp_path / "f.toml"
    p.write_text(text, encoding="utf-8")
    out = run_cli("check", str(p))
    assert out.returncode == 2 and "reliability.design_load: a force needs fixed loads" in out.stderr


def test_design_force_becomes_a_load_factor(stocky, tmp_path):
    # 2,500 kN on a case whose variable load is 100 kN: load factor 25
    p = tmp_path / "force.toml"
    p.write_text(STOCKY.replace("seed = 7", 'seed = 7\ndesign_load = "2500 kN"').replace("samples = 200",
                                                                                        "samples = 20"))
    out = run_cli("reliability", str(p), "--serial", "--json", str(tmp_path / "f.json"))
    assert out.returncode == 0, out.stderr
    d = json.loads((tmp_path / "f.json").read_text())["reliability"]
    assert d["design_load"]["load_factor"] == pytest.approx(25.0, rel=1e-12)
    strengths = [s["strength"] for s in d["sample_values"]]
    assert d["failure"]["failures"] == sum(1 for s in strengths if s < 25.0)


def test_distributed_is_not_loaded_by_check():
    # fea.batch.execute is the only user of Dask, imported inside the functions that run chunks.  (pint itself
    # imports dask.base when dask is installed: that part of dask is not ours to keep out.)
    import subprocess
    import sys

    code = ("import contextlib, io, sys\nfrom fea.cli import main\n"
            "with contextlib.redirect_stdout(io.StringIO()):\n"
            f"    main(['check', {str(DEMO)!r}])\n"
            "print('distributed' in sys.modules, 'fea.batch.execute' in sys.modules, 'dask.array' in sys.modules)")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT, timeout=120)
    assert out.stdout.split() == ["False", "False", "False"], out.stderr
