/** Loading and validating config files; every error names the key path, the value and what was expected. */
import { readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import path from 'node:path';
import { parse as parseYaml, YAMLParseError } from 'yaml';
import type { z } from 'zod';
import { configSchema, type Config } from './schema.js';
import { InputError } from '../input-error.js';

/** A loaded config with its source text, file name and sha256 of the text. */
export interface LoadedConfig {
  readonly config: Config;
  readonly text: string;
  readonly file: string;
  readonly name: string;
  readonly sha256: string;
}

function valueAt(obj: unknown, keyPath: readonly PropertyKey[]): unknown {
  let v: unknown = obj;
  for (const k of keyPath) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<PropertyKey, unknown>)[k];
  }
  return v;
}

/** One line describing a zod issue: "cloud.mass: expected ... (got ...)". */
export function describeIssue(issue: z.core.$ZodIssue, input: unknown): string {
  const where = issue.path.length ? issue.path.map(String).join('.') : '(top level)';
  if (issue.code === 'unrecognized_keys') {
    const keys = (issue as { keys: string[] }).keys;
    return `${where}: unknown key${keys.length > 1 ? 's' : ''} ${keys.map((k) => `"${k}"`).join(', ')}`;
  }
  const got = valueAt(input, issue.path);
  const gotText = got === undefined ? 'nothing' : JSON.stringify(got);
  const msg = issue.message.includes('got ') ? issue.message : `${issue.message} (got ${gotText})`;
  return `${where}: ${msg}`;
}

/** Validates a plain object as a config; throws InputError naming the first bad key. */
export function parseConfig(input: unknown, source = 'config'): Config {
  const r = configSchema.safeParse(input);
  if (!r.success) {
    const first = r.error.issues[0]!;
    throw new InputError(`${source}: ${describeIssue(first, input)}`);
  }
  return r.data;
}

/** Parses YAML text and validates it; throws InputError with the file name and key path. */
export function parseConfigText(text: string, file = 'config'): Config {
  let raw: unknown;
  try {
    raw = parseYaml(text);
  } catch (e) {
    const msg = e instanceof YAMLParseError ? e.message.split('\n')[0] : String(e);
    throw new InputError(`${file}: not valid YAML: ${msg}`);
  }
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) throw new InputError(`${file}: expected a YAML mapping with a "cloud" section`);
  return parseConfig(raw, file);
}

/** Reads, parses and validates a config file. */
export function loadConfig(file: string): LoadedConfig {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new InputError(`${file}: cannot read config (${code === 'ENOENT' ? 'no such file' : code ?? String(e)})`);
  }
  const config = parseConfigText(text, file);
  const name = config.name ?? path.basename(file).replace(/\.(ya?ml|json)$/i, '');
  return { config, text, file, name, sha256: createHash('sha256').update(text).digest('hex') };
}
