import { inject, Injectable } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { SwUpdate } from '@angular/service-worker';
import { filter } from 'rxjs';

/**
 * Offers a new version of the workbench once the service worker has it: a message with "Reload", never a
 * reload by itself (a technician may be in the middle of a job; what they typed is kept either way). A version
 * the worker can no longer serve asks for a reload in the same way.
 */
@Injectable({ providedIn: 'root' })
export class AppUpdates {
  private readonly updates = inject(SwUpdate);
  private readonly snackBar = inject(MatSnackBar);
  private watching = false;

  /** Starts listening for new versions (once). */
  watch(): void {
    if (this.watching || !this.updates.isEnabled) return;
    this.watching = true;
    this.updates.versionUpdates
      .pipe(filter((event) => event.type === 'VERSION_READY'))
      .subscribe(() => this.offerReload('A new version of the workbench is ready.'));
    this.updates.unrecoverable.subscribe(() =>
      this.offerReload('This version of the workbench can no longer be loaded from this device.'),
    );
  }

  private offerReload(message: string): void {
    this.snackBar
      .open(`${message} Reload when you are ready; what you typed is kept.`, 'Reload')
      .onAction()
      .subscribe(() => document.location.reload());
  }
}
