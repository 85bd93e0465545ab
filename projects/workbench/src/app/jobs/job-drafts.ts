import { DestroyRef, inject, Injectable } from '@angular/core';
import type { AbstractControl } from '@angular/forms';

/** The part of the browser's storage a draft needs (the tests give a map in its place). */
export type DraftStorage = Pick<Storage, 'getItem' | 'setItem' | 'removeItem'>;

const PREFIX = 'counterpoise.job-draft';

/**
 * What a step has typed but not yet stored on the server, kept on the device so that a reload, a closed lid
 * or a dropped connection loses nothing: each form writes its value as it changes, reads it back when the step
 * opens again, and clears it once the server has stored it. Keyed by job and by what the form is for ("setup",
 * "run-3"), so that two jobs or two runs never mix.
 */
@Injectable({ providedIn: 'root' })
export class JobDrafts {
  private readonly storage: DraftStorage | null = browserStorage();

  /** The draft kept for this job and form, or null. */
  read<T>(jobId: number, key: string): T | null {
    const text = this.storage?.getItem(draftKey(jobId, key));
    if (!text) return null;
    try {
      return JSON.parse(text) as T;
    } catch {
      return null;
    }
  }

  /** Keeps the form's value for this job. */
  write(jobId: number, key: string, value: unknown): void {
    try {
      this.storage?.setItem(draftKey(jobId, key), JSON.stringify(value));
    } catch {
      // Storage full or refused (a private window): the form still holds the value until the page closes.
    }
  }

  /** Forgets the draft once the server holds it. */
  clear(jobId: number, key: string): void {
    this.storage?.removeItem(draftKey(jobId, key));
  }

  /**
   * Fills the form from its draft, if there is one, and keeps its value as a draft from then on, until the
   * component that calls this (in an injection context) is destroyed. Returns true when a draft was restored.
   * A form with arrays (repeats of a reading) sizes them from `read` first: `patchValue` fills only the
   * controls that exist.
   */
  keep(form: AbstractControl, jobId: number, key: string, destroyRef = inject(DestroyRef)): boolean {
    const draft = this.read<unknown>(jobId, key);
    let restored = false;
    if (draft !== null) {
      try {
        form.patchValue(draft);
        form.markAsDirty();
        restored = true;
      } catch {
        this.clear(jobId, key);
      }
    }
    // Written on every change (a few hundred bytes), so that a reload right after a keystroke keeps it.
    const subscription = form.valueChanges.subscribe(() => this.write(jobId, key, form.getRawValue()));
    destroyRef.onDestroy(() => subscription.unsubscribe());
    return restored;
  }
}

function draftKey(jobId: number, key: string): string {
  return `${PREFIX}.${jobId}.${key}`;
}

function browserStorage(): DraftStorage | null {
  try {
    return typeof localStorage === 'undefined' ? null : localStorage;
  } catch {
    return null;
  }
}
