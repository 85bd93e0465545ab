import { LiveAnnouncer } from '@angular/cdk/a11y';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { COLOR_SCHEME_LABELS, COLOR_SCHEMES, type ColorScheme, ColorSchemes } from './color-scheme';

/**
 * The colour scheme switch in the toolbar: a menu of radio items (as the device, light, dark, high
 * contrast). The button's name says the scheme in use, the items say which one is checked, and a change
 * is announced to screen readers.
 */
@Component({
  selector: 'app-scheme-switch',
  imports: [MatButtonModule, MatIconModule, MatMenuModule],
  template: `
    <button
      matIconButton
      class="trigger"
      type="button"
      [matMenuTriggerFor]="menu"
      [attr.aria-label]="triggerLabel()"
    >
      <mat-icon aria-hidden="true" svgIcon="contrast" />
    </button>
    <mat-menu #menu="matMenu" xPosition="before" aria-label="Colour scheme">
      @for (scheme of options; track scheme) {
        <button
          mat-menu-item
          type="button"
          role="menuitemradio"
          [attr.aria-checked]="colorSchemes.scheme() === scheme"
          (click)="choose(scheme)"
        >
          <mat-icon
            aria-hidden="true"
            [svgIcon]="colorSchemes.scheme() === scheme ? 'radio_button_checked' : 'radio_button_unchecked'"
          />
          {{ labels[scheme] }}
        </button>
      }
    </mat-menu>
  `,
  styles: `
    :host {
      display: block;
    }
    /* The global focus outline is the primary colour, which the toolbar is painted in. */
    .trigger:focus-visible {
      outline-color: var(--mat-sys-on-primary);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SchemeSwitch {
  protected readonly colorSchemes = inject(ColorSchemes);
  private readonly announcer = inject(LiveAnnouncer);
  protected readonly options = COLOR_SCHEMES;
  protected readonly labels = COLOR_SCHEME_LABELS;
  protected readonly triggerLabel = computed(
    () => `Colour scheme: ${COLOR_SCHEME_LABELS[this.colorSchemes.scheme()]}`,
  );

  protected choose(scheme: ColorScheme): void {
    this.colorSchemes.choose(scheme);
    void this.announcer.announce(`Colour scheme: ${COLOR_SCHEME_LABELS[scheme]}`);
  }
}
