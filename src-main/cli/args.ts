// Command-line argument parsing for the ergostat verbs: positional arguments and --name value
// options, validated against a declared option table so typos are usage errors, not silence.

export class UsageError extends Error {
  override name = 'UsageError';
}

export interface OptionSpec {
  /** Takes a value (--out FILE) or is a flag (--angle). */
  kind: 'value' | 'flag';
  /** May be given several times (values are collected in order). */
  repeat?: boolean;
}

export interface ParsedArgs {
  positional: string[];
  values: Map<string, string[]>;
  flags: Set<string>;
}

export function parseArgs(argv: string[], spec: Record<string, OptionSpec>): ParsedArgs {
  const out: ParsedArgs = { positional: [], values: new Map(), flags: new Set() };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (!a.startsWith('--') || a === '--') {
      out.positional.push(a);
      continue;
    }
    let name = a.slice(2);
    let inline: string | undefined;
    const eq = name.indexOf('=');
    if (eq >= 0) {
      inline = name.slice(eq + 1);
      name = name.slice(0, eq);
    }
    const s = spec[name];
    if (!s) throw new UsageError(`unknown option --${name}`);
    if (s.kind === 'flag') {
      if (inline !== undefined) throw new UsageError(`option --${name} takes no value`);
      out.flags.add(name);
      continue;
    }
    const value = inline ?? argv[++i];
    if (value === undefined) throw new UsageError(`option --${name} needs a value`);
    const list = out.values.get(name) ?? [];
    if (list.length > 0 && !s.repeat) throw new UsageError(`option --${name} given more than once`);
    list.push(value);
    out.values.set(name, list);
  }
  return out;
}

export function optionalValue(args: ParsedArgs, name: string): string | undefined {
  return args.values.get(name)?.[0];
}

export function requiredValue(args: ParsedArgs, name: string): string {
  const v = optionalValue(args, name);
  if (v === undefined) throw new UsageError(`missing required option --${name}`);
  return v;
}

/** A finite number from an option, with the option named in the error. */
export function numberValue(args: ParsedArgs, name: string, fallback?: number): number | undefined {
  const raw = optionalValue(args, name);
  if (raw === undefined) return fallback;
  const x = Number(raw);
  if (raw.trim() === '' || !Number.isFinite(x)) throw new UsageError(`option --${name} expects a number, got "${raw}"`);
  return x;
}
