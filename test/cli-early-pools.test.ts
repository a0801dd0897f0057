import { describe, expect, it } from 'vitest';
import { earlyWorkerCount } from '../src/cli/early-pools.js';
import { defaultWorkerCount } from '../src/grid/pool.js';

describe('earlyWorkerCount (threads started before the command line loads)', () => {
  it('reads the count plan will use: the --workers value, else the default', () => {
    expect(earlyWorkerCount(['plan', 'a.yaml'])).toBe(defaultWorkerCount());
    expect(earlyWorkerCount(['plan', 'a.yaml', '--workers', '3'])).toBe(3);
    expect(earlyWorkerCount(['plan', '--workers=1', 'a.yaml'])).toBe(1);
    expect(earlyWorkerCount(['plan', 'a.yaml', '--workers', '2', '--workers', '4'])).toBe(4); // the last one wins, as in the parser
  });
  it('starts nothing for other commands or a value the parser will refuse', () => {
    expect(earlyWorkerCount(['budget', 'a.yaml'])).toBeNull();
    expect(earlyWorkerCount([])).toBeNull();
    expect(earlyWorkerCount(['plan', 'a.yaml', '--workers', 'x'])).toBeNull();
    expect(earlyWorkerCount(['plan', 'a.yaml', '--workers', '0'])).toBeNull();
    expect(earlyWorkerCount(['plan', 'a.yaml', '--workers'])).toBe(defaultWorkerCount());
  });
});
