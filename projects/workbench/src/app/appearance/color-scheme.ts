import { DOCUMENT } from '@angular/common';
import { DestroyRef, Injectable, inject, signal } from '@angular/core';
import { Meta } from '@angular/platform-browser';

/**
 * The colour schemes a technician can choose on a device: as the device asks (light, or dark when the
 * device is set to dark), light, dark, or high contrast (black on white with strong outlines, for sunlight).
 */
export type ColorScheme = 'device' | 'light' | 'dark' | 'high-contrast';

/** The schemes in the order the switch offers them. */
export const COLOR_SCHEMES: readonly ColorScheme[] = ['device', 'light', 'dark', 'high-contrast'];

/** What the switch calls each scheme. */
export const COLOR_SCHEME_LABELS: Readonly<Record<ColorScheme, string>> = {
  device: 'As the device',
  light: 'Light',
  dark: 'Dark',
  'high-contrast': 'High contrast',
};

/**
 * Where the choice is kept on the device. `public/color-scheme.js` reads the same key and sets the same
 * attribute before the first paint (the page's content security policy allows no inline script); keep the
 * two in step.
 */
export const COLOR_SCHEME_STORAGE_KEY = 'counterpoise.color-scheme';

/** The attribute of `<html>` that styles.scss reads; absent when the device decides. */
export const COLOR_SCHEME_ATTRIBUTE = 'data-scheme';

function isColorScheme(value: unknown): value is ColorScheme {
  return typeof value === 'string' && (COLOR_SCHEMES as readonly string[]).includes(value);
}

/**
 * The colour scheme of the workbench on this device: the one chosen, kept in localStorage, applied as an
 * attribute of `<html>` and reflected in `<meta name="theme-color">` (the browser's own bar takes the
 * toolbar's colour). A device with no storage (a private window that refuses it) still switches, for the
 * visit.
 */
@Injectable({ providedIn: 'root' })
export class ColorSchemes {
  private readonly document = inject(DOCUMENT);
  private readonly meta = inject(Meta);
  private readonly chosen = signal<ColorScheme>(this.stored());

  /** The scheme chosen on this device; `device` until one is. */
  readonly scheme = this.chosen.asReadonly();

  constructor() {
    this.apply();
    // As the device: the browser's bar follows when the device turns dark or light.
    const darkQuery = this.document.defaultView?.matchMedia?.('(prefers-color-scheme: dark)');
    if (darkQuery) {
      const follow = () => this.reflectThemeColor();
      darkQuery.addEventListener('change', follow);
      inject(DestroyRef).onDestroy(() => darkQuery.removeEventListener('change', follow));
    }
  }

  /** Applies a scheme at once and keeps it on the device. */
  choose(scheme: ColorScheme): void {
    this.chosen.set(scheme);
    try {
      if (scheme === 'device') this.storage()?.removeItem(COLOR_SCHEME_STORAGE_KEY);
      else this.storage()?.setItem(COLOR_SCHEME_STORAGE_KEY, scheme);
    } catch {
      // Storage refused (full, or a private window): the scheme holds until the page is left.
    }
    this.apply();
  }

  private apply(): void {
    const root = this.document.documentElement;
    const scheme = this.chosen();
    if (scheme === 'device') root.removeAttribute(COLOR_SCHEME_ATTRIBUTE);
    else root.setAttribute(COLOR_SCHEME_ATTRIBUTE, scheme);
    this.reflectThemeColor();
  }

  /** The toolbar's colour (the theme's primary) as the page's theme colour. */
  private reflectThemeColor(): void {
    const view = this.document.defaultView;
    const primary = view
      ?.getComputedStyle(this.document.documentElement)
      .getPropertyValue('--mat-sys-primary');
    if (primary?.trim()) this.meta.updateTag({ name: 'theme-color', content: primary.trim() });
  }

  private stored(): ColorScheme {
    try {
      const value = this.storage()?.getItem(COLOR_SCHEME_STORAGE_KEY);
      return isColorScheme(value) ? value : 'device';
    } catch {
      return 'device';
    }
  }

  private storage(): Storage | undefined {
    return this.document.defaultView?.localStorage;
  }
}
