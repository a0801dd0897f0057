/** Isothermal sound speed. cgs throughout. */
import { K_B, M_H } from './constants.js';

/** Isothermal sound speed c_s = sqrt(k_B T / (mu m_H)), cm/s, for T in K and mu per free particle. */
export function soundSpeed(temperatureK: number, mu: number): number {
  return Math.sqrt((K_B.value * temperatureK) / (mu * M_H.value));
}

/** Temperature, K, that gives isothermal sound speed cs (cm/s) for mean molecular weight mu. */
export function temperatureForSoundSpeed(cs: number, mu: number): number {
  return (cs * cs * mu * M_H.value) / K_B.value;
}
