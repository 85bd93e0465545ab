import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { beforeEach, describe, expect, it } from 'vitest';
import { AcceptanceFields, acceptanceGroup, acceptanceValue } from './acceptance-fields';

/** A machine's acceptance level, which may take its family's. */
@Component({
  selector: 'app-acceptance-host',
  imports: [AcceptanceFields],
  template: `<app-acceptance-fields
    [group]="group"
    inheritLabel="The family’s: Balance grade G16 (ISO 21940-11)"
  />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class AcceptanceHost {
  readonly group = acceptanceGroup(null, true);
}

describe('AcceptanceFields', { timeout: 20_000 }, () => {
  beforeEach(() =>
    TestBed.configureTestingModule({
      providers: [{ provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }],
    }),
  );

  async function render() {
    const fixture = TestBed.createComponent(AcceptanceHost);
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const kind = await loader.getHarness(MatSelectHarness.with({ selector: '[formControlName="kind"]' }));
    return { fixture, loader, kind, group: fixture.componentInstance.group };
  }

  it('takes the family’s level until another is chosen', async () => {
    const { kind, group } = await render();
    expect(await kind.getValueText()).toBe('The family’s: Balance grade G16 (ISO 21940-11)');
    expect(acceptanceValue(group)).toBeNull();
    expect(group.valid).toBe(true);
  });

  it('asks a shop target for its amplitude and unit', async () => {
    const { kind, group, loader } = await render();
    await kind.open();
    await kind.clickOptions({ text: 'The shop’s own target' });
    expect(group.valid).toBe(false);
    const amplitude = await loader.getHarness(
      MatFormFieldHarness.with({ floatingLabelText: 'Target amplitude' }),
    );
    await (await amplitude.getControl(MatInputHarness))!.setValue('0.12');
    expect(acceptanceValue(group)).toEqual({ kind: 'shop-target', amplitude: 0.12, unit: 'in/s-pk' });
  });

  it('shows the zones as guidance only, mobile machines being outside their scope', async () => {
    const { kind, group, fixture } = await render();
    await kind.open();
    await kind.clickOptions({ text: /vibration zone/ });
    expect((fixture.nativeElement as HTMLElement).querySelector('.guidance')?.textContent?.trim()).toBe(
      'As guidance: mobile machines are outside the scope of these zones (ISO 10816-3 / 20816-3).',
    );
    expect(acceptanceValue(group)).toEqual({
      kind: 'severity-zone',
      zone: 'B',
      group: 2,
      foundation: 'flexible',
    });
  });
});
