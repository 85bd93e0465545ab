import { ChangeDetectionStrategy, Component } from '@angular/core';
import { CpSafetyNotice } from '@counterpoise/ng/core';

/** The safety cautions of a balancing job in full, grouped by the moment of the job they belong to. */
@Component({
  selector: 'app-safety-page',
  imports: [CpSafetyNotice],
  template: `
    <h1>Safety</h1>
    <p class="lead">
      A rotor at operating speed stores a great deal of energy. These reminders come back on the screens where
      each hazard arises. They do not replace the machine manufacturer's manual, the site's rules, or local
      codes and licensed practice.
    </p>
    <div class="notices">
      <cp-safety-notice heading="Before you touch the rotor" [topics]="['lockout']" />
      <cp-safety-notice heading="Before every run" [topics]="['running', 'weights']" />
      <cp-safety-notice heading="Before you grind or weld" [topics]="['hot-work', 'protection']" />
    </div>
  `,
  styles: `
    h1 {
      font: var(--mat-sys-headline-medium);
      margin: 0 0 12px;
    }
    .lead {
      max-width: 70ch;
      color: var(--mat-sys-on-surface-variant);
    }
    .notices {
      display: grid;
      gap: 16px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SafetyPage {}
