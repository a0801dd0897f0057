import { describe, it, expect } from 'vitest';
import { parseQuantity, UnitError, toUnit } from '../src/physics/units.js';
import { M_SUN, PC } from '../src/physics/constants.js';

describe('parseQuantity', () => {
  it('reads the config forms of the design', () => {
    expect(parseQuantity('500 Msun', 'mass', 'Msun')).toBeCloseTo(500 * M_SUN.value, -25);
    expect(parseQuantity('1.2 pc', 'length', 'pc')).toBeCloseTo(1.2 * PC.value, -5);
    expect(parseQuantity('12 K', 'temperature', 'K')).toBe(12);
    expect(parseQuantity('1e4 cm^-3', 'numberDensity', 'cm^-3')).toBe(1e4);
    expect(parseQuantity('0.3 km/s', 'velocity', 'km/s')).toBeCloseTo(3e4, 8);
    expect(parseQuantity('10 uG', 'field', 'uG')).toBeCloseTo(1e-5, 15);
    expect(parseQuantity('3.82e-18 g cm^-3', 'massDensity', 'g cm^-3')).toBe(3.82e-18);
    expect(parseQuantity('3.82e-18 g/cm^3', 'massDensity', 'g cm^-3')).toBe(3.82e-18);
    expect(parseQuantity('7.2e-13 s^-1', 'rate', 's^-1')).toBe(7.2e-13);
    expect(parseQuantity('30 Msun/pc', 'lineMass', 'Msun/pc')).toBeCloseTo((30 * M_SUN.value) / PC.value, 0);
  });
  it('takes a bare number in the default unit', () => {
    expect(parseQuantity(2, 'length', 'pc')).toBeCloseTo(2 * PC.value, -5);
    expect(parseQuantity('2', 'length', 'pc')).toBeCloseTo(2 * PC.value, -5);
  });
  it('refuses an unknown unit with its name', () => {
    expect(() => parseQuantity('5 furlong', 'length', 'pc')).toThrow(/unknown unit "furlong"/);
  });
  it('refuses a unit of the wrong dimension, saying what was expected', () => {
    expect(() => parseQuantity('5 pc', 'mass', 'Msun')).toThrow(UnitError);
    expect(() => parseQuantity('5 pc', 'mass', 'Msun')).toThrow(/expected mass .* got "5 pc" which is length/);
  });
  it('refuses text that is not a number', () => {
    expect(() => parseQuantity('lots Msun', 'mass', 'Msun')).toThrow(/expected a number/);
  });
  it('toUnit converts back', () => {
    expect(toUnit(parseQuantity('1.2 pc', 'length', 'pc'), 'pc')).toBeCloseTo(1.2, 12);
  });
});
