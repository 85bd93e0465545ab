// The icons the workbench shows, and only those: each an SVG file of the Material Symbols set (outlined,
// weight 400) from the `@material-symbols/svg-400` npm package, inlined at build time as text (the `.svg`
// loader in angular.json) and registered by name with Material's icon registry. A template names one as
// `<mat-icon svgIcon="add" />`; an icon not listed here or in app-icons-later.ts shows nothing and logs an
// error, and tests/source/app-icons.spec.ts finds any name in a template that is missing.
//
// Two lists, so that the first page carries only its own icons: FIRST_LOAD_ICONS below, those of the shell
// (toolbar, navigation, connection status, account menu) and of the sign-in page, part of the app's first
// load; LATER_ICONS (app-icons-later.ts), every other, a chunk of its own that the registry imports the
// first time a page names one of them (tests/browser/first-load.spec.ts holds the first load's budget).
//
// To add an icon: import its file in alphabetical order in app-icons-later.ts and add it to LATER_ICONS;
// here only if the shell or the sign-in page shows it.
import {
  type EnvironmentProviders,
  inject,
  Injectable,
  makeEnvironmentProviders,
  provideEnvironmentInitializer,
} from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { DomSanitizer } from '@angular/platform-browser';
import { from, type Observable, switchMap } from 'rxjs';
import type { LATER_ICONS } from './app-icons-later';
import accountCircleSvg from '@material-symbols/svg-400/outlined/account_circle.svg';
import agricultureSvg from '@material-symbols/svg-400/outlined/agriculture.svg';
import apiSvg from '@material-symbols/svg-400/outlined/api.svg';
import assignmentSvg from '@material-symbols/svg-400/outlined/assignment.svg';
import badgeSvg from '@material-symbols/svg-400/outlined/badge.svg';
import categorySvg from '@material-symbols/svg-400/outlined/category.svg';
import cloudDoneSvg from '@material-symbols/svg-400/outlined/cloud_done.svg';
import cloudOffSvg from '@material-symbols/svg-400/outlined/cloud_off.svg';
import contrastSvg from '@material-symbols/svg-400/outlined/contrast.svg';
import groupSvg from '@material-symbols/svg-400/outlined/group.svg';
import healthAndSafetySvg from '@material-symbols/svg-400/outlined/health_and_safety.svg';
import homeSvg from '@material-symbols/svg-400/outlined/home.svg';
import keySvg from '@material-symbols/svg-400/outlined/key.svg';
import loginSvg from '@material-symbols/svg-400/outlined/login.svg';
import logoutSvg from '@material-symbols/svg-400/outlined/logout.svg';
import menuSvg from '@material-symbols/svg-400/outlined/menu.svg';
import menuBookSvg from '@material-symbols/svg-400/outlined/menu_book.svg';
import outboxSvg from '@material-symbols/svg-400/outlined/outbox.svg';
import pendingSvg from '@material-symbols/svg-400/outlined/pending.svg';
import radioButtonCheckedSvg from '@material-symbols/svg-400/outlined/radio_button_checked.svg';
import radioButtonUncheckedSvg from '@material-symbols/svg-400/outlined/radio_button_unchecked.svg';
import scheduleSvg from '@material-symbols/svg-400/outlined/schedule.svg';
import sendSvg from '@material-symbols/svg-400/outlined/send.svg';
import storefrontSvg from '@material-symbols/svg-400/outlined/storefront.svg';
import syncProblemSvg from '@material-symbols/svg-400/outlined/sync_problem.svg';
import visibilitySvg from '@material-symbols/svg-400/outlined/visibility.svg';
import visibilityOffSvg from '@material-symbols/svg-400/outlined/visibility_off.svg';
import widgetsSvg from '@material-symbols/svg-400/outlined/widgets.svg';
// Our own mark, the same file as the favicon: drawn inline in the toolbar, so it costs the first page no request.
import counterpoiseMarkSvg from '../../../public/favicon.svg';

/** The icons of the app's first page, by the name templates give them. */
export const FIRST_LOAD_ICONS = {
  account_circle: accountCircleSvg,
  agriculture: agricultureSvg,
  api: apiSvg,
  assignment: assignmentSvg,
  badge: badgeSvg,
  category: categorySvg,
  cloud_done: cloudDoneSvg,
  cloud_off: cloudOffSvg,
  contrast: contrastSvg,
  counterpoise_mark: counterpoiseMarkSvg,
  group: groupSvg,
  health_and_safety: healthAndSafetySvg,
  home: homeSvg,
  key: keySvg,
  login: loginSvg,
  logout: logoutSvg,
  menu: menuSvg,
  menu_book: menuBookSvg,
  outbox: outboxSvg,
  pending: pendingSvg,
  radio_button_checked: radioButtonCheckedSvg,
  radio_button_unchecked: radioButtonUncheckedSvg,
  schedule: scheduleSvg,
  send: sendSvg,
  storefront: storefrontSvg,
  sync_problem: syncProblemSvg,
  visibility: visibilitySvg,
  visibility_off: visibilityOffSvg,
  widgets: widgetsSvg,
} as const satisfies Readonly<Record<string, string>>;

/** The name of an icon the workbench has. */
export type AppIconName = keyof typeof FIRST_LOAD_ICONS | keyof typeof LATER_ICONS;

/**
 * Material's icon registry, which imports the later icons (app-icons-later.ts) the first time a template
 * names an icon that the first load did not register, then answers as Material's own. `mat-icon` waits for
 * the answer, so the icon appears once its chunk is in.
 */
@Injectable()
export class AppIconRegistry extends MatIconRegistry {
  private readonly sanitizer = inject(DomSanitizer);
  private readonly registered = new Set<string>();
  private later?: Promise<void>;

  override getNamedSvgIcon(name: string, namespace = ''): Observable<SVGElement> {
    if (namespace !== '' || this.registered.has(name)) return super.getNamedSvgIcon(name, namespace);
    return from(this.registerLaterIcons()).pipe(switchMap(() => super.getNamedSvgIcon(name, namespace)));
  }

  /** Registers icons by name. The SVG text is our own build's, never user input, so it is trusted as HTML. */
  register(icons: Readonly<Record<string, string>>): void {
    for (const [name, svg] of Object.entries(icons)) {
      this.addSvgIconLiteral(name, this.sanitizer.bypassSecurityTrustHtml(svg));
      this.registered.add(name);
    }
  }

  /** Imports LATER_ICONS, once, and registers them. */
  private registerLaterIcons(): Promise<void> {
    this.later ??= import('./app-icons-later').then(({ LATER_ICONS }) => this.register(LATER_ICONS));
    return this.later;
  }
}

/**
 * The workbench's icons in Material's icon registry: the first load's at start, the others when a page
 * first names one. `alsoAtStart` registers more at start: the unit tests pass LATER_ICONS, so that any
 * page they draw has its icons at once.
 */
export function provideAppIcons(alsoAtStart: Readonly<Record<string, string>> = {}): EnvironmentProviders {
  return makeEnvironmentProviders([
    AppIconRegistry,
    { provide: MatIconRegistry, useExisting: AppIconRegistry },
    provideEnvironmentInitializer(() => {
      const registry = inject(AppIconRegistry);
      registry.register(FIRST_LOAD_ICONS);
      registry.register(alsoAtStart);
    }),
  ]);
}
