/** The shipped scenario configs in presets/: listing and copying one as a starting config. */
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';
import { InputError } from '../input-error.js';
import { writeFileAtomic } from '../export/atomic-file.js';

/** A preset: its name (file name without .yaml), one-line description and path. */
export interface Preset {
  name: string;
  description: string;
  file: string;
}

/** Folder holding the presets (works from src/ under tests and from dist/ when installed). */
export function presetsDir(): string {
  return fileURLToPath(new URL(import.meta.url.endsWith('.ts') ? '../../presets/' : '../presets/', import.meta.url));
}

/** Lists the presets; the description is the first comment line of each file. */
export function listPresets(dir = presetsDir()): Preset[] {
  return readdirSync(dir)
    .filter((f) => f.endsWith('.yaml'))
    .sort()
    .map((f) => {
      const text = readFileSync(path.join(dir, f), 'utf8');
      const first = text.split('\n').find((l) => l.startsWith('#')) ?? '# ';
      return { name: f.replace(/\.yaml$/, ''), description: first.replace(/^#\s*/, ''), file: path.join(dir, f) };
    });
}

/** Writes preset `name` to `dest` (refuses to replace an existing file without force). */
export function writePreset(name: string, dest: string, force: boolean, dir = presetsDir()): string {
  const p = listPresets(dir).find((x) => x.name === name);
  if (!p) throw new InputError(`preset "${name}" not found (available: ${listPresets(dir).map((x) => x.name).join(', ')})`);
  writeFileAtomic(dest, readFileSync(p.file), force);
  return dest;
}
