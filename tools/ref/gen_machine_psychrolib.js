#!/usr/bin/env node
// gen_machine_psychrolib.js - reference states of the machine's inlet air
// treatment (service/core/machine_inlet.c) from the npm package psychrolib
// (ASHRAE Handbook-Fundamentals 2017 ch. 1 formulas), for
// tests/unit/test_machine.c.
//
// Run from the repository root (psychrolib is installed in tests/node by
// scripts/deps.sh node):
//   node tools/ref/gen_machine_psychrolib.js evap > tests/reference/machine_evap_psychrolib.csv
//   node tools/ref/gen_machine_psychrolib.js chiller > tests/reference/machine_chiller_psychrolib.csv
//
// evap: an evaporative cooler of effectiveness eps on ambient air (T_C, P_Pa,
//   RH): W_in = GetHumRatioFromRelHum, Twb_C = GetTWetBulbFromHumRatio (a
//   bisection to psychrolib's tolerance, 0.001 degC in SI), Tout_C = T - eps
//   (T - Twb), W_out = GetHumRatioFromTWetBulb(Tout, Twb, P) (eqs. 33/35).
//   Rows only where the wet bulb is above 0 degC (the cooler runs).
// chiller: air cooled to a set point Tset_C: W_out = W_in above the dew point
//   (GetTDewPointFromHumRatio), else GetSatHumRatio(Tset, P); h_in, h_out =
//   GetMoistAirEnthalpy (eq. 30, J/kg dry air). Rows only where T > Tset.
// Numbers print in JavaScript's shortest round-trip form (integers with
// ".0"), so a re-run reproduces the file on the same machine.
'use strict';
const path = require('path');
const lib = path.join(__dirname, '..', '..', 'tests', 'node', 'node_modules', 'psychrolib');
const psy = require(lib);
const version = require(path.join(lib, 'package.json')).version;
psy.SetUnitSystem(psy.SI);

const f = (x) => (Number.isInteger(x) ? x.toFixed(1) : String(x));
const P_PA = [101325, 89876.28518727123, 79495];  // sea level, 1000 m, about 2000 m

function evap() {
  console.log('T_C,P_Pa,RH,W_in,eps,Twb_C,Tout_C,W_out');
  for (const P of P_PA)
    for (const T of [5, 15, 25, 35, 45])
      for (const rh of [0.1, 0.3, 0.6, 0.9]) {
        const W = psy.GetHumRatioFromRelHum(T, rh, P);
        const Twb = psy.GetTWetBulbFromHumRatio(T, W, P);
        if (!(Twb > 0)) continue;
        for (const eps of [0.7, 0.9, 1.0]) {
          const Tout = eps === 1.0 ? Twb : T - eps * (T - Twb);  // exact at saturation
          const Wout = psy.GetHumRatioFromTWetBulb(Tout, Twb, P);
          console.log([T, P, rh, W, eps, Twb, Tout, Wout].map(f).join(','));
        }
      }
}

function chiller() {
  console.log('T_C,P_Pa,RH,W_in,Tset_C,W_out,h_in,h_out');
  for (const P of P_PA)
    for (const T of [20, 30, 40, 50])
      for (const rh of [0.2, 0.5, 0.8])
        for (const Ts of [5, 10, 15]) {
          if (!(T > Ts)) continue;
          const W = psy.GetHumRatioFromRelHum(T, rh, P);
          const Tdew = psy.GetTDewPointFromHumRatio(T, W, P);
          const Wout = Ts >= Tdew ? W : psy.GetSatHumRatio(Ts, P);
          const hin = psy.GetMoistAirEnthalpy(T, W);
          const hout = psy.GetMoistAirEnthalpy(Ts, Wout);
          console.log([T, P, rh, W, Ts, Wout, hin, hout].map(f).join(','));
        }
}

const what = process.argv[2];
if (what !== 'evap' && what !== 'chiller') {
  console.error('usage: gen_machine_psychrolib.js evap|chiller');
  process.exit(2);
}
console.log('# ASHRAE Handbook-Fundamentals 2017 ch. 1 as implemented by npm psychrolib ' + version +
            ' (SI units): ' + (what === 'evap' ? 'evaporative cooler exit states' :
                               'chiller exit states and moist-air enthalpies'));
console.log('# command: node tools/ref/gen_machine_psychrolib.js ' + what +
            ' > tests/reference/machine_' + what + '_psychrolib.csv');
if (what === 'evap') evap(); else chiller();
