import { Clipboard } from '@angular/cdk/clipboard';
import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  inject,
  input,
  linkedSignal,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

/**
 * A button that copies a text to the clipboard (the CDK's `Clipboard`), and says beside it, in a status a
 * screen reader announces, whether that worked; when the browser refuses, it says how to copy by hand.
 * The status is cleared when the text changes:
 *
 * `<app-copy-button [text]="curl()" label="Copy the command" what="command" />`
 */
@Component({
  selector: 'app-copy-button',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <button #button matButton="filled" type="button" (click)="copy()">
      <mat-icon aria-hidden="true" svgIcon="content_copy" />
      {{ label() }}
    </button>
    <span class="copy__status" role="status">
      @if (copied() === 'yes') {
        <mat-icon aria-hidden="true" svgIcon="check" />
        Copied.
      } @else if (copied() === 'failed') {
        The {{ what() }} could not be copied here; select it above and copy it by hand.
      }
    </span>
  `,
  styles: `
    :host {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 8px;
      // A target for gloved hands.
      --mat-button-filled-container-height: 48px;
    }

    .copy__status {
      display: inline-flex;
      align-items: center;
      gap: 4px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CopyButton {
  /** What the button copies. */
  readonly text = input.required<string>();
  /** The button's words: "Copy the key". */
  readonly label = input.required<string>();
  /** What is copied, named in the message when the browser refuses: "key", "command". */
  readonly what = input.required<string>();

  private readonly clipboard = inject(Clipboard);
  private readonly button = viewChild.required('button', { read: ElementRef<HTMLButtonElement> });
  /** Whether the last copy of this text worked; null until the button is pressed, and again when the text changes. */
  protected readonly copied = linkedSignal<string, 'yes' | 'failed' | null>({
    source: this.text,
    computation: () => null,
  });

  /** Moves the focus to the button (a dialog's next step, say). */
  focus(): void {
    this.button().nativeElement.focus();
  }

  protected copy(): void {
    this.copied.set(this.clipboard.copy(this.text()) ? 'yes' : 'failed');
  }
}
