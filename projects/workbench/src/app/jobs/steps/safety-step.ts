import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  inject,
  input,
  type OnInit,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatIconModule } from '@angular/material/icon';
import { CpSafetyNotice, SAFETY_CAUTIONS, SAFETY_TOPICS } from '@counterpoise/ng/core';
import { BusyButton } from '../../forms/busy-button';
import { ErrorBanner } from '../../forms/error-banner';
import { formErrorOf } from '../../shell/server-errors';
import { JobDrafts } from '../job-drafts';
import { JobSession } from '../job-session';
import type { Job, JobSafetyTopic } from '../jobs.api';

/** One acknowledgement: the topic and the titles of its cautions, as the library words them. */
interface TopicLine {
  readonly topic: JobSafetyTopic;
  readonly titles: string;
}

/**
 * The job's topics, in the order the job meets them. The library's topics are the job's (a spec of the
 * library holds them equal to the server's), and their cautions' words are the library's.
 */
const TOPIC_LINES: readonly TopicLine[] = SAFETY_TOPICS.map((topic) => ({
  topic,
  titles: SAFETY_CAUTIONS.filter((caution) => caution.topic === topic)
    .map((caution, index) =>
      index === 0 ? caution.title : caution.title[0]!.toLowerCase() + caution.title.slice(1),
    )
    .join('; '),
}));

type TopicControls = Record<JobSafetyTopic, FormControl<boolean>>;

/**
 * Step 1 of a job: the cautions of the work, read before anyone touches the rotor, with one tick per topic.
 * The stored acknowledgement (who, when) is shown read-only; the server keeps it with the job.
 */
@Component({
  selector: 'app-job-safety-step',
  imports: [
    BusyButton,
    CpSafetyNotice,
    DatePipe,
    ErrorBanner,
    MatCheckboxModule,
    MatIconModule,
    ReactiveFormsModule,
  ],
  templateUrl: './safety-step.html',
  styleUrl: './safety-step.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobSafetyStep implements OnInit {
  readonly job = input.required<Job>();
  readonly editable = input(false);

  protected readonly session = inject(JobSession);
  private readonly drafts = inject(JobDrafts);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly topics = TOPIC_LINES;
  protected readonly form = new FormGroup(
    Object.fromEntries(
      SAFETY_TOPICS.map((topic) => [
        topic,
        new FormControl(false, { nonNullable: true, validators: Validators.requiredTrue }),
      ]),
    ) as TopicControls,
  );
  /** Set when the person asked to store with a topic unticked. */
  protected readonly missing = signal(false);
  protected readonly formError = signal<string | null>(null);
  protected readonly acknowledgement = computed(() => this.job().safety);
  /** The titles of the topics stored, for the read-only list. */
  protected readonly storedTopics = computed(() => {
    const stored = this.acknowledgement()?.topicIds ?? [];
    return TOPIC_LINES.filter((line) => stored.includes(line.topic));
  });

  ngOnInit(): void {
    this.drafts.keep(this.form, this.job().id, 'safety', this.destroyRef);
    this.form.valueChanges.pipe(takeUntilDestroyed(this.destroyRef)).subscribe(() => {
      if (this.form.valid) this.missing.set(false);
    });
  }

  protected async acknowledge(): Promise<void> {
    this.formError.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      this.missing.set(true);
      return;
    }
    const topicIds = SAFETY_TOPICS.filter((topic) => this.form.controls[topic].value);
    const outcome = await this.session.save('Safety acknowledgement', (api, id, etag) =>
      api.acknowledgeSafety(id, topicIds, etag),
    );
    if (outcome.ok) this.drafts.clear(outcome.job.id, 'safety');
    else this.formError.set(formErrorOf(this.form, outcome.error));
  }
}
