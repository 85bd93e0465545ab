import { booleanAttribute, ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import type { AppIconName } from '../icons/app-icons';

/** Room the spinner or an icon takes before the words: 20 px and the 8 px gap; an icon is 18 px. */
const SPINNER_ROOM = '28px';
const ICON_ROOM = '26px';

/**
 * The button that sends a request: while the request runs it shows a spinner and `busyLabel`, cannot be
 * pressed again, and says so (`aria-busy`, `aria-disabled`). It stays focusable meanwhile, so that a person
 * on the keyboard keeps their place, and keeps its width, so that nothing beside it jumps.
 *
 * `<app-busy-button appearance="filled" type="submit" [busy]="busy()" label="Send the link" busyLabel="Sending…" />`
 *
 * A page listens to `(click)` on the element, as on a button; a press while busy or disabled reaches
 * neither the page nor the form.
 */
@Component({
  selector: 'app-busy-button',
  imports: [MatButtonModule, MatIconModule, MatProgressSpinnerModule],
  template: `
    <button
      [matButton]="appearance()"
      [type]="type()"
      disabledInteractive
      [disabled]="busy() || disabled()"
      [attr.aria-busy]="busy() || null"
      (click)="_guard($event)"
    >
      <span
        class="busy-button__content"
        [attr.data-other]="_other().text"
        [style.--other-room]="_other().room"
      >
        <span class="busy-button__now">
          @if (busy()) {
            <mat-spinner diameter="20" aria-hidden="true" />
          } @else if (icon(); as iconName) {
            <mat-icon aria-hidden="true" [svgIcon]="iconName" />
          }
          {{ busy() ? (busyLabel() ?? label()) : label() }}
        </span>
      </span>
    </button>
  `,
  styles: `
    :host {
      display: inline-flex;
    }

    button {
      flex: 1 1 auto;
    }

    // The words of both states in one cell: the other state's words, invisible and unheard, hold the width.
    .busy-button__content {
      display: inline-grid;
      justify-items: center;
    }

    .busy-button__now,
    .busy-button__content::after {
      grid-area: 1 / 1;
    }

    .busy-button__now {
      display: inline-flex;
      align-items: center;
      gap: 8px;
    }

    .busy-button__content::after {
      content: attr(data-other);
      padding-inline-start: var(--other-room, 0);
      visibility: hidden;
      height: 0;
    }

    mat-icon {
      margin: 0;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BusyButton {
  /** What the button does: "Send the invitation". */
  readonly label = input.required<string>();
  /** What it says while the request runs: "Sending…"; the label stays when none is given. */
  readonly busyLabel = input<string | null>(null);
  /** Whether the request runs: the spinner shows and presses are refused. */
  readonly busy = input(false, { transform: booleanAttribute });
  /** Refuses presses for a reason of the page's own (nothing to save yet). */
  readonly disabled = input(false, { transform: booleanAttribute });
  /** Material's button appearance. */
  readonly appearance = input<'filled' | 'outlined' | 'tonal' | 'text' | 'elevated'>('filled');
  /** `submit` for a form's button; `button` (the default) for an action. */
  readonly type = input<'submit' | 'button'>('button');
  /** The icon before the label, which the spinner takes the place of while busy. */
  readonly icon = input<AppIconName | null>(null);

  /** The words of the state not shown, with the room its spinner or icon takes. */
  protected readonly _other = computed(() => {
    const busyWords = this.busyLabel() ?? this.label();
    return this.busy()
      ? { text: this.label(), room: this.icon() ? ICON_ROOM : '0px' }
      : { text: busyWords, room: SPINNER_ROOM };
  });

  protected _guard(event: Event): void {
    if (!this.busy() && !this.disabled()) return;
    // Still focusable while refusing (aria-disabled): neither the form nor the page hears the press.
    event.preventDefault();
    event.stopImmediatePropagation();
  }
}
