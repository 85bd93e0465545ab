/*
 * How a record's fields read in sentences (the change history, the "changed meanwhile" dialog), and which
 * fields a form changed. Framework-free, so that the wording is tested without a page.
 */

/** How one field of a record reads in a sentence. */
export interface FieldDescription {
  /** Its name in a sentence, lower case: "phone", "site address". */
  readonly label: string;
  /** Its value in words; without it, text is quoted and numbers, lists and yes/no read plainly. */
  readonly format?: (value: unknown) => string;
}

/** The descriptions of a kind of record's fields, by the API's field name. */
export type FieldDescriptions = Readonly<Record<string, FieldDescription>>;

/** Whether a value counts as nothing: null, undefined, an empty or blank text, an empty list. */
export function isEmptyValue(value: unknown): boolean {
  return (
    value === null ||
    value === undefined ||
    (typeof value === 'string' && value.trim() === '') ||
    (Array.isArray(value) && value.length === 0)
  );
}

/** A value in words, without a field's own format: “text” in quotes, numbers and lists plainly. */
export function plainValue(value: unknown): string {
  if (isEmptyValue(value)) return 'nothing';
  if (typeof value === 'string') return `“${value}”`;
  if (typeof value === 'number') return value.toLocaleString('en-GB', { maximumFractionDigits: 3 });
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (Array.isArray(value)) return value.map(plainValue).join(', ');
  return JSON.stringify(value);
}

/** A field's value in words, its own format first. */
export function fieldValue(field: string, value: unknown, fields: FieldDescriptions): string {
  if (isEmptyValue(value)) return 'nothing';
  const format = fields[field]?.format;
  return format ? format(value) : plainValue(value);
}

/** A field's name in a sentence: its label, or the API's name split into words. */
export function fieldLabel(field: string, fields: FieldDescriptions): string {
  return fields[field]?.label ?? field.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
}

/** A value as JSON with each object's keys in order, so that the order they came in does not matter. */
function canonical(value: unknown): string {
  return JSON.stringify(value ?? null, (_key, inner: unknown) =>
    typeof inner === 'object' && inner !== null && !Array.isArray(inner)
      ? Object.fromEntries(Object.entries(inner).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
      : inner,
  );
}

/** Whether two values are the same as the API would store them (objects compared by content). */
export function sameValue(a: unknown, b: unknown): boolean {
  return canonical(a) === canonical(b);
}

/**
 * The fields of `after` whose value differs from `before`'s, for a PATCH that sends only what the person
 * changed (so that a colleague's change to another field is never written over).
 */
export function changedFields<T extends object>(before: T, after: T): Partial<T> {
  const change: Partial<T> = {};
  for (const key of Object.keys(after) as (keyof T)[]) {
    if (!sameValue(before[key], after[key])) change[key] = after[key];
  }
  return change;
}

/** One field of a record that two people changed at once, or that one of them did. */
export interface EditComparison {
  readonly field: string;
  readonly label: string;
  /** Their value, as stored now, in words. */
  readonly theirs: string;
  /** Your value in words; null when you left the field as it was. */
  readonly mine: string | null;
  /** Who changed it since the version you started from: you, they, or both to different values. */
  readonly changedBy: 'you' | 'them' | 'both';
}

/**
 * What two edits of one record did, field by field: `base` is the version you started from, `theirs` the
 * one stored now, `mine` the fields you changed. Fields that ended the same either way are left out.
 */
export function compareEdits(
  base: object,
  theirs: object,
  mine: object,
  fields: FieldDescriptions,
): EditComparison[] {
  const baseValues = base as Record<string, unknown>;
  const theirValues = theirs as Record<string, unknown>;
  const myValues = mine as Record<string, unknown>;
  const names = new Set([
    ...Object.keys(myValues),
    ...Object.keys(fields).filter((field) => !sameValue(baseValues[field], theirValues[field])),
  ]);
  const rows: EditComparison[] = [];
  for (const field of names) {
    const iChanged = field in myValues;
    const theyChanged = !sameValue(baseValues[field], theirValues[field]);
    if (iChanged && sameValue(myValues[field], theirValues[field])) continue;
    rows.push({
      field,
      label: fieldLabel(field, fields),
      theirs: fieldValue(field, theirValues[field], fields),
      mine: iChanged ? fieldValue(field, myValues[field], fields) : null,
      changedBy: iChanged && theyChanged ? 'both' : iChanged ? 'you' : 'them',
    });
  }
  return rows;
}
