import { describe, it, expect } from 'vitest';
import { parseConfig } from '../src/config/load.js';
import { cloudDimensions } from '../src/generate/dimensions.js';
import { InputError } from '../src/input-error.js';

const G = 6.6743e-8, KB = 1.380649e-16, MH = 1.6735575e-24; // CODATA 2018; m_H common practice
const MSUN = 1.3271244e26 / G; // IAU 2015
const PC = (648000 / Math.PI) * 1.495978707e13;

describe('cloudDimensions', () => {
  it('uniform sphere: mean = peak = edge density, box = padding x diameter, ambient at contrast and T x contrast', () => {
    const d = cloudDimensions(parseConfig({ cloud: { mass: '100 Msun', radius: '0.5 pc', temperature: 12, ambient: { contrast: 40 } }, grid: { padding: 1.5 } }));
    const rho = (100 * MSUN) / ((4 / 3) * Math.PI * (0.5 * PC) ** 3);
    expect(d.meanDensity / rho).toBeCloseTo(1, 12);
    expect(d.peakDensity / rho).toBeCloseTo(1, 12);
    expect(d.boxSize / (1.5 * PC)).toBeCloseTo(1, 12);
    expect(d.ambientDensity / (rho / 40)).toBeCloseTo(1, 12);
    expect(d.ambientTemperature).toBeCloseTo(480, 9);
    // W = -(3/5) G M^2 / R (common practice)
    expect(d.gravitationalEnergy / (-0.6 * G * (100 * MSUN) ** 2 / (0.5 * PC))).toBeCloseTo(1, 9);
  });
  it('without pressure balance the ambient keeps the cloud temperature; grid.box_size wins over padding', () => {
    const d = cloudDimensions(parseConfig({ cloud: { mass: '1 Msun', radius: '0.1 pc', ambient: { pressure_balance: false } }, grid: { box_size: '3 pc' } }));
    expect(d.ambientTemperature).toBe(10);
    expect(d.boxSize / (3 * PC)).toBeCloseTo(1, 12);
  });
  it('Bonnor–Ebert sphere given its mass: radius follows, R = xi_max c_s / sqrt(4 pi G rho_c) (Bonnor 1956)', () => {
    const d = cloudDimensions(parseConfig({ cloud: { mass: '2 Msun', temperature: 10, envelope: { model: 'bonnor-ebert' } } }));
    const cs = Math.sqrt((KB * 10) / (2.33 * MH));
    expect(d.radius / ((6.451 * cs) / Math.sqrt(4 * Math.PI * G * d.peakDensity))).toBeCloseTo(1, 3);
    expect(d.peakDensity / d.edgeDensity).toBeCloseTo(14.04, 1);
    expect(d.mass / (2 * MSUN)).toBeCloseTo(1, 12);
  });
  it('Bonnor–Ebert sphere refuses both mass and radius, and neither', () => {
    expect(() => cloudDimensions(parseConfig({ cloud: { mass: '2 Msun', radius: '0.1 pc', envelope: { model: 'bonnor-ebert' } } }))).toThrow(InputError);
    expect(() => cloudDimensions(parseConfig({ cloud: { envelope: { model: 'bonnor-ebert' } } }))).toThrow(InputError);
  });
  it('power law with a flat core: central density from the mass integral, W near -(3-p)/(5-2p) G M^2/R for a tiny core', () => {
    const M = 50 * MSUN, R = 0.4 * PC, p = 1.5, rc = 1e-4 * R;
    const d = cloudDimensions(parseConfig({ cloud: { mass: M / MSUN, radius: 0.4, envelope: { model: 'power-law', index: p, core_radius: rc / PC } } }));
    // numerical mass integral of the profile written here
    let m = 0;
    const steps = 200000;
    for (let s = 0; s < steps; s++) {
      const r = ((s + 0.5) / steps) * R;
      m += 4 * Math.PI * r * r * (r < rc ? 1 : (r / rc) ** -p) * (R / steps);
    }
    expect(d.peakDensity / (M / m)).toBeCloseTo(1, 3);
    // pure power law: W = -(3 - p)/(5 - 2p) G M^2 / R (common practice)
    expect(d.gravitationalEnergy / ((-(3 - p) / (5 - 2 * p)) * G * M * M / R)).toBeCloseTo(1, 3);
  });
  it('filament: mass = line mass x length; Plummer line mass pi rho_c r0^2 ln(1 + (R/r0)^2); extent max(L, 2R)', () => {
    const d = cloudDimensions(parseConfig({ cloud: { radius: '0.1 pc', envelope: { model: 'filament', line_mass: '20 Msun/pc', length: '2 pc', core_radius: '0.02 pc' } }, grid: { padding: 1.1 } }));
    expect(d.mass / (40 * MSUN)).toBeCloseTo(1, 12);
    const lambda = (20 * MSUN) / PC;
    expect(d.peakDensity / (lambda / (Math.PI * (0.02 * PC) ** 2 * Math.log(1 + 25)))).toBeCloseTo(1, 12);
    expect(d.boxSize / (2.2 * PC)).toBeCloseTo(1, 12);
    expect(d.shape).toBe('filament');
    expect(() => cloudDimensions(parseConfig({ cloud: { envelope: { model: 'filament', line_mass: 20, length: 2 } } }))).toThrow(/cloud.radius/);
  });
});
