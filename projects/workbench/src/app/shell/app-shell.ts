import { BreakpointObserver } from '@angular/cdk/layout';
import { ChangeDetectionStrategy, Component, inject, signal, viewChild } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSidenav, MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { RouterLink, RouterOutlet } from '@angular/router';
import { map } from 'rxjs';
import { SchemeSwitch } from '../appearance/scheme-switch';
import { ConnectionStatus } from '../offline/connection-status';
import { MainNavigation } from './main-navigation';
import { UserMenu } from './user-menu';

/** Below this width the navigation slides over the page instead of sitting beside it. */
const WIDE_LAYOUT = '(min-width: 840px)';

/**
 * The frame of every page: a toolbar, the navigation (beside the page on tablets and laptops, a drawer on
 * phones) and a skip link so that keyboard users reach the page without tabbing through the menu. The
 * navigation lists only what the signed-in person's role opens; the toolbar ends with their account menu.
 */
@Component({
  selector: 'app-shell',
  imports: [
    ConnectionStatus,
    MainNavigation,
    MatButtonModule,
    MatIconModule,
    MatSidenavModule,
    MatToolbarModule,
    RouterLink,
    RouterOutlet,
    SchemeSwitch,
    UserMenu,
  ],
  templateUrl: './app-shell.html',
  styleUrl: './app-shell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AppShell {
  protected readonly wide = toSignal(
    inject(BreakpointObserver)
      .observe(WIDE_LAYOUT)
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );
  /** Whether the drawer was opened on a phone: its list is drawn from then on. */
  protected readonly drawerAsked = signal(false);
  private readonly sidenav = viewChild.required(MatSidenav);

  /** On a phone, the drawer closes once a page is chosen. */
  protected closeIfNarrow(): void {
    if (!this.wide()) void this.sidenav().close();
  }

  protected focusMain(event: Event, main: HTMLElement): void {
    event.preventDefault();
    main.focus();
  }
}
