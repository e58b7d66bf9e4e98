#!/usr/bin/python3
"""gen_steam_iapws.py - Rankine cycles and a single-pressure heat-recovery
steam generator computed independently of the C core, with Debian's
python3-iapws (IAPWS-IF97, iapws.IAPWS97) for water and steam and a gas of
constant cp, for tests/unit/test_steam.c.

Run from the repository root with Debian's interpreter:
  /usr/bin/python3 tools/ref/gen_steam_iapws.py > tests/reference/steam_cycles_iapws97.csv

Models (the textbook relations, written out here from the definitions):
  pump      h2 = h1 + (h(P2, s1) - h1) / eta_p
  turbine   h2 = h1 - eta_t (h1 - h(P2, s1))
  condenser saturated liquid leaves at the condenser pressure
  kind 1  simple Rankine: condensate -> feed pump -> boiler to (P1, T1) ->
          turbine -> condenser. Per kg of steam.
  kind 2  reheat and deaerator: condensate -> condensate pump to P_da ->
          deaerator (saturated liquid at P_da, heated by a bleed) -> feed
          pump -> (P1, T1) -> HP turbine to P_rh -> reheat to T_rh -> LP
          turbine to P_da (bleed beta = (h'(P_da) - h_cp) / (h_bleed - h_cp)
          per kg of feedwater) -> on to the condenser. Per kg of steam.
  kind 3  single-pressure HRSG, gas of constant cp (h = cp T): economiser
          water leaves at Tsat - approach, the gas leaves the evaporator at
          Tsat + pinch; m_steam = m_gas cp (T_gas - Tsat - pinch) /
          (h_steam - h_eco); stack T = Tsat + pinch - m_steam (h_eco - h_fw) /
          (m_gas cp); the steam cycle of kind 1 behind it. Absolute figures.
Output: '#' header lines (library, version, command), then CSV columns
  kind, P1_Pa, T1_K, Pc_Pa, eta_t, eta_p, P_rh_Pa, T_rh_K, P_da_Pa, cp_gas,
  T_gas_K, m_gas_kg_s, pinch_K, approach_K,
  efficiency, w_net_J_kg (per kg of steam), x_exit (-1 superheated),
  q_cond_J_kg (per kg of steam), beta (bleed per kg of steam),
  m_steam_kg_s, T_stack_K, Q_gas_W, net_power_W, T_gas_sh_K (gas after the
  superheater)
(0 where a column does not apply). Numbers with 17 significant digits.
"""
import subprocess

import iapws
from iapws import IAPWS97

MPA = 1e6

# kind 1: (P1 MPa, T1 K, Pc MPa, eta_t, eta_p)
SIMPLE = [(8.0, 773.15, 0.005, 1.0, 1.0), (8.0, 773.15, 0.005, 0.87, 0.8),
          (4.0, 673.15, 0.01, 0.85, 0.75), (12.0, 838.15, 0.004, 0.9, 0.85),
          (2.0, 0.0, 0.008, 0.8, 0.7)]
# kind 2: (P1, T1, Pc, eta_t, eta_p, P_rh, T_rh, P_da) MPa and K
REHEAT = [(10.0, 813.15, 0.005, 0.88, 0.8, 2.0, 813.15, 0.2),
          (16.0, 838.15, 0.006, 0.9, 0.85, 3.5, 838.15, 0.5)]
# kind 3: (P1, T1, Pc, eta_t, eta_p, cp_gas J/(kg K), T_gas K, m_gas kg/s, pinch, approach)
HRSG = [(6.0, 753.15, 0.006, 0.86, 0.8, 1100.0, 853.15, 100.0, 10.0, 5.0),
        (4.0, 693.15, 0.008, 1.0, 1.0, 1150.0, 823.15, 50.0, 8.0, 3.0),
        (9.0, 793.15, 0.005, 0.88, 0.82, 1120.0, 893.15, 250.0, 12.0, 8.0)]


def deb_version(pkg):
    try:
        return subprocess.run(["dpkg-query", "-W", "-f=${Version}", pkg],
                              capture_output=True, text=True, check=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError):
        return "unknown"


def h_ps(p, s):
    """kJ/kg at p MPa, s kJ/(kg K)."""
    return IAPWS97(P=p, s=s).h


def pump(p1, h1, s1, p2, eta):
    return h1 + (h_ps(p2, s1) - h1) / eta


def expand(p1, h1, s1, p2, eta):
    """End enthalpy and state of an expansion."""
    h2 = h1 - eta * (h1 - h_ps(p2, s1))
    return h2, IAPWS97(P=p2, h=h2)


def steam_state(p, t):
    return IAPWS97(P=p, x=1.0) if t == 0.0 else IAPWS97(T=t, P=p)


def quality(st):
    return float(st.x) if 0.0 <= st.x < 1.0 and st.region == 4 else -1.0


def simple(p1, t1, pc, eta_t, eta_p):
    c = IAPWS97(P=pc, x=0.0)
    h_fw = pump(pc, c.h, c.s, p1, eta_p)
    s = steam_state(p1, t1)
    h_ex, ex = expand(p1, s.h, s.s, pc, eta_t)
    w_net = (s.h - h_ex) - (h_fw - c.h)
    return c, h_fw, s, h_ex, ex, w_net


def row(vals):
    print(",".join(repr(float(v)) for v in vals))


def kind1():
    for p1, t1, pc, eta_t, eta_p in SIMPLE:
        c, h_fw, s, h_ex, ex, w_net = simple(p1, t1, pc, eta_t, eta_p)
        eff = w_net / (s.h - h_fw)
        row([1, p1 * MPA, t1, pc * MPA, eta_t, eta_p, 0, 0, 0, 0, 0, 0, 0, 0,
             eff, w_net * 1e3, quality(ex), (h_ex - c.h) * 1e3, 0, 0, 0, 0, 0, 0])


def kind2():
    for p1, t1, pc, eta_t, eta_p, prh, trh, pda in REHEAT:
        c = IAPWS97(P=pc, x=0.0)
        h_cp = pump(pc, c.h, c.s, pda, eta_p)
        d = IAPWS97(P=pda, x=0.0)
        h_fw = pump(pda, d.h, d.s, p1, eta_p)
        s = IAPWS97(T=t1, P=p1)
        h_crh, _ = expand(p1, s.h, s.s, prh, eta_t)
        r = IAPWS97(T=trh, P=prh)
        h_b, b = expand(prh, r.h, r.s, pda, eta_t)
        h_ex, ex = expand(pda, h_b, b.s, pc, eta_t)
        beta = (d.h - h_cp) / (h_b - h_cp)
        w_t = (s.h - h_crh) + (r.h - h_b) + (1.0 - beta) * (h_b - h_ex)
        w_p = (1.0 - beta) * (h_cp - c.h) + (h_fw - d.h)
        q_in = (s.h - h_fw) + (r.h - h_crh)
        w_net = w_t - w_p
        row([2, p1 * MPA, t1, pc * MPA, eta_t, eta_p, prh * MPA, trh, pda * MPA, 0, 0, 0, 0, 0,
             w_net / q_in, w_net * 1e3, quality(ex), (1.0 - beta) * (h_ex - c.h) * 1e3, beta,
             0, 0, 0, 0, 0])


def kind3():
    for p1, t1, pc, eta_t, eta_p, cp, tg, mg, pinch, approach in HRSG:
        c, h_fw, s, h_ex, ex, w_net = simple(p1, t1, pc, eta_t, eta_p)
        sat_v = IAPWS97(P=p1, x=1.0)
        ts = sat_v.T
        h_eco = IAPWS97(T=ts - approach, P=p1).h
        cpk = cp / 1e3                      # kJ/(kg K)
        m_s = mg * cpk * (tg - ts - pinch) / (s.h - h_eco)
        t_sh = tg - m_s * (s.h - sat_v.h) / (mg * cpk)
        t_stack = ts + pinch - m_s * (h_eco - h_fw) / (mg * cpk)
        q_gas = mg * cp * (tg - t_stack)
        row([3, p1 * MPA, t1, pc * MPA, eta_t, eta_p, 0, 0, 0, cp, tg, mg, pinch, approach,
             w_net / (s.h - h_fw), w_net * 1e3, quality(ex), (h_ex - c.h) * 1e3, 0,
             m_s, t_stack, q_gas, m_s * w_net * 1e3, t_sh])


def main():
    print("# Rankine cycles and a single-pressure HRSG by IAPWS-IF97 as implemented by "
          "python3-iapws %s (Debian package %s), iapws.IAPWS97; gas of constant cp"
          % (iapws.__version__, deb_version("python3-iapws")))
    print("# command: /usr/bin/python3 tools/ref/gen_steam_iapws.py "
          "> tests/reference/steam_cycles_iapws97.csv")
    print("kind,P1_Pa,T1_K,Pc_Pa,eta_t,eta_p,P_rh_Pa,T_rh_K,P_da_Pa,cp_gas_J_kgK,T_gas_K,"
          "m_gas_kg_s,pinch_K,approach_K,efficiency,w_net_J_kg,x_exit,q_cond_J_kg,beta,"
          "m_steam_kg_s,T_stack_K,Q_gas_W,net_power_W,T_gas_sh_K")
    kind1()
    kind2()
    kind3()


if __name__ == "__main__":
    main()
