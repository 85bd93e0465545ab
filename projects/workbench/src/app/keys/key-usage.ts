import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  FormControl,
  FormGroup,
  ReactiveFormsModule,
  type ValidationErrors,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { provideNativeDateAdapter } from '@angular/material/core';
import { MatDatepickerModule } from '@angular/material/datepicker';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import type { UsageGrouping } from '@counterpoise/api';
import { ErrorBanner } from '../forms/error-banner';
import { wideTable } from '../shell/wide-table';
import { KeysApi } from './keys.api';
import { UsageChart } from './usage-chart';
import {
  bytesText,
  durationText,
  errorsText,
  statusLabel,
  type UsageLine,
  usageLines,
  usageSeries,
  usageSummary,
} from './usage-model';
import { lastDays, spanDays, spanProblem, USAGE_PRESETS, usageQuery } from './usage-query';

/** A day written `2026-05-01` as the date picker holds it: that calendar day, at local midnight. */
function pickerDate(day: string): Date {
  const [year, month, date] = day.split('-').map(Number) as [number, number, number];
  return new Date(year, month - 1, date);
}

/** The calendar day a date picker's date stands for, written as the report reads days. */
function pickedDay(date: Date | null): string {
  if (date === null || Number.isNaN(date.getTime())) return '';
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${String(date.getFullYear()).padStart(4, '0')}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`;
}

const GROUP_HEADINGS: Readonly<Record<UsageGrouping, string>> = { day: 'Day', route: 'Route', key: 'Key' };

/**
 * What the organisation's keys have been used for: requests, calculations (a batch of n counts n) and errors
 * by status over a span of days, by day, route or key, as a chart and as a table with its total. The span and
 * grouping live in the address (`?from=…&to=…&by=…`), so that a view can be shared and survives a reload.
 */
@Component({
  selector: 'app-key-usage',
  imports: [
    DecimalPipe,
    ErrorBanner,
    MatButtonModule,
    MatButtonToggleModule,
    MatDatepickerModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatTableModule,
    ReactiveFormsModule,
    UsageChart,
  ],
  providers: [provideNativeDateAdapter()],
  templateUrl: './key-usage.html',
  styleUrl: './key-usage.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class KeyUsage {
  private readonly query = usageQuery();
  protected readonly state = this.query.state;
  protected readonly report = inject(KeysApi).usageResource(this.state);
  protected readonly presets = USAGE_PRESETS;
  protected readonly groupHeadings = GROUP_HEADINGS;

  protected readonly range = new FormGroup({
    start: new FormControl<Date | null>(null),
    end: new FormControl<Date | null>(null, withinReport),
  });

  /** The report's lines, as far as the report answers the query shown (not one still on its way). */
  protected readonly lines = computed<UsageLine[]>(() => {
    const report = this.report.hasValue() ? this.report.value() : undefined;
    return report === undefined || report.groupBy !== this.state().groupBy
      ? []
      : usageLines(report, this.state());
  });
  /** The table leaves out days without requests; the chart keeps them, so that its axis is time. */
  protected readonly tableLines = computed(() =>
    this.lines().filter(
      (line) => this.state().groupBy !== 'day' || line.requests > 0 || line.calculations > 0,
    ),
  );
  protected readonly series = computed(() => usageSeries(this.lines()));
  protected readonly summary = computed(() => {
    const report = this.report.hasValue() ? this.report.value() : undefined;
    return report === undefined ? '' : usageSummary(report, this.lines());
  });
  protected readonly total = computed(() =>
    this.report.hasValue() ? this.report.value()?.total : undefined,
  );
  protected readonly spanText = computed(() => {
    const days = spanDays(this.state().from, this.state().to);
    return `${days} ${days === 1 ? 'day' : 'days'}`;
  });

  private readonly wide = wideTable();
  protected readonly columns = computed(() =>
    this.wide() ? ['group', 'requests', 'calculations', 'errors', 'bytes', 'meanDuration'] : ['summary'],
  );

  protected readonly bytesText = bytesText;
  protected readonly durationText = durationText;
  protected readonly errorsText = errorsText;
  protected readonly statusLabel = statusLabel;

  constructor() {
    // The address rules: the fields show its span, and a span picked or typed is written back to it.
    effect(() => {
      const { from, to } = this.state();
      this.range.setValue({ start: pickerDate(from), end: pickerDate(to) }, { emitEvent: false });
    });
    this.range.controls.start.valueChanges.pipe(takeUntilDestroyed()).subscribe(() => {
      const end = this.range.controls.end;
      end.updateValueAndValidity({ emitEvent: false });
      // A start that makes the span too long is said at once, not when the end is next touched.
      if (end.hasError('span')) end.markAsTouched();
    });
    this.range.valueChanges.pipe(takeUntilDestroyed()).subscribe(({ start, end }) => {
      const from = pickedDay(start ?? null);
      const to = pickedDay(end ?? null);
      if (spanProblem(from, to) === null) this.query.change({ from, to });
    });
  }

  protected choosePreset(days: number): void {
    this.query.change(lastDays(days, Date.now()));
  }

  protected isPreset(days: number): boolean {
    const preset = lastDays(days, Date.now());
    return preset.from === this.state().from && preset.to === this.state().to;
  }

  protected groupBy(groupBy: UsageGrouping): void {
    this.query.change({ groupBy });
  }

  /** Why the span in the fields is not shown, in words. */
  protected rangeError(): string {
    const { start, end } = this.range.controls;
    if (start.hasError('matDatepickerParse')) return 'Enter the first day as a date, such as 5/1/2026.';
    if (end.hasError('matDatepickerParse')) return 'Enter the last day as a date, such as 5/31/2026.';
    if (end.hasError('matEndDateInvalid')) return 'The last day comes before the first.';
    const span = end.getError('span') as string | undefined;
    return span ?? 'Choose the first and the last day.';
  }
}

/** The span of the range's fields, checked on its end as the report checks it: at most a year. */
function withinReport(end: AbstractControl<Date | null>): ValidationErrors | null {
  const start = (end.parent?.get('start') as AbstractControl<Date | null> | null)?.value ?? null;
  if (start === null || end.value === null) return null;
  const problem = spanProblem(pickedDay(start), pickedDay(end.value));
  return problem !== null && problem !== 'The last day comes before the first.' ? { span: problem } : null;
}
