import { COMMA, ENTER } from '@angular/cdk/keycodes';
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
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { type MatChipInputEvent, MatChipsModule } from '@angular/material/chips';
import { MAT_FORM_FIELD_DEFAULT_OPTIONS, MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { CustomerPicker } from '../customers/customer-picker';
import { CustomersApi } from '../customers/customers.api';
import { MachineFamiliesApi, type MachineFamily } from '../machine-families/machine-families.api';
import { RecordFormError, RecordFormFrame, RecordSaveBar } from '../records/record-form-frame';
import { AcceptanceFields, setAcceptance } from '../records/acceptance-fields';
import { FORM_FIELD_OPTIONS, RecordForm } from '../records/record-form';
import {
  describeAcceptance,
  formatNumber,
  opposite,
  planeSide,
  type RotationDirection,
  ROTATION_LABELS,
} from '../records/record-labels';
import { idFromRoute } from '../records/record-page';
import { RECORD_RULES } from '../records/record-rules';
import type { HoldsUnsavedInput } from '../records/unsaved-changes';
import { errorMessage } from '../shell/validators';
import {
  fillMachineForm,
  MACHINE_FIELDS,
  machineFields,
  machineForm,
  machineRequest,
  matchPlanesToCount,
  restorePlanes,
} from './machine-form-model';
import { MachinesApi } from './machines.api';
import { PlaneEditor } from './plane-editor';

/** The families a machine can join: those in use, enough for any shop's range. */
const FAMILIES_OFFERED = 100;

/**
 * Adding a machine or changing one: its customer, family (whose planes, radii, speed and acceptance it
 * takes as a start), identity, running figures, sensors, direction of rotation, each plane's layout drawn
 * and edited on the end view of the rotor, stock weights and acceptance level.
 */
@Component({
  selector: 'app-machine-form-page',
  imports: [
    RecordFormError,
    RecordFormFrame,
    RecordSaveBar,
    AcceptanceFields,
    CustomerPicker,
    MatButtonModule,
    MatButtonToggleModule,
    MatCheckboxModule,
    MatChipsModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressSpinnerModule,
    MatSelectModule,
    PlaneEditor,
    ReactiveFormsModule,
  ],
  templateUrl: './machine-form-page.html',
  styleUrl: './machine-form-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // Messages under a field take the room they need, so that two lines never run into the next field.
  providers: [{ provide: MAT_FORM_FIELD_DEFAULT_OPTIONS, useValue: FORM_FIELD_OPTIONS }],
  host: { '(window:beforeunload)': 'warnBeforeUnload($event)' },
})
export class MachineFormPage implements OnInit, HoldsUnsavedInput {
  /** The machine's id when editing; absent when adding one. */
  readonly id = input<string>();
  /** The customer to add the machine for (from the customer's page). */
  readonly customerId = input<string>();

  private readonly customersApi = inject(CustomersApi);
  private readonly familiesApi = inject(MachineFamiliesApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly form = machineForm();
  protected readonly editing = new RecordForm({
    api: inject(MachinesApi),
    noun: 'machine',
    fields: MACHINE_FIELDS,
    form: this.form,
    request: () => machineRequest(this.form),
    fieldsOf: machineFields,
    fill: (machine) => {
      fillMachineForm(this.form, machine);
      this.syncSignals();
      if (
        machine.familyId !== null &&
        !this.familyOptions().some((family) => family.id === machine.familyId)
      ) {
        this.extraFamily.set({
          id: machine.familyId,
          name: machine.familyName ?? `Family no. ${machine.familyId}`,
        });
      }
    },
    pageOf: (machine) => `/machines/${machine.id}`,
  });
  protected readonly isNew = computed(() => this.id() === undefined);

  private readonly families = rxResource({
    stream: () => this.familiesApi.list({ pageSize: FAMILIES_OFFERED, sort: 'name' }),
  });
  protected readonly familyOptions = computed<readonly MachineFamily[]>(() =>
    this.families.hasValue() ? this.families.value().items : [],
  );
  /** The machine's own family when it is not among those in use (archived since). */
  protected readonly extraFamily = signal<{ id: number; name: string } | null>(null);

  protected readonly rotation = signal<RotationDirection>(this.form.controls.rotationSeenFromLeft.value);
  protected readonly planeCount = signal<1 | 2>(this.form.controls.planeCount.value);
  protected readonly familyId = signal<number | null>(null);
  protected readonly stockWeights = signal<readonly number[]>([]);
  protected readonly stockWeightError = signal<string | null>(null);
  protected readonly family = computed(() =>
    this.familyOptions().find((family) => family.id === this.familyId()),
  );
  protected readonly inheritLabel = computed(() => {
    const family = this.family();
    if (family) return `The family’s: ${describeAcceptance(family.acceptance)}`;
    return this.familyId() === null ? 'None set for this machine' : 'The family’s';
  });
  protected readonly rotationLabels = ROTATION_LABELS;
  protected readonly chipSeparators = [ENTER, COMMA];
  protected readonly errorMessage = errorMessage;
  protected readonly formatNumber = formatNumber;

  constructor() {
    const controls = this.form.controls;
    controls.rotationSeenFromLeft.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((rotation) => this.rotation.set(rotation));
    controls.planeCount.valueChanges.pipe(takeUntilDestroyed(this.destroyRef)).subscribe((count) => {
      matchPlanesToCount(this.form);
      this.planeCount.set(count);
    });
    controls.familyId.valueChanges.pipe(takeUntilDestroyed(this.destroyRef)).subscribe((id) => {
      this.familyId.set(id);
      this.lockPlaneCount();
    });
    controls.stockWeightsGrams.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((weights) => this.stockWeights.set(weights));
  }

  ngOnInit(): void {
    const id = this.id();
    if (id !== undefined) {
      const recordId = idFromRoute(id);
      if (recordId === null) this.editing.loadError.set('This address names no machine.');
      else this.editing.load(recordId);
      return;
    }
    const customerId = idFromRoute(this.customerId());
    if (customerId !== null) {
      this.customersApi.get(customerId).subscribe({
        next: ({ record }) => {
          if (this.form.controls.customerId.value === null) {
            this.form.controls.customerId.setValue({ id: record.id, name: record.name });
          }
        },
        // The person chooses the customer in the field instead.
        error: () => undefined,
      });
    }
  }

  hasUnsavedInput(): boolean {
    return this.editing.hasUnsavedInput();
  }

  protected warnBeforeUnload(event: BeforeUnloadEvent): void {
    if (this.hasUnsavedInput()) event.preventDefault();
  }

  /** The end the plane at `index` is drawn as seen from, and its rotation from there. */
  protected planeView(index: number): { side: string; rotation: RotationDirection } {
    const side = planeSide(index, this.planeCount());
    return { side, rotation: side === 'left' ? this.rotation() : opposite(this.rotation()) };
  }

  protected seenFromRight(): string {
    return ROTATION_LABELS[opposite(this.rotation())].toLowerCase();
  }

  /**
   * Fills in what the chosen family knows (planes, radii, speed, acceptance), with a way back: what was
   * there before is kept until the snack bar's Undo is gone.
   */
  protected familyChosen(id: number | null): void {
    const family = this.familyOptions().find((option) => option.id === id);
    if (!family) return;
    const before = {
      planeCount: this.form.controls.planeCount.value,
      planes: this.form.controls.planes.controls.map((plane) => plane.getRawValue()),
      operatingSpeedRpm: this.form.controls.operatingSpeedRpm.value,
      acceptance: this.form.controls.acceptance.getRawValue(),
    };
    this.form.controls.planeCount.setValue(family.planeCount);
    family.correctionRadiiMm.forEach((radius, index) =>
      this.form.controls.planes.at(index)?.controls.correctionRadiusMm.setValue(radius),
    );
    this.form.controls.operatingSpeedRpm.setValue(family.nominalSpeedRpm);
    setAcceptance(this.form.controls.acceptance, null, true);
    this.lockPlaneCount();
    this.form.markAsDirty();
    this.snackBar
      .open(`Filled in from ${family.name}: planes, radii, speed and acceptance.`, 'Undo', {
        duration: 10_000,
      })
      .onAction()
      .subscribe(() => {
        this.form.controls.familyId.setValue(null);
        this.form.controls.planeCount.setValue(before.planeCount);
        restorePlanes(this.form, before.planes);
        this.form.controls.operatingSpeedRpm.setValue(before.operatingSpeedRpm);
        this.form.controls.acceptance.setValue(before.acceptance);
      });
  }

  protected addStockWeight(event: MatChipInputEvent): void {
    const text = event.value.trim().replace(/\s*g$/i, '').replace(',', '.');
    if (text === '') return;
    const grams = Number(text);
    const weights = this.form.controls.stockWeightsGrams.value;
    if (!Number.isFinite(grams) || grams <= 0 || grams > RECORD_RULES.maxStockWeightGrams) {
      this.stockWeightError.set(
        `A stock weight is above 0 and at most ${RECORD_RULES.maxStockWeightGrams} g.`,
      );
      return;
    }
    if (weights.length >= RECORD_RULES.maxStockSizes) {
      this.stockWeightError.set(`Keep to ${RECORD_RULES.maxStockSizes} stock sizes.`);
      return;
    }
    this.stockWeightError.set(null);
    event.chipInput.clear();
    if (weights.includes(grams)) return;
    this.form.controls.stockWeightsGrams.setValue([...weights, grams].sort((a, b) => a - b));
    this.form.controls.stockWeightsGrams.markAsDirty();
  }

  protected removeStockWeight(grams: number): void {
    this.form.controls.stockWeightsGrams.setValue(
      this.form.controls.stockWeightsGrams.value.filter((weight) => weight !== grams),
    );
    this.form.controls.stockWeightsGrams.markAsDirty();
  }

  /** A family sets the number of planes (the server requires the machine to match it). */
  private lockPlaneCount(): void {
    if (this.form.controls.familyId.value === null)
      this.form.controls.planeCount.enable({ emitEvent: false });
    else this.form.controls.planeCount.disable({ emitEvent: false });
  }

  private syncSignals(): void {
    const value = this.form.getRawValue();
    this.rotation.set(value.rotationSeenFromLeft);
    this.planeCount.set(value.planeCount);
    this.familyId.set(value.familyId);
    this.stockWeights.set(value.stockWeightsGrams);
    this.lockPlaneCount();
  }
}
