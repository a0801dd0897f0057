/**
 * Outside check of the export unit systems. Sources: CODATA 2018 G = 6.67430e-8 cm^3 g^-1 s^-2;
 * IAU 2015 nominal GM_sun = 1.3271244e26 cm^3 s^-2; pc = 648000/pi au, au = 1.495978707e13 cm
 * (IAU 2012); SI Brochure 9th ed. (2019) for 1 cm = 1e-2 m, 1 g = 1e-3 kg, 1 erg = 1e-7 J;
 * 1 G = 1e-4 T (common practice); code time unit sqrt(L^3/(G M)) with G = 1 (common practice).
 */
import { describe, expect, it } from 'vitest';
import { gravitationalConstantIn, unitSystem, codeTimeUnit, QUANTITY_KINDS } from '../../src/export/unit-system.js';

const G_CODATA = 6.6743e-8; // CODATA 2018
const GM_SUN = 1.3271244e26; // IAU 2015 Resolution B3
const MSUN = GM_SUN / G_CODATA;
const AU = 1.495978707e13; // IAU 2012 Resolution B2
const PC = (648000 / Math.PI) * AU; // IAU 2015 Resolution B2

describe('code units with G = 1', () => {
  it.each([
    [PC, MSUN],
    [0.1 * PC, 1e3 * MSUN],
    [AU, MSUN],
    [1e17, 2e33],
  ])('G in code units equals 1 to 1e-12 for L = %s cm, M = %s g', (L, M) => {
    const u = unitSystem('code', { length: L, mass: M });
    expect(Math.abs(gravitationalConstantIn(u) - 1)).toBeLessThan(1e-12);
    // and independently: G * M * T^2 / L^3 = 1 with T from the unit table
    const T = u.toCgs.time;
    expect(Math.abs((G_CODATA * M * T * T) / L ** 3 - 1)).toBeLessThan(1e-12);
  });

  it('with 1 pc and 1 Msun the time unit is about 14.9 Myr and the velocity unit about 0.0656 km/s (from memory)', () => {
    const T = codeTimeUnit(PC, MSUN);
    expect(T / (1e6 * 365.25 * 86400)).toBeCloseTo(14.91, 2);
    const u = unitSystem('code', { length: PC, mass: MSUN });
    expect(u.toCgs.velocity / 1e5).toBeCloseTo(0.06558, 4);
    expect(u.toCgs.density).toBeCloseTo(MSUN / PC ** 3, 35);
  });

  it('rejects missing or non-positive code units', () => {
    expect(() => unitSystem('code')).toThrow(RangeError);
    expect(() => unitSystem('code', { length: 0, mass: 1 })).toThrow(RangeError);
  });
});

describe('SI and cgs', () => {
  it('SI factors follow the SI Brochure: 1 g/cm^3 = 1000 kg/m^3, 1 cm/s = 0.01 m/s, 1 erg/g = 1e-4 J/kg, 1 G = 1e-4 T', () => {
    const u = unitSystem('si');
    expect(u.fromCgs.density).toBe(1000);
    expect(u.fromCgs.velocity).toBe(0.01);
    expect(u.fromCgs.specific_energy).toBeCloseTo(1e-7 / 1e-3, 15);
    expect(u.fromCgs.magnetic_field).toBe(1e-4);
    expect(u.fromCgs.length).toBe(0.01);
    expect(u.fromCgs.mass).toBe(0.001);
    // G in SI is 6.67430e-11 m^3 kg^-1 s^-2 (CODATA 2018)
    expect(gravitationalConstantIn(u)).toBeCloseTo(6.6743e-11, 20);
  });

  it('cgs is the identity, and toCgs inverts fromCgs in every system', () => {
    const cgs = unitSystem('cgs');
    for (const k of QUANTITY_KINDS) expect(cgs.fromCgs[k]).toBe(1);
    expect(gravitationalConstantIn(cgs)).toBe(G_CODATA);
    for (const u of [unitSystem('si'), unitSystem('code', { length: PC, mass: MSUN })]) {
      for (const k of QUANTITY_KINDS) expect(Math.abs(u.fromCgs[k] * u.toCgs[k] - 1)).toBeLessThan(1e-15);
      expect(u.fromCgs.temperature).toBe(1);
    }
  });
});
