import { describe, expect, it } from 'vitest';
import { eosFromSettings, eosTemperature, eosTemperatureFloat32, type Eos } from '../src/physics/eos.js';

describe('eosTemperatureFloat32', () => {
  it('gives the Float32 of eosTemperature bit for bit (random densities over 1e-27..1e-9 g/cm^3, several gammas and base temperatures)', () => {
    let s = 2024;
    const rnd = (): number => { s = (Math.imul(s, 1103515245) + 12345) >>> 0; return s / 2 ** 32; };
    const eoses: Eos[] = [
      { kind: 'barotropic', criticalDensity: 1e-13, gamma: 7 / 5 },
      { kind: 'barotropic', criticalDensity: 1e-14, gamma: 5 / 3 },
      { kind: 'barotropic', criticalDensity: 3e-13, gamma: 1.1 },
      { kind: 'isothermal' },
    ];
    let differ = 0;
    for (let q = 0; q < 400_000; q++) {
      const eos = eoses[q & 3]!;
      const rho = Math.fround(10 ** (-27 + 18 * rnd()));
      const t0 = [15, 10.5, 1500, 7.3][(q >> 2) & 3]!;
      if (eosTemperatureFloat32(eos, t0, rho) !== Math.fround(eosTemperature(eos, t0, rho))) differ++;
    }
    expect(differ).toBe(0);
  });

  it('falls back to the exact power off the fast range (zero or extreme densities, zero base temperature)', () => {
    const eos: Eos = { kind: 'barotropic', criticalDensity: 1e-13, gamma: 7 / 5 };
    for (const [t0, rho] of [[15, 0], [15, 1e-200], [15, 1e200], [0, 1e-20], [15, Infinity]] as const) {
      expect(Object.is(eosTemperatureFloat32(eos, t0, rho), Math.fround(eosTemperature(eos, t0, rho)))).toBe(true);
    }
  });
});

describe('eosFromSettings', () => {
  it('gives the isothermal EOS, or the barotropic one with the stated critical density and gamma', () => {
    expect(eosFromSettings({ kind: 'isothermal', critical_density: 1e-13, gamma: 1.4 })).toEqual({ kind: 'isothermal' });
    const e = eosFromSettings({ kind: 'barotropic', critical_density: 2e-13, gamma: 5 / 3 });
    expect(e).toEqual({ kind: 'barotropic', criticalDensity: 2e-13, gamma: 5 / 3 });
    // at the critical density the temperature doubles (T = T0 [1 + (rho/rho_c)^(gamma-1)]; Masunaga & Inutsuka 2000 form)
    expect(eosTemperature(e, 10, 2e-13)).toBeCloseTo(20, 12);
  });
});
