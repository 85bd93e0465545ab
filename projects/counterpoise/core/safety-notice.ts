import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { cautionsFor, type SafetyTopic } from './safety-cautions';

let nextId = 0;

/**
 * A notice with the safety cautions that belong to a moment of the job (before a run, before welding...).
 * It always ends by deferring to the machine manual, site rules and local codes.
 */
@Component({
  selector: 'cp-safety-notice',
  templateUrl: './safety-notice.html',
  styleUrl: './safety-notice.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    class: 'cp-safety-notice',
    role: 'note',
    '[attr.aria-labelledby]': '_headingId',
    '[class.cp-safety-notice--compact]': 'compact()',
  },
})
export class CpSafetyNotice {
  /** The moments of the job to show cautions for; every caution when empty. */
  readonly topics = input<readonly SafetyTopic[]>([]);
  /** The heading of the notice. */
  readonly heading = input('Safety first');
  /** Show titles only, with the detail one tap away. */
  readonly compact = input(false);

  protected readonly _headingId = `cp-safety-notice-heading-${nextId++}`;
  protected readonly _cautions = computed(() => cautionsFor(this.topics()));
}
