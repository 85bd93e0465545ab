import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  ElementRef,
  inject,
  Injector,
  input,
  type OnInit,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MAT_FORM_FIELD_DEFAULT_OPTIONS, MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSelectModule } from '@angular/material/select';
import type { AmplitudeUnit, MachineSide, RotorType } from '@counterpoise/api';
import { RecordFormError, RecordFormFrame, RecordSaveBar } from '../records/record-form-frame';
import { AcceptanceFields } from '../records/acceptance-fields';
import { FORM_FIELD_OPTIONS, RecordForm } from '../records/record-form';
import { AMPLITUDE_UNIT_LABELS, planeName, ROTOR_TYPE_LABELS, SIDE_LABELS } from '../records/record-labels';
import { idFromRoute } from '../records/record-page';
import type { HoldsUnsavedInput } from '../records/unsaved-changes';
import { errorMessage } from '../shell/validators';
import {
  COMMON_PRACTICE_LIMITS_MM,
  describeEvidence,
  FAMILY_FIELDS,
  familyFields,
  familyForm,
  familyRequest,
  fillFamilyForm,
  isRetyped,
  matchRadiiToPlanes,
  sensitivityGroup,
  type SensitivityGroup,
} from './family-form-model';
import { MachineFamiliesApi } from './machine-families.api';
import { ErrorBanner } from '../forms/error-banner';

/** At most one figure per sensor and plane: two sensors on two planes. */
const MAX_SENSITIVITIES = 4;

/**
 * Adding a machine family or changing one: name, rotor type, speed, planes and their radii, the
 * inspection limits (common practice to start with), the acceptance level, and the stored sensitivities,
 * whose jobs and spread are shown but never typed.
 */
@Component({
  selector: 'app-machine-family-form-page',
  imports: [
    ErrorBanner,
    RecordFormError,
    RecordFormFrame,
    RecordSaveBar,
    AcceptanceFields,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressSpinnerModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  templateUrl: './machine-family-form-page.html',
  styleUrl: './machine-family-form-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // Messages under a field take the room they need, so that two lines never run into the next field.
  providers: [{ provide: MAT_FORM_FIELD_DEFAULT_OPTIONS, useValue: FORM_FIELD_OPTIONS }],
  host: { '(window:beforeunload)': 'warnBeforeUnload($event)' },
})
export class MachineFamilyFormPage implements OnInit, HoldsUnsavedInput {
  /** The family's id when editing; absent when adding one. */
  readonly id = input<string>();

  private readonly host = inject(ElementRef<HTMLElement>);
  private readonly injector = inject(Injector);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly form = familyForm();
  protected readonly editing = new RecordForm({
    api: inject(MachineFamiliesApi),
    noun: 'machine family',
    fields: FAMILY_FIELDS,
    form: this.form,
    request: () => familyRequest(this.form),
    fieldsOf: familyFields,
    fill: (family) => {
      fillFamilyForm(this.form, family);
      this.planeCount.set(family.planeCount);
    },
    pageOf: (family) => `/machine-families/${family.id}`,
  });
  protected readonly isNew = computed(() => this.id() === undefined);
  protected readonly planeCount = signal<1 | 2>(this.form.controls.planeCount.value);
  protected readonly rotorTypes = Object.entries(ROTOR_TYPE_LABELS) as [RotorType, string][];
  protected readonly units = Object.entries(AMPLITUDE_UNIT_LABELS) as [AmplitudeUnit, string][];
  protected readonly sides = Object.entries(SIDE_LABELS) as [MachineSide, string][];
  protected readonly commonLimits = COMMON_PRACTICE_LIMITS_MM;
  protected readonly maxSensitivities = MAX_SENSITIVITIES;
  protected readonly planeName = planeName;
  protected readonly errorMessage = errorMessage;
  protected readonly evidence = describeEvidence;
  protected readonly isRetyped = isRetyped;

  constructor() {
    this.form.controls.planeCount.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((count) => {
        matchRadiiToPlanes(this.form);
        this.planeCount.set(count);
        this.form.updateValueAndValidity();
      });
  }

  ngOnInit(): void {
    const id = this.id();
    if (id === undefined) return;
    const recordId = idFromRoute(id);
    if (recordId === null) this.editing.loadError.set('This address names no machine family.');
    else this.editing.load(recordId);
  }

  hasUnsavedInput(): boolean {
    return this.editing.hasUnsavedInput();
  }

  protected warnBeforeUnload(event: BeforeUnloadEvent): void {
    if (this.hasUnsavedInput()) event.preventDefault();
  }

  /** The planes a figure may name. */
  protected planeIndexes(): number[] {
    return this.planeCount() === 1 ? [0] : [0, 1];
  }

  /** Adds a figure for the first sensor and plane that has none yet. */
  protected addSensitivity(): void {
    const taken = new Set(
      this.form.controls.sensitivities.controls.map(
        (figure) => `${figure.value.sensorSide}/${figure.value.planeIndex}`,
      ),
    );
    const free = (['left', 'right'] as const)
      .flatMap((sensorSide) => this.planeIndexes().map((planeIndex) => ({ sensorSide, planeIndex })))
      .find(({ sensorSide, planeIndex }) => !taken.has(`${sensorSide}/${planeIndex}`));
    this.form.controls.sensitivities.push(sensitivityGroup(free ?? {}));
    this.form.markAsDirty();
    this.focus(`#sensitivity-${this.form.controls.sensitivities.length - 1}-side`);
  }

  protected removeSensitivity(index: number): void {
    this.form.controls.sensitivities.removeAt(index);
    this.form.markAsDirty();
    this.focus('#add-sensitivity');
  }

  protected storedOf(figure: SensitivityGroup) {
    return figure.controls.stored.value;
  }

  private focus(selector: string): void {
    afterNextRender(
      () => (this.host.nativeElement as HTMLElement).querySelector<HTMLElement>(selector)?.focus(),
      {
        injector: this.injector,
      },
    );
  }
}
