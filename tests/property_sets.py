"""Fixed saturated property sets for deterministic correlation tests.

Source: CHECK-VALUES.md section 0 of the project's reference notes, computed with
CoolProp 8.0.0 ``HEOS::<fluid>`` and rounded to 7 significant figures. Correlation
tests feed these numbers directly so that a CoolProp release cannot move them.
Molar mass M in kg/kmol (= g/mol).
"""

W1 = dict(  # water, 1 atm
    P=101325.0, T_sat=373.1243, rho_l=958.3675, rho_v=0.5976568, mu_l=2.81658e-4,
    mu_v=1.223126e-5, k_l=0.6772008, k_v=0.02456774, cp_l=4215.644, cp_v=2079.937,
    sigma=0.05892559, h_lv=2256472.0, P_crit=2.2064e7, M=18.01527, Pr_l=1.75335,
)
P3 = dict(  # n-pentane, 3 bar
    P=300000.0, T_sat=345.2551, rho_l=571.0001, rho_v=8.326302, mu_l=1.123765e-4,
    mu_v=7.551657e-6, k_l=0.09576977, k_v=0.01969659, cp_l=2559.265, cp_v=1977.471,
    sigma=0.01039343, h_lv=326017.5, P_crit=3367519.0, M=72.14878, Pr_l=3.003048,
)
R10 = dict(  # R134a, 10 degC
    P=414607.5, T_sat=283.15, rho_l=1260.958, rho_v=20.22577, mu_l=2.348677e-4,
    mu_v=1.109889e-5, k_l=0.08761913, k_v=0.01240259, cp_l=1370.372, cp_v=945.4621,
    sigma=0.01004135, h_lv=190740.9, P_crit=4059276.0, M=102.032, Pr_l=3.673354,
)

#: The base flow-boiling case of CHECK-VALUES.md section 0.
BASE = dict(G=500.0, x=0.1, D=0.020, q=50e3)

SETS = {"W1": W1, "P3": P3, "R10": R10}
