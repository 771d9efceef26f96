// Validation of the NAME of an exported controller: it becomes file names (NAME.h, NAME.c,
// NAME_check.c) and the prefix of every external identifier, so it must be a C identifier
// (C99 6.4.2.1) that is neither a keyword (C99 6.4.1) nor reserved for the implementation
// (C99 7.1.3: a leading underscore followed by an upper-case letter or a second underscore).

const KEYWORDS = new Set([
  'auto', 'break', 'case', 'char', 'const', 'continue', 'default', 'do', 'double', 'else', 'enum', 'extern',
  'float', 'for', 'goto', 'if', 'inline', 'int', 'long', 'register', 'restrict', 'return', 'short', 'signed',
  'sizeof', 'static', 'struct', 'switch', 'typedef', 'union', 'unsigned', 'void', 'volatile', 'while',
  '_Bool', '_Complex', '_Imaginary',
]);

/** Longest NAME accepted: keeps NAME_energy_gradient within 63 characters (C99 5.2.4.1 guarantees 31 for external names; current linkers take far more). */
export const MAX_NAME_LENGTH = 40;

/** Throws a RangeError naming `where` unless name is a usable C identifier prefix. */
export function checkCName(name: unknown, where = 'name'): string {
  if (typeof name !== 'string') throw new TypeError(`${where}: expected a C identifier, got ${typeof name}`);
  if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(name)) {
    throw new RangeError(`${where}: ${JSON.stringify(name)} is not a C identifier (a letter or _, then letters, digits or _)`);
  }
  if (name.length > MAX_NAME_LENGTH) throw new RangeError(`${where}: ${JSON.stringify(name)} is longer than ${MAX_NAME_LENGTH} characters`);
  if (KEYWORDS.has(name)) throw new RangeError(`${where}: ${JSON.stringify(name)} is a C keyword`);
  if (/^_[A-Z_]/.test(name)) throw new RangeError(`${where}: ${JSON.stringify(name)} is reserved for the C implementation (leading _ followed by a capital or _)`);
  return name;
}
