import { TestBed } from '@angular/core/testing';
import { Meta } from '@angular/platform-browser';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { COLOR_SCHEME_ATTRIBUTE, COLOR_SCHEME_STORAGE_KEY, ColorSchemes } from './color-scheme';

describe('ColorSchemes', () => {
  const root = document.documentElement;

  beforeEach(() => {
    localStorage.clear();
    root.removeAttribute(COLOR_SCHEME_ATTRIBUTE);
    root.style.removeProperty('--mat-sys-primary');
  });

  afterEach(() => {
    localStorage.clear();
    root.removeAttribute(COLOR_SCHEME_ATTRIBUTE);
    root.style.removeProperty('--mat-sys-primary');
  });

  it('leaves the scheme to the device until one is chosen', () => {
    const schemes = TestBed.inject(ColorSchemes);
    expect(schemes.scheme()).toBe('device');
    expect(root.hasAttribute(COLOR_SCHEME_ATTRIBUTE)).toBe(false);
  });

  it('applies a chosen scheme to the page at once and keeps it on the device', () => {
    const schemes = TestBed.inject(ColorSchemes);
    schemes.choose('high-contrast');
    expect(schemes.scheme()).toBe('high-contrast');
    expect(root.getAttribute(COLOR_SCHEME_ATTRIBUTE)).toBe('high-contrast');
    expect(localStorage.getItem(COLOR_SCHEME_STORAGE_KEY)).toBe('high-contrast');

    schemes.choose('device');
    expect(root.hasAttribute(COLOR_SCHEME_ATTRIBUTE)).toBe(false);
    expect(localStorage.getItem(COLOR_SCHEME_STORAGE_KEY)).toBeNull();
  });

  it('starts with the scheme kept on the device', () => {
    localStorage.setItem(COLOR_SCHEME_STORAGE_KEY, 'dark');
    const schemes = TestBed.inject(ColorSchemes);
    expect(schemes.scheme()).toBe('dark');
    expect(root.getAttribute(COLOR_SCHEME_ATTRIBUTE)).toBe('dark');
  });

  it('ignores a kept value that is no scheme, and lets the device decide', () => {
    localStorage.setItem(COLOR_SCHEME_STORAGE_KEY, 'sepia');
    const schemes = TestBed.inject(ColorSchemes);
    expect(schemes.scheme()).toBe('device');
    expect(root.hasAttribute(COLOR_SCHEME_ATTRIBUTE)).toBe(false);
  });

  it('gives the browser the toolbar’s colour as the theme colour', () => {
    root.style.setProperty('--mat-sys-primary', '#003237');
    const schemes = TestBed.inject(ColorSchemes);
    schemes.choose('high-contrast');
    expect(TestBed.inject(Meta).getTag('name="theme-color"')?.content).toBe('#003237');
  });
});
