"""The written-out formulas of the EN 1993-1-1:2005 checks with bending, and their constants and tables.

One home for every formula of :mod:`fea.design.bending_en` (the checks pick
them by name from :data:`STEPS`).  The flexural reduction factor reuses the
steps of 6.3.1.2 of :mod:`fea.design.standards.en1993`, renamed per axis.
Annex A, Annex B, 6.3.2.3, 6.2.9.1 and Tables 6.4 to 6.6 are written from
memory (the document was not at hand).
"""

from __future__ import annotations

from .bending_record import renamed
from .standards.en1993 import EN1993_IMPERFECTION
from .standards.en1993 import STEPS as EN1993_STEPS
from .standards.record import Step

__all__ = ["NAME", "LT_IMPERFECTION", "LTB_METHODS", "LT_CURVES", "ANNEXES", "KC_SPAN", "B3_TABLE", "STEPS"]

NAME = "EN 1993-1-1"
_LT = "EN 1993-1-1 6.3.2.2"
_LT3 = "EN 1993-1-1 6.3.2.3"
_KC = "EN 1993-1-1 Table 6.6"
_INT = "EN 1993-1-1 6.3.3"
_B = "EN 1993-1-1 Annex B"
_B3 = "EN 1993-1-1 Table B.3"
_A = "EN 1993-1-1 Annex A"
_A2 = "EN 1993-1-1 Table A.2"
_S = "EN 1993-1-1 6.2"
_RK = "EN 1993-1-1 Table 6.7"

#: Imperfection factors alpha_LT of the lateral-torsional buckling curves, EN 1993-1-1 Table 6.3: the values of
#: Table 6.1 for curves a to d.
LT_IMPERFECTION: dict[str, float] = {k: v for k, v in EN1993_IMPERFECTION.items() if k != "a0"}

#: The two ways of 6.3.2 to get chi_LT: the general case (6.3.2.2) and rolled or equivalent welded sections
#: (6.3.2.3, with the recommended lambda_LT,0 = 0.4 and beta = 0.75, from memory).  lambda_LT0 is also the
#: plateau of 6.3.2.2(4).
LTB_METHODS: dict[str, dict[str, float]] = {
    "general": {"lambda_LT0": 0.2},
    "rolled": {"lambda_LT0": 0.4, "beta_LT": 0.75},
}
#: Lateral-torsional buckling curves by method, fabrication and h/b (<= 2, > 2): Table 6.4 (general case) and
#: Table 6.5 (rolled or equivalent welded), from memory.  Other cross-sections: curve d (Table 6.4 only).
LT_CURVES: dict[str, dict[str, tuple[str, str]]] = {
    "general": {"rolled": ("a", "b"), "welded": ("c", "d"), "other": ("d", "d")},
    "rolled": {"rolled": ("b", "c"), "welded": ("c", "d")},
}
#: The interaction factors a member check may take: Annex A (Method 1) or Annex B (Method 2).
ANNEXES = ("A", "B")

#: What Table 6.6 gives (k_c) for a diagram kind without end moments (from memory).
KC_SPAN = {"uniform load": "0.94", "point load": "0.86"}


def _axis(step: Step, ax: str, extra: dict[str, str] | None = None, ref: str | None = None) -> Step:
    names = {"slenderness": f"lambda_{ax}", "N_cr_N": f"N_cr_{ax}_N", "phi": f"Phi_{ax}", "alpha": f"alpha_{ax}",
             "reduction_factor": f"chi_{ax}", "plateau": f"plateau_{ax}"}
    return renamed(step, {**names, **(extra or {})}, ref)


def _table_b3() -> dict[str, Step]:
    """Table B.3 by branch, with generic names psi, alpha_s, alpha_h -> C_m (from memory)."""
    raw = {
        "end moments": "max(0.6 + 0.4 * psi, 0.4)",
        "sway": "0.9",
        "uniform load s+": "max(0.2 + 0.8 * alpha_s, 0.4)",
        "point load s+": "max(0.2 + 0.8 * alpha_s, 0.4)",
        "uniform load s-": "max(0.1 - 0.8 * alpha_s, 0.4)",
        "point load s-": "max(-0.8 * alpha_s, 0.4)",
        "uniform load s- psi-": "max(0.1 * (1 - psi) - 0.8 * alpha_s, 0.4)",
        "point load s- psi-": "max(0.2 * (-psi) - 0.8 * alpha_s, 0.4)",
        "uniform load h": "0.95 + 0.05 * alpha_h",
        "point load h": "0.90 + 0.10 * alpha_h",
        "uniform load h- psi-": "0.95 + 0.05 * alpha_h * (1 + 2 * psi)",
        "point load h- psi-": "0.90 + 0.10 * alpha_h * (1 + 2 * psi)",
    }
    return {k: Step("C_m", v, _B3) for k, v in raw.items()}


B3_TABLE = _table_b3()


def _cm_names(ax: str) -> dict[str, str]:
    return {"psi": f"psi_{ax}", "alpha_s": f"alpha_s_{ax}", "alpha_h": f"alpha_h_{ax}", "C_m": f"C_m{ax}"}


def _build_steps() -> dict[str, Step]:
    s: dict[str, Step] = {}
    # Table 6.7: characteristic resistances (classes 1-3)
    s["N_Rk"] = Step("N_Rk_N", "A_m2 * fy_Pa", _RK)
    s["M_y_Rk"] = Step("M_y_Rk_Nm", "W_y_m3 * fy_Pa", _RK)
    s["M_z_Rk"] = Step("M_z_Rk_Nm", "W_z_m3 * fy_Pa", _RK)
    # 6.3.1.2: the flexural reduction factor per axis (Eq. 6.49, the steps of the compression check)
    for ax in ("y", "z"):
        for name in ("slenderness", "plateau", "phi", "chi"):
            s[f"{name}_{ax}"] = _axis(EN1993_STEPS[name], ax)
        s[f"n_{ax}"] = Step(f"n_{ax}", f"N_Ed_N / (chi_{ax} * N_Rk_N / gamma_M1)", _B)
    # 6.3.2.2 (6.56): the same curve with alpha_LT and lambda_LT; 6.3.2.2(4) the plateau
    s["lambda_LT"] = Step("lambda_LT", "sqrt(W_y_m3 * fy_Pa / M_cr_Nm)", _LT)
    s["plateau_LT"] = Step("plateau_LT", "lambda_LT <= lambda_LT0", _LT)
    s["plateau_LT_moment"] = Step("plateau_LT_moment", "M_y_Ed_Nm / M_cr_Nm <= lambda_LT0**2", _LT)
    lt = {"slenderness": "lambda_LT", "alpha": "alpha_LT", "phi": "Phi_LT", "reduction_factor": "chi_LT"}
    s["Phi_LT"] = renamed(EN1993_STEPS["phi"], lt, _LT)
    s["chi_LT"] = renamed(EN1993_STEPS["chi"], lt, _LT)
    # 6.3.2.3 (6.57), (6.58) with Table 6.6 (from memory)
    s["Phi_LT_rolled"] = Step("Phi_LT", "0.5 * (1 + alpha_LT * (lambda_LT - lambda_LT0) + beta_LT * lambda_LT**2)",
                              _LT3)
    s["chi_LT_rolled"] = Step("chi_LT_rolled",
                              "min(1 / (Phi_LT + sqrt(Phi_LT**2 - beta_LT * lambda_LT**2)), 1, 1 / lambda_LT**2)",
                              _LT3)
    s["f_mod"] = Step("f_mod", "min(1 - 0.5 * (1 - k_c) * (1 - 2.0 * (lambda_LT - 0.8)**2), 1)", _LT3)
    s["chi_LT_mod"] = Step("chi_LT", "min(chi_LT_rolled / f_mod, 1, 1 / lambda_LT**2)", _LT3)
    s["k_c end moments"] = Step("k_c", "1 / (1.33 - 0.33 * psi_LT)", _KC)
    for kind, value in KC_SPAN.items():
        s[f"k_c {kind}"] = Step("k_c", value, _KC)
    s["k_c other"] = Step("k_c", "1.0", _KC)
    s["M_b_Rd"] = Step("M_b_Rd_Nm", "chi_LT * W_y_m3 * fy_Pa / gamma_M1", "EN 1993-1-1 6.3.2.1")
    s["u_6_54"] = Step("u_6_54", "M_y_Ed_Nm / M_b_Rd_Nm", "EN 1993-1-1 6.3.2.1")
    # Table B.3, per axis
    for ax in ("y", "z", "LT"):
        for branch, step in B3_TABLE.items():
            s[f"C_m{ax} {branch}"] = renamed(step, _cm_names(ax))
    # Table B.1 (not susceptible to torsional deformations) and B.2 (susceptible), from memory
    s["k_yy plastic"] = Step("k_yy", "min(C_my * (1 + (lambda_y - 0.2) * n_y), C_my * (1 + 0.8 * n_y))", _B)
    s["k_zz plastic I"] = Step("k_zz", "min(C_mz * (1 + (2 * lambda_z - 0.6) * n_z), C_mz * (1 + 1.4 * n_z))", _B)
    s["k_zz plastic RHS"] = Step("k_zz", "min(C_mz * (1 + (lambda_z - 0.2) * n_z), C_mz * (1 + 0.8 * n_z))", _B)
    s["k_yz plastic"] = Step("k_yz", "0.6 * k_zz", _B)
    s["k_zy plastic"] = Step("k_zy", "0.6 * k_yy", _B)
    s["k_yy elastic"] = Step("k_yy", "min(C_my * (1 + 0.6 * lambda_y * n_y), C_my * (1 + 0.6 * n_y))", _B)
    s["k_zz elastic"] = Step("k_zz", "min(C_mz * (1 + 0.6 * lambda_z * n_z), C_mz * (1 + 0.6 * n_z))", _B)
    s["k_yz elastic"] = Step("k_yz", "k_zz", _B)
    s["k_zy elastic"] = Step("k_zy", "0.8 * k_yy", _B)
    s["stocky_z"] = Step("stocky_z", "lambda_z < 0.4", _B)
    s["k_zy plastic LT"] = Step("k_zy", "max(1 - 0.1 * lambda_z * n_z / (C_mLT - 0.25), "
                                        "1 - 0.1 * n_z / (C_mLT - 0.25))", _B)
    s["k_zy plastic LT stocky"] = Step("k_zy", "min(0.6 + lambda_z, 1 - 0.1 * lambda_z * n_z / (C_mLT - 0.25))", _B)
    s["k_zy elastic LT"] = Step("k_zy", "max(1 - 0.05 * lambda_z * n_z / (C_mLT - 0.25), "
                                        "1 - 0.05 * n_z / (C_mLT - 0.25))", _B)
    # 6.3.3 (6.61), (6.62) with Delta M = 0 (classes 1-3)
    s["u_6_61"] = Step("u_6_61", "N_Ed_N / (chi_y * N_Rk_N / gamma_M1) + k_yy * M_y_Ed_Nm / (chi_LT * M_y_Rk_Nm / "
                                 "gamma_M1) + k_yz * M_z_Ed_Nm / (M_z_Rk_Nm / gamma_M1)", _INT)
    s["u_6_62"] = Step("u_6_62", "N_Ed_N / (chi_z * N_Rk_N / gamma_M1) + k_zy * M_y_Ed_Nm / (chi_LT * M_y_Rk_Nm / "
                                 "gamma_M1) + k_zz * M_z_Ed_Nm / (M_z_Rk_Nm / gamma_M1)", _INT)
    # Annex A (Method 1): Table A.2 per axis, Table A.1 auxiliary terms and factors (from memory)
    a2 = {"end moments": "0.79 + 0.21 * psi + 0.36 * (psi - 0.33) * N_Ed_N / N_cr_N",
          "uniform load": "1 - 0.18 * N_Ed_N / N_cr_N", "point load": "1 + 0.03 * N_Ed_N / N_cr_N"}
    for ax in ("y", "z"):
        for kind, expr in a2.items():
            s[f"C_m{ax}_0 {kind}"] = renamed(Step("C_m0", expr, _A2),
                                             {"psi": f"psi_{ax}", "N_cr_N": f"N_cr_{ax}_N", "C_m0": f"C_m{ax}_0"})
        s[f"mu_{ax}"] = Step(f"mu_{ax}", f"(1 - N_Ed_N / N_cr_{ax}_N) / (1 - chi_{ax} * N_Ed_N / N_cr_{ax}_N)", _A)
        s[f"w_{ax}"] = Step(f"w_{ax}", f"min(W_pl_{ax}_m3 / W_el_{ax}_m3, 1.5)", _A)
        s[f"M_pl_{ax}_Rd"] = Step(f"M_pl_{ax}_Rd_Nm", f"W_pl_{ax}_m3 * fy_Pa / gamma_M0", _S)
        s[f"C_m{ax} A"] = Step(f"C_m{ax}", f"C_m{ax}_0", _A)
    s["n_pl"] = Step("n_pl", "N_Ed_N / (N_Rk_N / gamma_M1)", _A)
    s["a_LT"] = Step("a_LT", "max(1 - J_m4 / I_y_m4, 0)", _A)
    s["lambda_max"] = Step("lambda_max", "max(lambda_y, lambda_z)", _A)
    s["C_1 k_c"] = Step("C_1", "1 / k_c**2", _A)
    s["C_1 M_cr0"] = Step("C_1", "M_cr_Nm / M_cr0_Nm", _A)
    s["M_cr0"] = Step("M_cr0_Nm", "M_cr_Nm / C_1", _A)
    s["lambda_0"] = Step("lambda_0", "sqrt(W_y_m3 * fy_Pa / M_cr0_Nm)", _A)
    s["lambda_0 small"] = Step("lambda_0_small", "lambda_0 <= 0.2 * sqrt(C_1) * ((1 - N_Ed_N / N_cr_z_N) * "
                                                 "(1 - N_Ed_N / N_cr_TF_N))**0.25", _A)
    s["lambda_0 small, no TF"] = Step("lambda_0_small", "lambda_0 <= 0.2 * sqrt(C_1) * (1 - N_Ed_N / N_cr_z_N)**0.25",
                                      _A)
    s["eps_y"] = Step("eps_y", "M_y_Ed_Nm / N_Ed_N * A_m2 / W_el_y_m3", _A)
    s["C_my LT"] = Step("C_my", "C_my_0 + (1 - C_my_0) * sqrt(eps_y) * a_LT / (1 + sqrt(eps_y) * a_LT)", _A)
    s["C_mLT"] = Step("C_mLT", "max(C_my**2 * a_LT / sqrt((1 - N_Ed_N / N_cr_z_N) * (1 - N_Ed_N / N_cr_T_N)), 1)", _A)
    s["C_mLT no T"] = Step("C_mLT", "max(C_my**2 * a_LT / sqrt(1 - N_Ed_N / N_cr_z_N), 1)", _A)
    s["b_LT"] = Step("b_LT", "0.5 * a_LT * lambda_0**2 * M_y_Ed_Nm / (chi_LT * M_pl_y_Rd_Nm) * M_z_Ed_Nm / "
                             "M_pl_z_Rd_Nm", _A)
    s["c_LT"] = Step("c_LT", "10 * a_LT * lambda_0**2 / (5 + lambda_z**4) * M_y_Ed_Nm / (C_my * chi_LT * "
                             "M_pl_y_Rd_Nm)", _A)
    s["d_LT"] = Step("d_LT", "2 * a_LT * lambda_0 / (0.1 + lambda_z**4) * M_y_Ed_Nm / (C_my * chi_LT * M_pl_y_Rd_Nm)"
                             " * M_z_Ed_Nm / (C_mz * M_pl_z_Rd_Nm)", _A)
    s["e_LT"] = Step("e_LT", "1.7 * a_LT * lambda_0 / (0.1 + lambda_z**4) * M_y_Ed_Nm / (C_my * chi_LT * "
                             "M_pl_y_Rd_Nm)", _A)
    s["C_yy"] = Step("C_yy", "max(1 + (w_y - 1) * ((2 - 1.6 / w_y * C_my**2 * lambda_max - 1.6 / w_y * C_my**2 * "
                             "lambda_max**2) * n_pl - b_LT), W_el_y_m3 / W_pl_y_m3)", _A)
    s["C_yz"] = Step("C_yz", "max(1 + (w_z - 1) * ((2 - 14 * C_mz**2 * lambda_max**2 / w_z**5) * n_pl - c_LT), "
                             "0.6 * sqrt(w_z / w_y) * W_el_z_m3 / W_pl_z_m3)", _A)
    s["C_zy"] = Step("C_zy", "max(1 + (w_y - 1) * ((2 - 14 * C_my**2 * lambda_max**2 / w_y**5) * n_pl - d_LT), "
                             "0.6 * sqrt(w_y / w_z) * W_el_y_m3 / W_pl_y_m3)", _A)
    s["C_zz"] = Step("C_zz", "max(1 + (w_z - 1) * ((2 - 1.6 / w_z * C_mz**2 * lambda_max - 1.6 / w_z * C_mz**2 * "
                             "lambda_max**2) * n_pl - e_LT), W_el_z_m3 / W_pl_z_m3)", _A)
    s["k_yy A plastic"] = Step("k_yy", "C_my * C_mLT * mu_y / (1 - N_Ed_N / N_cr_y_N) / C_yy", _A)
    s["k_yz A plastic"] = Step("k_yz", "C_mz * mu_y / (1 - N_Ed_N / N_cr_z_N) / C_yz * 0.6 * sqrt(w_z / w_y)", _A)
    s["k_zy A plastic"] = Step("k_zy", "C_my * C_mLT * mu_z / (1 - N_Ed_N / N_cr_y_N) / C_zy * 0.6 * sqrt(w_y / w_z)",
                               _A)
    s["k_zz A plastic"] = Step("k_zz", "C_mz * mu_z / (1 - N_Ed_N / N_cr_z_N) / C_zz", _A)
    s["k_yy A elastic"] = Step("k_yy", "C_my * C_mLT * mu_y / (1 - N_Ed_N / N_cr_y_N)", _A)
    s["k_yz A elastic"] = Step("k_yz", "C_mz * mu_y / (1 - N_Ed_N / N_cr_z_N)", _A)
    s["k_zy A elastic"] = Step("k_zy", "C_my * C_mLT * mu_z / (1 - N_Ed_N / N_cr_y_N)", _A)
    s["k_zz A elastic"] = Step("k_zz", "C_mz * mu_z / (1 - N_Ed_N / N_cr_z_N)", _A)
    # 6.2: cross-section resistance; 6.2.1(7) the linear sum; 6.2.9.1 class 1-2 I sections (from memory)
    s["N_pl_Rd"] = renamed(EN1993_STEPS["N_pl_Rd"], {}, "EN 1993-1-1 6.2.4")
    s["M_y_Rd"] = Step("M_y_Rd_Nm", "W_y_m3 * fy_Pa / gamma_M0", _S)
    s["M_z_Rd"] = Step("M_z_Rd_Nm", "W_z_m3 * fy_Pa / gamma_M0", _S)
    s["u_6_2"] = Step("u_6_2", "N_Ed_N / N_pl_Rd_N + M_y_Ed_Nm / M_y_Rd_Nm + M_z_Ed_Nm / M_z_Rd_Nm", _S)
    s["n"] = Step("n", "N_Ed_N / N_pl_Rd_N", _S)
    s["a"] = Step("a", "min(a_web, 0.5)", _S)
    s["M_N_y_Rd"] = Step("M_N_y_Rd_Nm", "min(M_pl_y_Rd_Nm * (1 - n) / (1 - 0.5 * a), M_pl_y_Rd_Nm)", _S)
    s["n_below_a"] = Step("n_below_a", "n <= a", _S)
    s["M_N_z_Rd low"] = Step("M_N_z_Rd_Nm", "M_pl_z_Rd_Nm", _S)
    s["M_N_z_Rd"] = Step("M_N_z_Rd_Nm", "M_pl_z_Rd_Nm * (1 - ((n - a) / (1 - a))**2)", _S)
    s["u_6_31_y"] = Step("u_6_31_y", "M_y_Ed_Nm / M_N_y_Rd_Nm", _S)
    s["u_6_31_z"] = Step("u_6_31_z", "M_z_Ed_Nm / M_N_z_Rd_Nm", _S)
    s["beta_N"] = Step("beta_N", "max(5 * n, 1)", _S)
    s["u_6_41"] = Step("u_6_41", "(M_y_Ed_Nm / M_N_y_Rd_Nm)**2 + (M_z_Ed_Nm / M_N_z_Rd_Nm)**beta_N", _S)
    return s


STEPS: dict[str, Step] = _build_steps()
"""Every written-out formula of the EN 1993-1-1 checks with bending, by name."""
