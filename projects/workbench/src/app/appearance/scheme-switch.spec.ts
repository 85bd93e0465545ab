import { LiveAnnouncer } from '@angular/cdk/a11y';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { COLOR_SCHEME_ATTRIBUTE, COLOR_SCHEME_STORAGE_KEY } from './color-scheme';
import { SchemeSwitch } from './scheme-switch';

describe('SchemeSwitch', () => {
  let announced: string[];

  beforeEach(() => {
    localStorage.clear();
    announced = [];
    TestBed.configureTestingModule({
      providers: [
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
        {
          provide: LiveAnnouncer,
          useValue: { announce: (message: string) => Promise.resolve(void announced.push(message)) },
        },
      ],
    });
  });

  afterEach(() => {
    localStorage.clear();
    document.documentElement.removeAttribute(COLOR_SCHEME_ATTRIBUTE);
  });

  async function render() {
    const fixture = TestBed.createComponent(SchemeSwitch);
    await fixture.whenStable();
    return { fixture, menu: await TestbedHarnessEnvironment.loader(fixture).getHarness(MatMenuHarness) };
  }

  it('names the scheme in use on its button and offers the four as radio items, one checked', async () => {
    const { menu } = await render();
    expect(await (await menu.host()).getAttribute('aria-label')).toBe('Colour scheme: As the device');
    await menu.open();
    const items = await menu.getItems();
    expect(await Promise.all(items.map((item) => item.getText()))).toEqual([
      'As the device',
      'Light',
      'Dark',
      'High contrast',
    ]);
    const hosts = await Promise.all(items.map((item) => item.host()));
    expect(await Promise.all(hosts.map((host) => host.getAttribute('role')))).toEqual(
      Array(4).fill('menuitemradio'),
    );
    expect(await Promise.all(hosts.map((host) => host.getAttribute('aria-checked')))).toEqual([
      'true',
      'false',
      'false',
      'false',
    ]);
  });

  it('switches to high contrast, says so, and checks that item next time', async () => {
    const { menu } = await render();
    await menu.clickItem({ text: 'High contrast' });
    expect(document.documentElement.getAttribute(COLOR_SCHEME_ATTRIBUTE)).toBe('high-contrast');
    expect(localStorage.getItem(COLOR_SCHEME_STORAGE_KEY)).toBe('high-contrast');
    expect(announced).toEqual(['Colour scheme: High contrast']);
    expect(await (await menu.host()).getAttribute('aria-label')).toBe('Colour scheme: High contrast');

    await menu.open();
    const checked = [];
    for (const item of await menu.getItems()) {
      if ((await (await item.host()).getAttribute('aria-checked')) === 'true')
        checked.push(await item.getText());
    }
    expect(checked).toEqual(['High contrast']);
  });
});
