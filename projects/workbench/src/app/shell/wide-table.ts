import { BreakpointObserver } from '@angular/cdk/layout';
import { inject, type Signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { map } from 'rxjs';

/** From this width a list page's table shows all its columns; below it, the few a phone has room for. */
export const WIDE_TABLE = '(min-width: 720px)';

/**
 * Whether the screen is wide enough for a table's full set of columns, kept up to date as the tablet
 * turns or the window is resized. Call it in an injection context (a field initialiser of a component).
 */
export function wideTable(): Signal<boolean> {
  return toSignal(
    inject(BreakpointObserver)
      .observe(WIDE_TABLE)
      .pipe(map((state) => state.matches)),
    { initialValue: true },
  );
}
