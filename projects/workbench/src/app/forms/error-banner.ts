import { booleanAttribute, ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { httpErrorMessage } from '../shell/server-errors';
import type { AppIconName } from '../icons/app-icons';

/**
 * Why a request failed, on the error colours: an icon, the sentence, and the way on (a retry button, or
 * a link the page projects with the `errorBannerAction` attribute). The page puts it in an `@if`, so that a
 * screen reader hears it as it appears:
 *
 * `<app-error-banner lead="The keys could not be fetched." [error]="list.error()" retryLabel="Try again" (retry)="list.reload()" />`
 *
 * Content projected without the attribute continues the sentence (a link to ask again, say).
 */
@Component({
  selector: 'app-error-banner',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <mat-icon class="error-banner__icon" aria-hidden="true" [svgIcon]="icon()" />
    <p class="error-banner__text">
      {{ text() }}
      <ng-content />
    </p>
    <ng-content select="[errorBannerAction]" />
    @if (retryLabel(); as label) {
      <button matButton="outlined" class="error-banner__retry" type="button" (click)="retry.emit()">
        <mat-icon aria-hidden="true" svgIcon="refresh" />
        {{ label }}
      </button>
    }
  `,
  styles: `
    :host {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 8px 12px;
      padding: 12px 16px;
      border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
      // Large targets for gloved hands, whichever appearance the way on takes.
      --mat-button-outlined-container-height: 48px;
      --mat-button-filled-container-height: 48px;
      --mat-button-text-container-height: 48px;
    }

    :host:focus-visible {
      outline: 2px solid var(--mat-sys-on-error-container);
      outline-offset: 2px;
    }

    .error-banner__icon {
      flex: none;
      align-self: flex-start;
    }

    // The sentence takes the room; the way on wraps under it when there is none left.
    .error-banner__text {
      flex: 1 1 16rem;
      margin: 0;
    }
  `,
  host: {
    class: 'error-banner',
    '[attr.role]': "politeness() === 'polite' ? 'status' : 'alert'",
    '[attr.tabindex]': 'focusable() ? -1 : null',
  },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ErrorBanner {
  /** The sentence to show; when absent, the failed request's `error` is put into words. */
  readonly message = input<string | null>(null);
  /** The failed request's error, put into words with `httpErrorMessage` when no `message` is given. */
  readonly error = input<unknown>(null);
  /** What could not be done, before the reason: "The keys could not be fetched." */
  readonly lead = input<string>('');
  /** The icon before the sentence: `error`, or `link_off` for a broken link. */
  readonly icon = input<AppIconName>('error');
  /** The label of the button that tries again; no button without it. */
  readonly retryLabel = input<string | null>(null);
  /** `assertive` (role `alert`, the default) interrupts; `polite` (role `status`) waits its turn. */
  readonly politeness = input<'assertive' | 'polite'>('assertive');
  /** Whether a script may move the focus to the banner (tabindex -1), as a form does when no field is at fault. */
  readonly focusable = input(false, { transform: booleanAttribute });
  /** The retry button was pressed. */
  readonly retry = output<void>();

  protected readonly text = computed(() => {
    const reason = this.message() ?? (this.error() ? httpErrorMessage(this.error()) : '');
    return [this.lead(), reason].filter(Boolean).join(' ');
  });
}
