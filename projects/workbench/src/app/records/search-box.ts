import { DestroyRef, effect, inject, type Signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl } from '@angular/forms';
import { debounceTime, map } from 'rxjs';
import { SEARCH_DEBOUNCE_MS } from './list-query';

/**
 * A list's search field: what is typed goes to `search` once typing pauses, and a search that comes from
 * the address instead (the back button, a link) is shown in the field. Typing is never overwritten by the
 * answer to its own earlier keystrokes. Call it in an injection context.
 */
export function searchBox(current: Signal<string>, search: (q: string) => void): FormControl<string> {
  const control = new FormControl(current(), { nonNullable: true });
  let sent = current();
  effect(() => {
    const q = current();
    if (q === sent) return;
    sent = q;
    control.setValue(q, { emitEvent: false });
  });
  control.valueChanges
    .pipe(
      map((text) => text.trim()),
      debounceTime(SEARCH_DEBOUNCE_MS),
      takeUntilDestroyed(inject(DestroyRef)),
    )
    .subscribe((q) => {
      if (q === sent.trim()) return;
      sent = q;
      search(q);
    });
  return control;
}
