import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  inject,
  input,
  type OnInit,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { AcceptanceLevel, AmplitudeUnit } from '@counterpoise/api';
import { errorMessage } from '../shell/validators';
import {
  AMPLITUDE_UNIT_LABELS,
  BALANCE_GRADES,
  type BalanceGrade,
  type Foundation,
  FOUNDATION_LABELS,
  MACHINE_GROUP_LABELS,
  ZONE_GUIDANCE,
  ZONE_LABELS,
} from './record-labels';
import { numberWithin, RECORD_RULES, requiredNumber } from './record-rules';

/** The kinds of acceptance level, and `inherit` for a machine that takes its family's (or none). */
export type AcceptanceKind = AcceptanceLevel['kind'] | 'inherit';

/** The acceptance level's fields; only those of the chosen kind are enabled (and so checked and sent). */
export type AcceptanceGroup = FormGroup<{
  kind: FormControl<AcceptanceKind>;
  amplitude: FormControl<number | null>;
  unit: FormControl<AmplitudeUnit>;
  grade: FormControl<BalanceGrade>;
  zone: FormControl<'A' | 'B'>;
  group: FormControl<1 | 2>;
  foundation: FormControl<Foundation>;
}>;

const FIELDS_OF: Readonly<Record<AcceptanceKind, readonly string[]>> = {
  inherit: [],
  'shop-target': ['amplitude', 'unit'],
  'balance-grade': ['grade'],
  'severity-zone': ['zone', 'group', 'foundation'],
};

/** Enables the fields of the chosen kind and disables the others. */
function showFieldsOf(group: AcceptanceGroup): void {
  const wanted = FIELDS_OF[group.controls.kind.value];
  for (const [name, control] of Object.entries(group.controls)) {
    if (name === 'kind') continue;
    if (wanted.includes(name)) control.enable({ emitEvent: false });
    else control.disable({ emitEvent: false });
  }
}

/**
 * The form group of an acceptance level, filled from a stored one; null gives `inherit` where allowed
 * (a machine), G16 otherwise (the usual grade for agricultural and crushing machinery parts).
 */
export function acceptanceGroup(level: AcceptanceLevel | null, allowInherit: boolean): AcceptanceGroup {
  const group: AcceptanceGroup = new FormGroup({
    kind: new FormControl<AcceptanceKind>(level?.kind ?? (allowInherit ? 'inherit' : 'balance-grade'), {
      nonNullable: true,
    }),
    amplitude: new FormControl<number | null>(level?.kind === 'shop-target' ? level.amplitude : null, [
      requiredNumber('Enter the target amplitude.'),
      numberWithin(
        { above: 0, max: RECORD_RULES.maxTargetAmplitude },
        `The target amplitude is above 0 and at most ${RECORD_RULES.maxTargetAmplitude}.`,
      ),
    ]),
    unit: new FormControl<AmplitudeUnit>(level?.kind === 'shop-target' ? level.unit : 'in/s-pk', {
      nonNullable: true,
    }),
    grade: new FormControl<BalanceGrade>(level?.kind === 'balance-grade' ? level.grade : 'G16', {
      nonNullable: true,
    }),
    zone: new FormControl<'A' | 'B'>(level?.kind === 'severity-zone' ? level.zone : 'B', {
      nonNullable: true,
    }),
    group: new FormControl<1 | 2>(level?.kind === 'severity-zone' ? level.group : 2, { nonNullable: true }),
    foundation: new FormControl<Foundation>(level?.kind === 'severity-zone' ? level.foundation : 'flexible', {
      nonNullable: true,
    }),
  });
  showFieldsOf(group);
  // The group lives as long as its form; the subscription goes with them.
  group.controls.kind.valueChanges.subscribe(() => showFieldsOf(group));
  return group;
}

/** Puts a stored acceptance level (or none) into the group. */
export function setAcceptance(
  group: AcceptanceGroup,
  level: AcceptanceLevel | null,
  allowInherit: boolean,
): void {
  group.setValue(acceptanceGroup(level, allowInherit).getRawValue());
}

/** The acceptance level the group describes, as the API takes it; null for `inherit`. */
export function acceptanceValue(group: AcceptanceGroup): AcceptanceLevel | null {
  const value = group.getRawValue();
  switch (value.kind) {
    case 'inherit':
      return null;
    case 'shop-target':
      return { kind: 'shop-target', amplitude: value.amplitude ?? 0, unit: value.unit };
    case 'balance-grade':
      return { kind: 'balance-grade', grade: value.grade };
    case 'severity-zone':
      return { kind: 'severity-zone', zone: value.zone, group: value.group, foundation: value.foundation };
  }
}

/**
 * The acceptance level's fields: a shop's own target with its unit, an ISO 21940-11 balance grade, or an
 * ISO 10816-3 / 20816-3 zone, the zones always with the note that mobile machines are outside their scope.
 */
@Component({
  selector: 'app-acceptance-fields',
  imports: [MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  template: `
    <div class="fields" [formGroup]="group()">
      <mat-form-field appearance="outline" class="kind">
        <mat-label>Acceptance level</mat-label>
        <mat-select formControlName="kind">
          @if (inheritLabel(); as label) {
            <mat-option value="inherit">{{ label }}</mat-option>
          }
          <mat-option value="shop-target">The shop’s own target</mat-option>
          <mat-option value="balance-grade">A balance grade (ISO 21940-11)</mat-option>
          <mat-option value="severity-zone">A vibration zone (ISO 10816-3 / 20816-3)</mat-option>
        </mat-select>
      </mat-form-field>
      @switch (kind()) {
        @case ('shop-target') {
          <mat-form-field appearance="outline">
            <mat-label>Target amplitude</mat-label>
            <input
              matInput
              type="number"
              inputmode="decimal"
              formControlName="amplitude"
              min="0"
              step="0.01"
            />
            <mat-error>{{ errorMessage(group().controls.amplitude) }}</mat-error>
          </mat-form-field>
          <mat-form-field appearance="outline">
            <mat-label>Unit</mat-label>
            <mat-select formControlName="unit">
              @for (unit of units; track unit[0]) {
                <mat-option [value]="unit[0]">{{ unit[1] }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
        }
        @case ('balance-grade') {
          <mat-form-field appearance="outline" class="whole-row">
            <mat-label>Balance grade</mat-label>
            <mat-select formControlName="grade">
              @for (grade of grades; track grade.grade) {
                <mat-option [value]="grade.grade">{{ grade.grade }} · {{ grade.use }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
        }
        @case ('severity-zone') {
          <mat-form-field appearance="outline">
            <mat-label>Highest zone accepted</mat-label>
            <mat-select formControlName="zone">
              @for (zone of zones; track zone[0]) {
                <mat-option [value]="zone[0]">{{ zone[1] }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <mat-form-field appearance="outline">
            <mat-label>Machine group</mat-label>
            <mat-select formControlName="group">
              @for (machineGroup of machineGroups; track machineGroup[0]) {
                <mat-option [value]="machineGroup[0]">{{ machineGroup[1] }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <mat-form-field appearance="outline">
            <mat-label>Foundation</mat-label>
            <mat-select formControlName="foundation">
              @for (foundation of foundations; track foundation[0]) {
                <mat-option [value]="foundation[0]">{{ foundation[1] }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <p class="guidance">
            <mat-icon aria-hidden="true" svgIcon="info" />
            {{ zoneGuidance }}
          </p>
        }
      }
    </div>
  `,
  styles: `
    .fields {
      display: grid;
      grid-template-columns: repeat(auto-fill, minmax(14rem, 1fr));
      gap: 0 16px;
    }
    .kind,
    .whole-row,
    .guidance {
      grid-column: 1 / -1;
    }
    mat-form-field {
      width: 100%;
      margin-bottom: 16px;
    }
    .guidance {
      display: flex;
      gap: 8px;
      align-items: flex-start;
      margin: 0 0 16px;
      padding: 12px 16px;
      border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    .guidance mat-icon {
      flex: none;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AcceptanceFields implements OnInit {
  /** The group from `acceptanceGroup()`. */
  readonly group = input.required<AcceptanceGroup>();
  /** The label of the `inherit` choice ("The family’s: …"); no such choice when null. */
  readonly inheritLabel = input<string | null>(null);

  private readonly destroyRef = inject(DestroyRef);
  protected readonly kind = signal<AcceptanceKind>('inherit');
  protected readonly units = Object.entries(AMPLITUDE_UNIT_LABELS) as [AmplitudeUnit, string][];
  protected readonly grades = BALANCE_GRADES;
  protected readonly zones = Object.entries(ZONE_LABELS) as ['A' | 'B', string][];
  protected readonly machineGroups = Object.entries(MACHINE_GROUP_LABELS).map(
    ([group, label]) => [Number(group) as 1 | 2, label] as const,
  );
  protected readonly foundations = Object.entries(FOUNDATION_LABELS) as [Foundation, string][];
  protected readonly zoneGuidance = ZONE_GUIDANCE;
  protected readonly errorMessage = errorMessage;

  ngOnInit(): void {
    const kind = this.group().controls.kind;
    this.kind.set(kind.value);
    kind.valueChanges.pipe(takeUntilDestroyed(this.destroyRef)).subscribe((value) => this.kind.set(value));
  }
}
