import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DOCUMENT,
  inject,
  input,
  linkedSignal,
} from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import type { ApiKeySummary } from '@counterpoise/api';
import { API_REFERENCE_URL } from '../status/health.api';
import { CopyButton } from '../forms/copy-button';

/**
 * The body of the quick start's call: the single-plane calculator's documented example
 * (`CALC_ROUTES['single-plane'].example` in the API, which a spec holds it equal to; repeated here so that
 * the page loads no zod).
 */
export const QUICK_START_BODY = {
  initial: { amplitude: 0.52, phaseDeg: 74 },
  trialWeight: { mass: 60, angleDeg: 0 },
  withTrial: { amplitude: 0.31, phaseDeg: 141 },
} as const;

/** The route the quick start calls. */
export const QUICK_START_PATH = '/api/v1/calc/single-plane';

/** The integrators' guide on the docs site, and its page on the typed client. */
export const INTEGRATORS_GUIDE_URL = '/docs/integrators/';
export const TYPED_CLIENT_URL = '/docs/integrators/client.html';

/**
 * A ready curl line for a key: a real calculator route with a real body, the key written as its prefix
 * and an ellipsis, since the whole key is shown once, at its creation, and never again. A key limited to
 * web origins answers only requests that name one, so its line sends the first, as its pages would.
 */
export function curlLine(origin: string, key: Pick<ApiKeySummary, 'prefix' | 'allowedOrigins'>): string {
  const [webOrigin] = key.allowedOrigins;
  return [
    `curl -X POST '${origin}${QUICK_START_PATH}'`,
    `  -H 'Content-Type: application/json'`,
    ...(webOrigin === undefined ? [] : [`  -H 'Origin: ${webOrigin}'`]),
    `  -H 'X-Api-Key: ${key.prefix}…'`,
    `  -d '${JSON.stringify(QUICK_START_BODY)}'`,
  ].join(' \\\n');
}

/**
 * The first call with a key: choose one of the organisation's keys in use, copy a curl line that calls the
 * single-plane calculator with it, put the whole key in place of its beginning; then the API reference,
 * the integrators' guide and the typed client.
 */
@Component({
  selector: 'app-quick-start',
  imports: [CopyButton, MatFormFieldModule, MatIconModule, MatSelectModule],
  templateUrl: './quick-start.html',
  styleUrl: './quick-start.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class QuickStart {
  /** The organisation's keys; revoked ones are left out. */
  readonly keys = input.required<readonly ApiKeySummary[]>();

  private readonly origin = inject(DOCUMENT).location.origin;
  protected readonly activeKeys = computed(() => this.keys().filter((key) => key.revokedAt === null));
  /** The chosen key's id: the newest key in use until the person chooses another. */
  protected readonly chosenId = linkedSignal<readonly ApiKeySummary[], number | null>({
    source: this.activeKeys,
    computation: (keys, previous) =>
      previous !== undefined && keys.some((key) => key.id === previous.value)
        ? previous.value
        : ([...keys].sort((a, b) => Date.parse(b.createdAt) - Date.parse(a.createdAt))[0]?.id ?? null),
  });
  protected readonly chosen = computed(() => this.activeKeys().find((key) => key.id === this.chosenId()));
  protected readonly curl = computed(() => {
    const key = this.chosen();
    return key === undefined ? '' : curlLine(this.origin, key);
  });
  protected readonly apiReferenceUrl = API_REFERENCE_URL;
  protected readonly guideUrl = INTEGRATORS_GUIDE_URL;
  protected readonly clientUrl = TYPED_CLIENT_URL;

  protected choose(id: number): void {
    this.chosenId.set(id);
  }
}
