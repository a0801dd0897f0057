/**
 * The density profile a collapsing isothermal core develops, cgs.
 *
 * Singular isothermal sphere rho(r) = c_s^2 / (2 pi G r^2) (Shu 1977), the r^-2 envelope that
 * Larson-Penston-like collapse approaches. Its Jeans length at radius r is pi sqrt(2) r.
 */
import { G } from './constants.js';

/** Radius, cm, at which a singular isothermal sphere of sound speed cs (cm/s) has density rho (g/cm^3) (Shu 1977). */
export function singularIsothermalSphereRadius(cs: number, rho: number): number {
  return cs / Math.sqrt(2 * Math.PI * G.value * rho);
}

/** Density, g/cm^3, of a singular isothermal sphere of sound speed cs (cm/s) at radius r (cm) (Shu 1977). */
export function singularIsothermalSphereDensity(cs: number, r: number): number {
  return (cs * cs) / (2 * Math.PI * G.value * r * r);
}
