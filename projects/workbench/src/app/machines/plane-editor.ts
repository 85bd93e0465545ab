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
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import {
  CpCorrectionOverlay,
  type BlockedSector,
  type OverlayPoint,
} from '@counterpoise/ng/correction-overlay';
import { formatDeg, planeName, type RotationDirection, ROTATION_LABELS } from '../records/record-labels';
import { errorMessage } from '../shell/validators';
import { type PlaneGroup, sectorGroup } from './machine-form-model';

/** How many positions a plane gets when "Set first position here" switches it to fixed positions. */
const DEFAULT_POSITION_COUNT = 12;

function isAngle(value: number | null | undefined): value is number {
  return typeof value === 'number' && Number.isFinite(value) && value >= 0 && value < 360;
}

/**
 * One correction plane of a machine: its radius, where weights may go (anywhere, or at equally spaced
 * positions) and the sectors where none can, edited on the end view of the rotor. The technician marks a
 * point on the drawing, by tap or with the drawing's own keyboard crosshair, then sets the first position
 * there or starts and ends a blocked sector there; every number stays editable in its field too.
 */
@Component({
  selector: 'app-plane-editor',
  imports: [
    CpCorrectionOverlay,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  templateUrl: './plane-editor.html',
  styleUrl: './plane-editor.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PlaneEditor implements OnInit {
  /** The plane's fields. */
  readonly group = input.required<PlaneGroup>();
  /** The plane's place, 0 for the left (or only) one. */
  readonly index = input.required<number>();
  /** How many planes the machine has. */
  readonly planeCount = input.required<number>();
  /** How the rotor turns seen from this plane's end. */
  readonly rotation = input.required<RotationDirection>();
  /** The end the plane is seen from: "left" or "right". */
  readonly seenFrom = input.required<string>();

  private readonly host = inject(ElementRef<HTMLElement>);
  private readonly injector = inject(Injector);
  private readonly destroyRef = inject(DestroyRef);

  /** The point marked on the drawing last. */
  protected readonly marked = signal<OverlayPoint | null>(null);
  /** Where the blocked sector being drawn starts, until its end is set. */
  protected readonly sectorStart = signal<number | null>(null);
  /** What the last button did, for screen readers. */
  protected readonly announcement = signal('');
  private readonly value = signal<ReturnType<PlaneGroup['getRawValue']> | null>(null);

  protected readonly name = computed(() => planeName(this.index(), this.planeCount()));
  protected readonly idPrefix = computed(() => `plane-${this.index()}`);
  protected readonly drawingLabel = computed(
    () => `${this.name()}, seen from the ${this.seenFrom()} end: where weights can go`,
  );
  protected readonly rotationLabel = computed(() => ROTATION_LABELS[this.rotation()].toLowerCase());

  protected readonly allowedPositions = computed(() => {
    const positions = this.value()?.positions;
    if (!positions?.fixed) return null;
    const { count, firstDeg } = positions;
    return typeof count === 'number' &&
      Number.isInteger(count) &&
      count >= 2 &&
      count <= 360 &&
      isAngle(firstDeg)
      ? { count, firstDeg }
      : null;
  });

  protected readonly blockedSectors = computed<BlockedSector[]>(() =>
    (this.value()?.blockedSectors ?? [])
      .filter((sector) => isAngle(sector.fromDeg) && isAngle(sector.toDeg))
      .map((sector) => ({
        fromDeg: sector.fromDeg!,
        toDeg: sector.toDeg!,
        label: sector.label.trim() || 'blocked',
      })),
  );

  protected readonly errorMessage = errorMessage;
  protected readonly formatDeg = formatDeg;

  ngOnInit(): void {
    const group = this.group();
    this.value.set(group.getRawValue());
    group.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(() => this.value.set(group.getRawValue()));
  }

  /** Puts the first of the equally spaced positions at the marked point (switching to fixed positions). */
  protected setFirstPosition(): void {
    const point = this.marked();
    if (!point) return;
    const positions = this.group().controls.positions;
    positions.controls.fixed.setValue(true);
    positions.controls.firstDeg.setValue(point.angleDeg);
    if (positions.controls.count.value === null) positions.controls.count.setValue(DEFAULT_POSITION_COUNT);
    positions.markAsDirty();
    this.announcement.set(
      `First position set at ${formatDeg(point.angleDeg)}; ${positions.controls.count.value} positions in all.`,
    );
  }

  /** Starts a blocked sector at the marked point; its end comes from the next point marked. */
  protected startSector(): void {
    const point = this.marked();
    if (!point) return;
    this.sectorStart.set(point.angleDeg);
    this.announcement.set(
      `The sector starts at ${formatDeg(point.angleDeg)}. Mark where it ends, then press End the sector here.`,
    );
  }

  /** Ends the blocked sector being drawn at the marked point, and asks what blocks it. */
  protected endSector(): void {
    const point = this.marked();
    const start = this.sectorStart();
    if (!point || start === null) return;
    const sectors = this.group().controls.blockedSectors;
    sectors.push(sectorGroup({ fromDeg: start, toDeg: point.angleDeg }));
    sectors.markAsDirty();
    this.sectorStart.set(null);
    this.announcement.set(
      `Blocked sector from ${formatDeg(start)} to ${formatDeg(point.angleDeg)} added. Say what blocks it.`,
    );
    this.focus(`#${this.idPrefix()}-sector-${sectors.length - 1}-label`);
  }

  protected cancelSector(): void {
    this.sectorStart.set(null);
    this.announcement.set('The sector was not added.');
  }

  protected addSectorByNumbers(): void {
    const sectors = this.group().controls.blockedSectors;
    sectors.push(sectorGroup());
    sectors.markAsDirty();
    this.focus(`#${this.idPrefix()}-sector-${sectors.length - 1}-from`);
  }

  protected removeSector(index: number): void {
    const sectors = this.group().controls.blockedSectors;
    sectors.removeAt(index);
    sectors.markAsDirty();
    this.announcement.set('Blocked sector removed.');
    this.focus(`#${this.idPrefix()}-add-sector`);
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
