import { DestroyRef, inject, Injectable, signal } from '@angular/core';
import type { Subscription } from 'rxjs';
import { PhotosApi } from './photos.api';

/** Which bytes of a photo: the image, or its thumbnail. */
export type PhotoSize = 'image' | 'thumbnail';

/** What a screen knows of one photo's bytes: fetching, an object URL to show, or that fetching failed. */
export type PhotoUrlState =
  | { readonly state: 'loading' }
  | { readonly state: 'ready'; readonly url: string }
  | { readonly state: 'failed' };

/**
 * The images of photos as object URLs, for the components that show them: the API wants the session's access
 * token, which an `<img src>` cannot carry, so each image is fetched as a blob through the HTTP client (whose
 * interceptor signs it). Provided per component: every URL is revoked, and every fetch under way stopped,
 * when the component goes.
 */
@Injectable()
export class PhotoUrls {
  private readonly api = inject(PhotosApi);
  private readonly states = signal<ReadonlyMap<string, PhotoUrlState>>(new Map());
  private readonly fetching = new Map<string, Subscription>();

  constructor() {
    inject(DestroyRef).onDestroy(() => {
      for (const subscription of this.fetching.values()) subscription.unsubscribe();
      for (const state of this.states().values()) if (state.state === 'ready') URL.revokeObjectURL(state.url);
    });
  }

  /** The state of a photo's bytes; reading it in a template updates the view when the fetch ends. */
  state(id: number, size: PhotoSize): PhotoUrlState | undefined {
    return this.states().get(key(id, size));
  }

  /** The object URL of a photo's bytes, once fetched. */
  url(id: number, size: PhotoSize): string | null {
    const state = this.state(id, size);
    return state?.state === 'ready' ? state.url : null;
  }

  /** Starts fetching the bytes of each photo not fetched yet (or failed before). */
  load(ids: readonly number[], size: PhotoSize): void {
    for (const id of ids) {
      const name = key(id, size);
      const known = this.states().get(name);
      if (known && known.state !== 'failed') continue;
      this.set(name, { state: 'loading' });
      const request = size === 'image' ? this.api.image(id) : this.api.thumbnail(id);
      this.fetching.set(
        name,
        request.subscribe({
          next: (blob) => this.set(name, { state: 'ready', url: URL.createObjectURL(blob) }),
          error: () => this.set(name, { state: 'failed' }),
          complete: () => this.fetching.delete(name),
        }),
      );
    }
  }

  /** Revokes the URLs of photos no longer shown (removed ones). */
  forget(keep: readonly number[]): void {
    const kept = new Set(keep);
    const next = new Map(this.states());
    for (const [name, state] of next) {
      if (kept.has(Number(name.split(':')[0]))) continue;
      if (state.state === 'ready') URL.revokeObjectURL(state.url);
      next.delete(name);
    }
    this.states.set(next);
  }

  private set(name: string, state: PhotoUrlState): void {
    const next = new Map(this.states());
    next.set(name, state);
    this.states.set(next);
  }
}

function key(id: number, size: PhotoSize): string {
  return `${id}:${size}`;
}
