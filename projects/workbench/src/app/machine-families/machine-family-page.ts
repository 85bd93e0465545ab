import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { RecordHistorySection } from '../records/record-history-section';
import { RecordPageHeader } from '../records/record-page-header';
import {
  AMPLITUDE_UNIT_LABELS,
  describeAcceptance,
  formatNumber,
  planeName,
  ROTOR_TYPE_LABELS,
  SIDE_LABELS,
} from '../records/record-labels';
import { idFromRoute, recordView } from '../records/record-page';
import { describeEvidence, FAMILY_FIELDS } from './family-form-model';
import { MachineFamiliesApi } from './machine-families.api';
import { ErrorBanner } from '../forms/error-banner';

/**
 * One machine family: its rotor, speed, planes and radii, inspection limits, acceptance level and the
 * sensitivities stored for it (with how many jobs stand behind each and how far apart they were), its
 * machines and the history of the record.
 */
@Component({
  selector: 'app-machine-family-page',
  imports: [
    ErrorBanner,
    RecordHistorySection,
    RecordPageHeader,
    DatePipe,
    MatButtonModule,
    MatIconModule,
    MatProgressSpinnerModule,
    RouterLink,
  ],
  templateUrl: './machine-family-page.html',
  styleUrl: './machine-family-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MachineFamilyPage {
  /** The family's id, from the address. */
  readonly id = input<string>();

  protected readonly view = recordView({
    api: inject(MachineFamiliesApi),
    id: () => idFromRoute(this.id()),
    noun: 'machine family',
  });
  protected readonly family = this.view.record;
  protected readonly fields = FAMILY_FIELDS;
  protected readonly rotorTypes = ROTOR_TYPE_LABELS;
  protected readonly units = AMPLITUDE_UNIT_LABELS;
  protected readonly sides = SIDE_LABELS;
  protected readonly describeAcceptance = describeAcceptance;
  protected readonly formatNumber = formatNumber;
  protected readonly planeName = planeName;
  protected readonly evidence = describeEvidence;

  protected archiveOrRestore(): void {
    const family = this.family();
    if (family) this.view.archiveOrRestore(family.name, 'Its machines keep their layouts.');
  }
}
