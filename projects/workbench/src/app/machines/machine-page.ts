import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { CpCorrectionOverlay } from '@counterpoise/ng/correction-overlay';
import { AuthSession } from '../auth/auth-session';
import { BusyButton } from '../forms/busy-button';
import { JobStarter } from '../jobs/start-job-dialog';
import { RecordHistorySection } from '../records/record-history-section';
import { RecordPageHeader } from '../records/record-page-header';
import {
  describeAcceptance,
  formatDeg,
  formatNumber,
  opposite,
  planeName,
  planeSide,
  type RotationDirection,
  ROTATION_LABELS,
  SIDE_LABELS,
} from '../records/record-labels';
import { idFromRoute, recordView } from '../records/record-page';
import { describePlane, MACHINE_FIELDS } from './machine-form-model';
import { type Machine, MachinesApi, type PlaneLayout } from './machines.api';
import { ErrorBanner } from '../forms/error-banner';
import { PhotoGallery } from '../photos/photo-gallery';

/**
 * One machine: whose it is, its family, identity and running figures, its sensors and direction of
 * rotation, each correction plane drawn as seen from its end (with the allowed positions and blocked
 * sectors, and the same in words), stock weights, acceptance and the history of the record.
 */
@Component({
  selector: 'app-machine-page',
  imports: [
    BusyButton,
    ErrorBanner,
    RecordHistorySection,
    RecordPageHeader,
    CpCorrectionOverlay,
    DatePipe,
    MatButtonModule,
    MatIconModule,
    MatProgressSpinnerModule,
    PhotoGallery,
    RouterLink,
  ],
  templateUrl: './machine-page.html',
  styleUrl: './machine-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MachinePage {
  /** The machine's id, from the address. */
  readonly id = input<string>();

  protected readonly view = recordView({
    api: inject(MachinesApi),
    id: () => idFromRoute(this.id()),
    noun: 'machine',
  });
  protected readonly machine = this.view.record;
  protected readonly session = inject(AuthSession);
  protected readonly starter = inject(JobStarter);
  protected readonly fields = MACHINE_FIELDS;
  protected readonly rotations = ROTATION_LABELS;
  protected readonly sides = SIDE_LABELS;
  protected readonly describeAcceptance = describeAcceptance;
  protected readonly describePlane = describePlane;
  protected readonly formatNumber = formatNumber;
  protected readonly formatDeg = formatDeg;
  protected readonly planeName = planeName;
  protected readonly opposite = opposite;

  /** A name for the machine in headings and questions: its serial number, else make and model. */
  protected title(machine: Machine): string {
    const makeModel = [machine.make, machine.model].filter(Boolean).join(' ');
    if (machine.serialNumber)
      return makeModel ? `${makeModel} · ${machine.serialNumber}` : machine.serialNumber;
    return makeModel || `Machine no. ${machine.id}`;
  }

  /** The end a plane is drawn from, and how the rotor turns seen from there. */
  protected planeView(machine: Machine, index: number): { side: string; rotation: RotationDirection } {
    const side = planeSide(index, machine.planes.length);
    return {
      side,
      rotation: side === 'left' ? machine.rotationSeenFromLeft : opposite(machine.rotationSeenFromLeft),
    };
  }

  protected positionsOf(plane: PlaneLayout) {
    return plane.positions ? { count: plane.positions.count, firstDeg: plane.positions.firstDeg } : null;
  }

  protected archiveOrRestore(): void {
    const machine = this.machine();
    if (machine) this.view.archiveOrRestore(this.title(machine), 'Its history stays.');
  }
}
