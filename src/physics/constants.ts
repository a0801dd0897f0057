/**
 * Physical and astronomical constants, cgs units, each a sourced record.
 *
 * Conventions: every value is in cgs (g, cm, s, K, erg, gauss). Derived constants are
 * computed from primary ones and cite both sources.
 */

/** A constant with its value (cgs), unit, relative standard uncertainty and source. */
export interface Constant {
  readonly name: string;
  readonly value: number;
  readonly unit: string;
  /** Relative standard uncertainty; 0 for exact or nominal values. */
  readonly uncertainty: number;
  readonly reference: string;
}

const CODATA = 'CODATA 2018 (Tiesinga et al. 2021, Rev. Mod. Phys. 93, 025010)';
const IAU = 'IAU 2015 Resolution B3 (nominal solar values) and IAU 2012 Resolution B2 (au)';

/** Newtonian constant of gravitation, cm^3 g^-1 s^-2. */
export const G: Constant = { name: 'Newtonian constant of gravitation', value: 6.6743e-8, unit: 'cm^3 g^-1 s^-2', uncertainty: 2.2e-5, reference: CODATA };
/** Boltzmann constant, erg K^-1 (exact in the 2019 SI). */
export const K_B: Constant = { name: 'Boltzmann constant', value: 1.380649e-16, unit: 'erg K^-1', uncertainty: 0, reference: CODATA };
/** Proton mass, g. */
export const M_P: Constant = { name: 'proton mass', value: 1.67262192369e-24, unit: 'g', uncertainty: 3.1e-10, reference: CODATA };
/** Atomic mass constant (unified atomic mass unit), g. */
export const M_U: Constant = { name: 'atomic mass constant', value: 1.6605390666e-24, unit: 'g', uncertainty: 3.0e-10, reference: CODATA };
/** Hydrogen mass used for m_H in mu m_H, g (about 1.00784 u, common practice). */
export const M_H: Constant = { name: 'hydrogen atom mass', value: 1.6735575e-24, unit: 'g', uncertainty: 0, reference: 'common practice (about 1.00784 u, the IUPAC lower bound for the atomic weight of hydrogen)' };
/** Nominal solar mass parameter GM_sun, cm^3 s^-2. */
export const GM_SUN: Constant = { name: 'nominal solar mass parameter', value: 1.3271244e26, unit: 'cm^3 s^-2', uncertainty: 0, reference: IAU };
/** Solar mass M_sun = GM_sun / G, g. */
export const M_SUN: Constant = { name: 'solar mass', value: GM_SUN.value / G.value, unit: 'g', uncertainty: G.uncertainty, reference: `${IAU} with G from ${CODATA}` };
/** Astronomical unit (exact), cm. */
export const AU: Constant = { name: 'astronomical unit', value: 1.495978707e13, unit: 'cm', uncertainty: 0, reference: IAU };
/** Parsec = 648000/pi au (exact by definition), cm. */
export const PC: Constant = { name: 'parsec', value: (648000 / Math.PI) * AU.value, unit: 'cm', uncertainty: 0, reference: 'IAU 2015 Resolution B2' };
/** Julian year = 365.25 d, s. */
export const YEAR: Constant = { name: 'Julian year', value: 365.25 * 86400, unit: 's', uncertainty: 0, reference: 'IAU (Julian year of 365.25 days of 86400 s)' };
/** Megayear (10^6 Julian years), s. */
export const MYR: Constant = { name: 'megayear', value: 1e6 * 365.25 * 86400, unit: 's', uncertainty: 0, reference: 'IAU (Julian year)' };
/** Kilometre per second, cm s^-1. */
export const KM_S = 1e5;
/** Mean molecular weight per H2 molecule, used to turn n(H2) into a mass density (common practice, e.g. Kauffmann et al. 2008). */
export const MU_H2 = 2.8;
/** Default mean molecular weight per free particle for molecular gas with helium (common practice). */
export const MU_DEFAULT = 2.33;

/** All constants by short name, for reports and tests. */
export const CONSTANTS = { G, K_B, M_P, M_U, M_H, GM_SUN, M_SUN, AU, PC, YEAR, MYR } as const;
