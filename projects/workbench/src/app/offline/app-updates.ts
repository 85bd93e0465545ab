import { inject, Injectable, Injector } from '@angular/core';
import { SwUpdate } from '@angular/service-worker';
import { filter } from 'rxjs';
import { showSnackBarMessage } from '../shell/snack-bar-message';

/**
 * Offers a new version of the workbench once the service worker has it: a message with "Reload", never a
 * reload by itself (a technician may be in the middle of a job; what they typed is kept either way). A version
 * the worker can no longer serve asks for a reload in the same way. The snack bar that shows the message is
 * loaded when there is one to show (`showSnackBarMessage`): most visits never need it.
 */
@Injectable({ providedIn: 'root' })
export class AppUpdates {
  private readonly updates = inject(SwUpdate);
  private readonly injector = inject(Injector);
  private watching = false;

  /** Starts listening for new versions (once). */
  watch(): void {
    if (this.watching || !this.updates.isEnabled) return;
    this.watching = true;
    this.updates.versionUpdates
      .pipe(filter((event) => event.type === 'VERSION_READY'))
      .subscribe(() => void this.offerReload('A new version of the workbench is ready.'));
    this.updates.unrecoverable.subscribe(
      () => void this.offerReload('This version of the workbench can no longer be loaded from this device.'),
    );
  }

  private async offerReload(message: string): Promise<void> {
    const offer = await showSnackBarMessage(
      this.injector,
      `${message} Reload when you are ready; what you typed is kept.`,
      'Reload',
    );
    offer.onAction().subscribe(() => document.location.reload());
  }
}
