/**
 * Mass density and the number density of H2 molecules, cgs:
 * rho = mu_H2 m_H n(H2) with mu_H2 = 2.8 per H2 molecule (helium included; common practice,
 * e.g. Kauffmann et al. 2008). Distinct from mu = 2.33 per free particle used for the sound speed.
 */
import { M_H, MU_H2 } from './constants.js';

/** Mass density, g/cm^3, of gas with n(H2) molecules per cm^3. */
export function massDensityFromH2(nH2: number): number {
  return nH2 * MU_H2 * M_H.value;
}

/** Number density of H2 molecules, cm^-3, for mass density rho (g/cm^3). */
export function h2NumberDensity(rho: number): number {
  return rho / (MU_H2 * M_H.value);
}
