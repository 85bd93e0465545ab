import { BreakpointObserver } from '@angular/cdk/layout';
import { DatePipe, DOCUMENT } from '@angular/common';
import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  Injector,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom, map } from 'rxjs';
import type { OutboxAttachment } from '@counterpoise/api';
import { hasMaskedSecret, linkify, MASKED_SECRET, pathInApp } from './message-text';
import { OutboxApi } from './outbox.api';
import { ErrorBanner } from '../forms/error-banner';
import { saveFile } from '../reports/reports.api';
import { httpErrorMessage } from '../shell/server-errors';

/** From this width the list and the open message sit side by side. */
const TWO_PANES = '(min-width: 960px)';

/**
 * The e-mail the server has sent (invitations, password links), as its local mail catcher kept it, so
 * that an owner can follow a link without a real mailbox. The open message is in the address
 * (`/outbox?message=12`), so that the browser's Back returns to the list on a phone.
 */
@Component({
  selector: 'app-outbox-page',
  imports: [ErrorBanner, DatePipe, MatButtonModule, MatIconModule, MatProgressSpinnerModule, RouterLink],
  templateUrl: './outbox-page.html',
  styleUrl: './outbox-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class OutboxPage {
  /** The id of the open message, from the address. */
  readonly message = input<string>();

  private readonly router = inject(Router);
  private readonly document = inject(DOCUMENT);
  private readonly origin = this.document.location.origin;
  private readonly injector = inject(Injector);
  private lastOpen: number | null = null;

  private readonly api = inject(OutboxApi);
  protected readonly outbox = this.api.listResource();
  /** The attachment being fetched, and why the last one could not be. */
  protected readonly fetching = signal<number | null>(null);
  protected readonly attachmentError = signal<string | null>(null);
  /** Newest first: the message just sent is the one being looked for. */
  protected readonly messages = computed(() =>
    // value() throws while the resource is in error, hence hasValue() first.
    [...(this.outbox.hasValue() ? this.outbox.value().messages : [])].sort(
      (a, b) => Date.parse(b.receivedAt) - Date.parse(a.receivedAt),
    ),
  );
  protected readonly open = computed(() => {
    const id = Number(this.message());
    return this.messages().find((message) => message.id === id) ?? null;
  });
  protected readonly openParts = computed(() => linkify(this.open()?.text ?? ''));
  protected readonly twoPanes = toSignal(
    inject(BreakpointObserver)
      .observe(TWO_PANES)
      .pipe(map((state) => state.matches)),
    { initialValue: true },
  );
  protected readonly hasMaskedSecret = hasMaskedSecret;
  protected readonly maskedSecret = MASKED_SECRET;

  constructor() {
    // On a phone the list and the message replace each other, and the focused link goes with the list:
    // focus moves to the message opened, and back to its entry in the list afterwards.
    effect(() => {
      const opened = this.open()?.id ?? null;
      const left = this.lastOpen;
      this.lastOpen = opened;
      if (untracked(this.twoPanes) || opened === left) return;
      afterNextRender(
        () => {
          const target = opened !== null ? 'message-subject' : `message-${left}`;
          this.document.getElementById(target)?.focus();
        },
        { injector: this.injector },
      );
    });
  }

  /** Downloads a file the message carried, through the data service (with the session's credentials). */
  protected async openAttachment(messageId: number, attachment: OutboxAttachment): Promise<void> {
    this.attachmentError.set(null);
    this.fetching.set(attachment.id);
    try {
      saveFile(this.document, await firstValueFrom(this.api.attachment(messageId, attachment.id)));
    } catch (error) {
      this.attachmentError.set(`${attachment.filename} could not be fetched. ${httpErrorMessage(error)}`);
    } finally {
      this.fetching.set(null);
    }
  }

  /** A file's size as people read it: "48 kB". */
  protected size(bytes: number): string {
    if (bytes < 1024) return `${bytes} bytes`;
    if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)} kB`;
    return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
  }

  /** Links to this app stay in the page; others open beside it. */
  protected follow(event: MouseEvent, href: string): void {
    const path = pathInApp(href, this.origin);
    if (path === null || event.ctrlKey || event.metaKey || event.shiftKey || event.button !== 0) return;
    event.preventDefault();
    void this.router.navigateByUrl(path);
  }

  protected isInApp(href: string): boolean {
    return pathInApp(href, this.origin) !== null;
  }
}
