import { ChangeDetectionStrategy, Component, computed, inject, output } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { RouterLink, RouterLinkActive } from '@angular/router';
import { AuthSession } from '../auth/auth-session';
import { visibleNavigation } from './navigation';

/**
 * The list of the shell's navigation: the pages the signed-in person's role opens, the current one marked
 * for screen readers too. A component of its own so that the shell can load it, with Material's list, after
 * the first page is drawn.
 */
@Component({
  selector: 'app-main-navigation',
  imports: [MatIconModule, MatListModule, RouterLink, RouterLinkActive],
  template: `
    <mat-nav-list>
      @for (item of navigation(); track item.link) {
        @if (item.external) {
          <a mat-list-item [href]="item.link" (click)="chosen.emit()">
            <mat-icon matListItemIcon aria-hidden="true" [svgIcon]="item.icon" />
            <span matListItemTitle>{{ item.label }}</span>
          </a>
        } @else {
          <a
            mat-list-item
            [routerLink]="item.link"
            routerLinkActive
            #active="routerLinkActive"
            [routerLinkActiveOptions]="{ exact: item.link === '/' }"
            [activated]="active.isActive"
            [attr.aria-current]="active.isActive ? 'page' : null"
            (click)="chosen.emit()"
          >
            <mat-icon matListItemIcon aria-hidden="true" [svgIcon]="item.icon" />
            <span matListItemTitle>{{ item.label }}</span>
          </a>
        }
      }
    </mat-nav-list>
  `,
  styles: `
    :host {
      display: block;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MainNavigation {
  private readonly session = inject(AuthSession);
  protected readonly navigation = computed(() =>
    visibleNavigation((permission) => this.session.can(permission)),
  );
  /** A page was chosen (the shell closes its drawer on a phone). */
  readonly chosen = output();
}
