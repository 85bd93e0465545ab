import type * as z from 'zod';
import type { FieldError } from './problem';

/**
 * Writes a path the way people read it and the engine reports it: `runs[1].readings[0].amplitude`.
 * An empty path names the whole body.
 */
export function formatPath(path: readonly PropertyKey[]): string {
  let text = '';
  for (const segment of path) {
    if (typeof segment === 'number') text += `[${segment}]`;
    else text += text === '' ? String(segment) : `.${String(segment)}`;
  }
  return text;
}

/**
 * The issues of a failed zod parse as field errors, one per field at fault. An unknown field is named
 * itself (most often a typo such as `phase` for `phaseDeg`), so that the caller sees what to rename.
 */
export function fieldErrorsOf(error: z.core.$ZodError): FieldError[] {
  const errors: FieldError[] = [];
  for (const issue of error.issues) {
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) {
        errors.push({
          path: formatPath([...issue.path, key]),
          message: `"${key}" is not a field here; check its spelling against the API reference.`,
        });
      }
      continue;
    }
    errors.push({ path: formatPath(issue.path), message: issue.message });
  }
  return errors;
}
