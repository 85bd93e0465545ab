import { TestBed } from '@angular/core/testing';
import { MatSnackBar, type MatSnackBarRef, type TextOnlySnackBar } from '@angular/material/snack-bar';
import { SwUpdate, type VersionEvent } from '@angular/service-worker';
import { Subject } from 'rxjs';
import { describe, expect, it, vi } from 'vitest';
import { AppUpdates } from './app-updates';

/** The service worker's side as SwUpdate shows it: versions and a broken state, told by the spec. */
class WorkerUpdates {
  readonly isEnabled = true;
  readonly versionUpdates = new Subject<VersionEvent>();
  readonly unrecoverable = new Subject<{ type: 'UNRECOVERABLE_STATE'; reason: string }>();
}

describe('AppUpdates', () => {
  function watching(): { worker: WorkerUpdates; offers: string[] } {
    const worker = new WorkerUpdates();
    TestBed.configureTestingModule({ providers: [{ provide: SwUpdate, useValue: worker }] });
    const offers: string[] = [];
    const snackBar = TestBed.inject(MatSnackBar);
    const open = snackBar.open.bind(snackBar);
    snackBar.open = (message: string, action?: string): MatSnackBarRef<TextOnlySnackBar> => {
      offers.push(`${message} [${action ?? ''}]`);
      return open(message, action);
    };
    TestBed.inject(AppUpdates).watch();
    return { worker, offers };
  }

  it('offers a reload once a new version is ready, and only then', async () => {
    const { worker, offers } = watching();
    worker.versionUpdates.next({ type: 'VERSION_DETECTED', version: { hash: 'b' } });
    worker.versionUpdates.next({ type: 'NO_NEW_VERSION_DETECTED', version: { hash: 'a' } });
    expect(offers).toEqual([]);
    worker.versionUpdates.next({
      type: 'VERSION_READY',
      currentVersion: { hash: 'a' },
      latestVersion: { hash: 'b' },
    });
    // The snack bar's code is imported when there is a message to show.
    await vi.waitFor(() =>
      expect(offers).toEqual([
        'A new version of the workbench is ready. Reload when you are ready; what you typed is kept. [Reload]',
      ]),
    );
  });

  it('asks for a reload when the version in use can no longer be served', async () => {
    const { worker, offers } = watching();
    worker.unrecoverable.next({ type: 'UNRECOVERABLE_STATE', reason: 'files gone' });
    await vi.waitFor(() =>
      expect(offers[0]).toMatch(/can no longer be loaded from this device.*\[Reload\]$/),
    );
  });
});
