// Constants against their published values: CODATA 2018 (Tiesinga et al. 2021) and IAU 2015 Resolution B3.
import { describe, it, expect } from 'vitest';
import { G, K_B, M_P, M_U, M_H, M_SUN, AU, PC, YEAR, GM_SUN, CONSTANTS } from '../../src/physics/constants.js';

describe('constants', () => {
  it('G, k_B, m_p and m_u equal CODATA 2018 (cgs)', () => {
    expect(G.value).toBe(6.6743e-8); // CODATA 2018: 6.67430(15)e-11 m^3 kg^-1 s^-2
    expect(K_B.value).toBe(1.380649e-16); // CODATA 2018 (exact): 1.380649e-23 J/K
    expect(M_P.value).toBe(1.67262192369e-24); // CODATA 2018: 1.67262192369(51)e-27 kg
    expect(M_U.value).toBe(1.6605390666e-24); // CODATA 2018: 1.66053906660(50)e-27 kg
  });

  it('the hydrogen mass is 1.6735575e-24 g', () => {
    expect(M_H.value).toBe(1.6735575e-24); // common practice (the value the design names)
    expect(M_H.value / M_U.value).toBeCloseTo(1.00784, 5); // IUPAC atomic-weight interval lower bound for H
  });

  it('the solar mass is GM_sun/G with the IAU 2015 nominal GM_sun', () => {
    expect(GM_SUN.value).toBe(1.3271244e26); // IAU 2015 Resolution B3: 1.3271244e20 m^3 s^-2
    expect(M_SUN.value).toBeCloseTo(1.98841e33, -29); // IAU 2015 B3 note: M_sun = 1.98841e30 kg with CODATA 2018 G
  });

  it('au, parsec and Julian year follow their definitions', () => {
    expect(AU.value).toBe(1.495978707e13); // IAU 2012 Resolution B2 (exact)
    expect(PC.value / AU.value).toBeCloseTo(648000 / Math.PI, 6); // IAU 2015 Resolution B2
    expect(PC.value).toBeCloseTo(3.0856775814913673e18, 2); // IAU 2015 Resolution B2: 3.0857e16 m
    expect(YEAR.value).toBe(31557600); // IAU Julian year, 365.25 d
  });

  it('every constant names a reference', () => {
    for (const c of Object.values(CONSTANTS)) expect(c.reference.length).toBeGreaterThan(5);
  });
});
