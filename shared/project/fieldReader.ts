import { ProjectFileError } from './projectFileError';

/**
 * Checks one JSON value of a project file and remembers its path, so every
 * complaint says which field of which file ("table.plots[3].rateKgHa"). The
 * checks return the value typed; a wrong value throws ProjectFileError.
 */
export class FieldReader {
  /**
   * @param where the file name as the user knows it
   * @param path JSON path of this value, "" for the top level
   * @param value the value itself
   */
  constructor(
    readonly where: string,
    readonly path: string,
    readonly value: unknown,
  ) {}

  /** The reader of a member of this object. */
  field(key: string): FieldReader {
    const obj = this.object();
    return new FieldReader(this.where, this.path ? `${this.path}.${key}` : key, obj[key]);
  }

  /** Readers of every element of this array. */
  items(): FieldReader[] {
    if (!Array.isArray(this.value)) this.fail(`should be a list, found ${describe(this.value)}`);
    return (this.value as unknown[]).map(
      (v, i) => new FieldReader(this.where, `${this.path}[${i}]`, v),
    );
  }

  /** This value as a plain object (not null, not a list). */
  object(): Record<string, unknown> {
    const v = this.value;
    if (typeof v !== 'object' || v === null || Array.isArray(v))
      this.fail(`should be an object, found ${describe(v)}`);
    return v as Record<string, unknown>;
  }

  /** Whether this object has the key at all (even with value null). */
  has(key: string): boolean {
    return Object.prototype.hasOwnProperty.call(this.object(), key);
  }

  string(): string {
    if (typeof this.value !== 'string') this.fail(`should be text, found ${describe(this.value)}`);
    return this.value as string;
  }

  /** A finite number (JSON has no NaN or Infinity, but a hand-edited file may hold a string). */
  number(): number {
    const v = this.value;
    if (typeof v !== 'number' || !Number.isFinite(v))
      this.fail(`should be a number, found ${describe(v)}`);
    return v as number;
  }

  boolean(): boolean {
    if (typeof this.value !== 'boolean')
      this.fail(`should be true or false, found ${describe(this.value)}`);
    return this.value as boolean;
  }

  nullableString(): string | null {
    return this.value === null ? null : this.string();
  }

  nullableNumber(): number | null {
    return this.value === null ? null : this.number();
  }

  /** One of the listed texts. */
  oneOf<T extends string>(allowed: readonly T[]): T {
    const s = this.string();
    if (!(allowed as readonly string[]).includes(s))
      this.fail(`should be one of ${allowed.map((a) => `"${a}"`).join(', ')}, found "${s}"`);
    return s as T;
  }

  /** An ISO 8601 date-time that Date can read. */
  isoTime(): string {
    const s = this.string();
    if (!/^\d{4}-\d\d-\d\dT/.test(s) || Number.isNaN(Date.parse(s)))
      this.fail(`should be a date and time like 2026-03-01T08:00:00.000Z, found "${s}"`);
    return s;
  }

  /** Any JSON value, checked to be free of undefined, functions and the like. */
  json(): unknown {
    checkJson(this.value, this);
    return this.value;
  }

  /** Throw the "invalid" error for this field. */
  fail(detail: string): never {
    throw new ProjectFileError('invalid', this.where, this.path, detail);
  }
}

/**
 * How deep a free-form part of a project (the view, the mapping) may nest. Plotrate writes a few
 * levels; a file nested far deeper is damaged or hostile, and checking it would exhaust the stack.
 */
export const MAX_JSON_DEPTH = 32;

/**
 * Whether parsed JSON nests deeper than a limit, found without recursion (a hostile record may
 * nest thousands of levels) and without walking further than the limit.
 * @example nestedDeeperThan({ a: [1] }, 1) // true
 */
export function nestedDeeperThan(value: unknown, limit: number): boolean {
  let level: unknown[] = [value];
  for (let depth = 0; level.length > 0; depth++) {
    const next: unknown[] = [];
    for (const v of level) {
      if (typeof v !== 'object' || v === null) continue;
      if (depth >= limit) return true;
      next.push(...(Array.isArray(v) ? v : Object.values(v)));
    }
    level = next;
  }
  return false;
}

function checkJson(v: unknown, at: FieldReader, depth = 0): void {
  if (v === null || typeof v === 'string' || typeof v === 'boolean') return;
  if (depth >= MAX_JSON_DEPTH && typeof v === 'object')
    at.fail(
      `is nested more than ${MAX_JSON_DEPTH} levels deep, which no Plotrate project is; the file is damaged or was not written by Plotrate`,
    );
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) at.fail('holds a number that is not finite');
    return;
  }
  if (Array.isArray(v)) {
    at.items().forEach((item) => checkJson(item.value, item, depth + 1));
    return;
  }
  if (typeof v === 'object') {
    for (const key of Object.keys(v)) checkJson(at.field(key).value, at.field(key), depth + 1);
    return;
  }
  at.fail(`holds ${describe(v)}, which JSON cannot store`);
}

/** A short description of a value for messages: "text \"12 kg\"", "nothing", "a list". */
export function describe(v: unknown): string {
  if (v === undefined) return 'nothing (the field is missing)';
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'string') return `text "${v.length > 40 ? `${v.slice(0, 40)}…` : v}"`;
  if (typeof v === 'object') return 'an object';
  return `${typeof v} ${String(v)}`;
}
