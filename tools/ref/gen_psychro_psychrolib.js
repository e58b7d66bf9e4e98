#!/usr/bin/env node
// gen_psychro_psychrolib.js - reference psychrometric values from the npm
// package psychrolib (ASHRAE Handbook—Fundamentals 2017 ch. 1 formulas), for
// tests/unit/test_humid.c.
//
// Run from the repository root (psychrolib is installed in tests/node by
// scripts/deps.sh node):
//   node tools/ref/gen_psychro_psychrolib.js > tests/reference/psychro_ashrae_psychrolib.csv
//
// Output: '#' header lines naming the library, its version and this command,
// then CSV columns T_C (dry bulb, degC), P_Pa, RH (0..1), pws_Pa
// (GetSatVapPres), W (GetHumRatioFromRelHum, kg/kg), RH_from_W
// (GetRelHumFromHumRatio applied to that W), Tdew_C
// (GetTDewPointFromHumRatio, degC). Numbers are printed with 17 significant
// digits, so a re-run reproduces the file byte for byte.
//
// Grid: rows are kept only where psychrolib's results are not clamped by its
// lower humidity-ratio bound (MIN_HUM_RATIO = 1e-7 kg/kg; W >= 1e-6 kept) and
// where the vapour pressure stays below 90 % of the total pressure.
'use strict';
const path = require('path');
const lib = path.join(__dirname, '..', '..', 'tests', 'node', 'node_modules', 'psychrolib');
const psy = require(lib);
const version = require(path.join(lib, 'package.json')).version;
psy.SetUnitSystem(psy.SI);

const T_C = [-100, -80, -60, -40, -20, -10, -1, 1, 5, 10, 15, 20, 25, 30, 35, 40,
             45, 50, 60, 70, 80, 90, 100, 120, 150, 180, 200];
const P_PA = [101325, 89876.28518727123, 79495, 61640, 30000, 200000, 1000000, 2000000];
const RH = [0.05, 0.3, 0.6, 0.9, 1.0];

const f = (x) => {
  // JavaScript's shortest round-trip form, made 17-digit-stable like Python's repr
  return Number.isInteger(x) ? x.toFixed(1) : String(x);
};

console.log('# ASHRAE Handbook-Fundamentals 2017 ch. 1 psychrometrics as implemented by npm psychrolib ' +
            version + ' (SI units)');
console.log('# command: node tools/ref/gen_psychro_psychrolib.js > tests/reference/psychro_ashrae_psychrolib.csv');
console.log('T_C,P_Pa,RH,pws_Pa,W,RH_from_W,Tdew_C');
for (const P of P_PA) {
  for (const T of T_C) {
    const pws = psy.GetSatVapPres(T);
    for (const rh of RH) {
      if (rh * pws >= 0.9 * P) continue;
      const W = psy.GetHumRatioFromRelHum(T, rh, P);
      if (W < 1e-6) continue;
      const rhBack = psy.GetRelHumFromHumRatio(T, W, P);
      const tdew = psy.GetTDewPointFromHumRatio(T, W, P);
      console.log([T, P, rh, pws, W, rhBack, tdew].map(f).join(','));
    }
  }
}
