import { describe, it, expect } from 'vitest';
import { parseConfigText } from '../src/config/load.js';
import { InputError } from '../src/input-error.js';
import { M_SUN, PC } from '../src/physics/constants.js';

const ok = 'cloud:\n  mass: "500 Msun"\n  radius: "1.2 pc"\n';

function errorOf(text: string): string {
  try {
    parseConfigText(text, 'c.yaml');
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return (e as Error).message;
  }
  throw new Error('expected an error');
}

describe('config validation', () => {
  it('fills documented defaults and converts quantities to cgs', () => {
    const c = parseConfigText(ok);
    expect(c.cloud.mass! / M_SUN.value).toBeCloseTo(500, 10);
    expect(c.cloud.radius! / PC.value).toBeCloseTo(1.2, 10);
    expect(c.cloud.temperature).toBe(10);
    expect(c.cloud.mu).toBe(2.33);
    expect(c.grid.cells).toBe(128);
    expect(c.survey.jeans_mass).toBe('sphere');
    expect(c.budget.grid.cells_per_jeans_length).toBe(4);
    expect(c.export.formats).toEqual(['npy']);
    // quantity defaults are parsed in their default unit, like written values
    expect(c.export.code_units.length / PC.value).toBeCloseTo(1, 12);
    expect(c.export.code_units.mass / M_SUN.value).toBeCloseTo(1, 12);
    expect(c.cloud.eos.critical_density).toBe(1e-13);
  });
  it('names an unknown key', () => {
    expect(errorOf(`${ok}  colour: blue\n`)).toMatch(/^c\.yaml: cloud: unknown key "colour"/);
  });
  it('names a negative mass', () => {
    expect(errorOf('cloud:\n  mass: "-5 Msun"\n  radius: 1\n')).toMatch(/cloud\.mass: expected a positive value/);
  });
  it('names a unit of the wrong dimension', () => {
    expect(errorOf('cloud:\n  mass: "5 pc"\n  radius: 1\n')).toMatch(/cloud\.mass: expected mass/);
  });
  it('names cells that are not a power of two', () => {
    expect(errorOf(`${ok}grid:\n  cells: 100\n`)).toMatch(/grid\.cells: expected a power of two .*100/);
  });
  it('refuses both mach and virial_parameter', () => {
    expect(errorOf(`${ok}  turbulence: {mach: 3, virial_parameter: 1}\n`)).toMatch(/cloud\.turbulence: give mach or virial_parameter/);
  });
  it('reports broken YAML with the file name', () => {
    expect(errorOf('cloud: [unclosed')).toMatch(/^c\.yaml: not valid YAML/);
  });
  it('refuses a file without a cloud section', () => {
    expect(errorOf('seed: 3\n')).toMatch(/cloud: /);
  });
});
