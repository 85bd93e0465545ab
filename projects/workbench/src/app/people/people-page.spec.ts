import { BreakpointObserver, type BreakpointState } from '@angular/cdk/layout';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { MatRadioGroupHarness } from '@angular/material/radio/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSnackBarHarness } from '@angular/material/snack-bar/testing';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { provideRouter } from '@angular/router';
import type { Role } from '@counterpoise/api';
import { BehaviorSubject, map } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { People } from '../auth/api-types';
import { AuthSession } from '../auth/auth-session';
import { aSession, aUser } from '../auth/testing';
import { PeoplePage } from './people-page';
import { PEOPLE_URLS } from './people.api';
import { renderAnswered, settle } from '../shell/testing';

const PEOPLE: People = {
  people: [
    aUser('technician'),
    aUser('owner'),
    aUser('viewer', { status: 'deactivated' }),
    aUser('manager'),
    aUser('developer'),
  ],
  invitations: [
    {
      id: 7,
      email: 'kaito@example.com',
      role: 'technician',
      invitedBy: 'Marit Okafor',
      expiresAt: '2099-01-01T00:00:00.000Z',
      acceptedAt: null,
    },
    {
      id: 8,
      email: 'lena@example.com',
      role: 'viewer',
      invitedBy: 'Dario Lindqvist',
      expiresAt: '2020-01-01T00:00:00.000Z',
      acceptedAt: null,
    },
    {
      id: 9,
      email: 'suvi@example.com',
      role: 'technician',
      invitedBy: 'Marit Okafor',
      expiresAt: '2026-04-01T00:00:00.000Z',
      acceptedAt: '2026-03-02T08:00:00.000Z',
    },
  ],
};

// Menus, dialogs and selects take jsdom seconds to open; the default of five per test is too tight.
describe('PeoplePage', { timeout: 20_000 }, () => {
  let http: HttpTestingController;
  const wide = new BehaviorSubject(true);

  beforeEach(() => {
    wide.next(true);
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        // Dialogs then close at once instead of waiting for the end of an animation.
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
        {
          provide: BreakpointObserver,
          useValue: {
            observe: () => wide.pipe(map((matches): BreakpointState => ({ matches, breakpoints: {} }))),
          },
        },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  async function render(role: Role = 'owner', people: People = PEOPLE) {
    TestBed.inject(AuthSession).start(aSession(role));
    return renderAnswered(PeoplePage, http, PEOPLE_URLS.list, people);
  }

  async function names(loader: HarnessLoader): Promise<string[]> {
    const table = await loader.getHarness(MatTableHarness.with({ selector: '.people' }));
    return (await table.getCellTextByColumnName())['name']?.text ?? [];
  }

  async function openActions(loader: HarnessLoader, name: string) {
    const trigger = await loader.getHarness(
      MatMenuHarness.with({ selector: `[aria-label="Actions for ${name}"]` }),
    );
    await trigger.open();
    return trigger;
  }

  it('says it is fetching, then lists everyone by name with e-mail, role and status', async () => {
    TestBed.inject(AuthSession).start(aSession('owner'));
    const fixture = TestBed.createComponent(PeoplePage);
    fixture.detectChanges();
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('Fetching the people');
    http.expectOne(PEOPLE_URLS.list).flush(PEOPLE);
    await fixture.whenStable();

    const table = await TestbedHarnessEnvironment.loader(fixture).getHarness(
      MatTableHarness.with({ selector: '.people' }),
    );
    const rows = await table.getRows();
    expect(await rows[0]?.getCellTextByColumnName()).toEqual({
      name: 'Bram Oyelaran',
      email: 'bram@example.com',
      role: 'Developer',
      status: 'Active',
      // The actions button shows an icon only (its name is its aria-label).
      actions: '',
    });
    expect(await names(TestbedHarnessEnvironment.loader(fixture))).toEqual([
      'Bram Oyelaran',
      'Dario Lindqvist',
      'Ines Kowalczyk',
      'Marit OkaforYou',
      'Suvi Achterberg',
    ]);
  });

  it('sorts by role, from the most powerful, and back', async () => {
    const { loader } = await render();
    const sort = await loader.getHarness(MatSortHarness);
    const [roleHeader] = await sort.getSortHeaders({ label: 'Role' });
    await roleHeader?.click();
    expect(await names(loader)).toEqual([
      'Marit OkaforYou',
      'Dario Lindqvist',
      'Suvi Achterberg',
      'Bram Oyelaran',
      'Ines Kowalczyk',
    ]);
    await roleHeader?.click();
    expect((await names(loader))[0]).toBe('Ines Kowalczyk');
  });

  it('filters by any of the columns and says how many match', async () => {
    const { loader, element, fixture } = await render();
    const filter = await loader.getHarness(MatInputHarness.with({ selector: '[type=search]' }));
    await filter.setValue('deactiv');
    expect(await names(loader)).toEqual(['Ines Kowalczyk']);
    expect(element.querySelector('.count')?.textContent).toContain('1 of 5 people match.');

    await filter.setValue('nobody-here');
    await fixture.whenStable();
    expect(element.querySelector('.empty')?.textContent).toContain('No one matches “nobody-here”.');
  });

  it('lists the invitations still waiting for an answer, and says which have expired', async () => {
    const { loader } = await render();
    const table = await loader.getHarness(MatTableHarness.with({ selector: '.invitations' }));
    const cells = await table.getCellTextByColumnName();
    expect(cells['email']?.text).toEqual(['kaito@example.com', 'lena@example.com']);
    expect(cells['invitedBy']?.text).toEqual(['Marit Okafor', 'Dario Lindqvist']);
    expect(cells['expiresAt']?.text[1]).toBe('Expired');
  });

  it('lets an owner invite with any role, and lists the invitation once sent', async () => {
    const { loader, overlays, fixture } = await render('owner');
    await (await loader.getHarness(MatButtonHarness.with({ text: /Invite someone/ }))).click();
    const dialog = await overlays.getHarness(MatDialogHarness);
    const role = await dialog.getHarness(MatSelectHarness);
    expect(await role.getValueText()).toBe('Technician');
    await role.open();
    expect((await role.getOptions()).length).toBe(5);
    await role.clickOptions({ text: 'Manager' });

    await (
      await dialog.getHarness(MatInputHarness.with({ selector: '[type=email]' }))
    ).setValue('kaito@example.com');
    await (
      await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName=name]' }))
    ).setValue('Kaito Brandt');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Send the invitation' }))).click();

    const request = http.expectOne(PEOPLE_URLS.invitations);
    expect(request.request.body).toEqual({
      email: 'kaito@example.com',
      role: 'manager',
      name: 'Kaito Brandt',
    });
    request.flush(PEOPLE.invitations[0] ?? null, { status: 201, statusText: 'Created' });
    await settle(fixture);

    http.expectOne(PEOPLE_URLS.list).flush(PEOPLE);
    expect(await overlays.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
  });

  it('says so when the invitation is saved but its e-mail could not be sent', async () => {
    const { loader, overlays, fixture } = await render('owner');
    await (await loader.getHarness(MatButtonHarness.with({ text: /Invite someone/ }))).click();
    const dialog = await overlays.getHarness(MatDialogHarness);
    await (
      await dialog.getHarness(MatInputHarness.with({ selector: '[type=email]' }))
    ).setValue('kaito@example.com');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Send the invitation' }))).click();
    http.expectOne(PEOPLE_URLS.invitations).flush(
      {
        type: 'about:blank',
        title: 'Bad Gateway',
        status: 502,
        code: 'MAIL_NOT_SENT',
        detail: 'The invitation is saved, but the mail server did not take its e-mail.',
      },
      { status: 502, statusText: 'Bad Gateway' },
    );
    await settle(fixture);
    http.expectOne(PEOPLE_URLS.list).flush(PEOPLE);
    const snackBar = await overlays.getHarness(MatSnackBarHarness);
    expect(await snackBar.getMessage()).toContain(
      'The invitation to kaito@example.com is saved, but its e-mail was not sent.',
    );
  });

  it('offers a manager only the roles a manager may give', async () => {
    const { loader, overlays } = await render('manager');
    await (await loader.getHarness(MatButtonHarness.with({ text: /Invite someone/ }))).click();
    const role = await (await overlays.getHarness(MatDialogHarness)).getHarness(MatSelectHarness);
    await role.open();
    const options = await Promise.all((await role.getOptions()).map((option) => option.getText()));
    expect(options).toEqual(['Technician', 'Viewer']);
  });

  it('keeps the invitation open with the server’s message on the address it refused', async () => {
    const { loader, overlays, fixture } = await render('owner');
    await (await loader.getHarness(MatButtonHarness.with({ text: /Invite someone/ }))).click();
    const dialog = await overlays.getHarness(MatDialogHarness);
    const email = await dialog.getHarness(MatInputHarness.with({ selector: '[type=email]' }));
    await email.setValue('suvi@example.com');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Send the invitation' }))).click();
    http.expectOne(PEOPLE_URLS.invitations).flush(
      {
        type: 'about:blank',
        title: 'Conflict',
        status: 409,
        errors: [
          { path: 'email', message: 'Someone in your organisation already signs in with this address.' },
        ],
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    const [emailField] = await dialog.getAllHarnesses(MatFormFieldHarness);
    expect(await emailField?.getTextErrors()).toEqual([
      'Someone in your organisation already signs in with this address.',
    ]);
    expect(await email.getValue()).toBe('suvi@example.com');
  });

  it('lets an owner give someone another role', async () => {
    const { loader, overlays, fixture } = await render('owner');
    const menu = await openActions(loader, 'Suvi Achterberg');
    await menu.clickItem({ text: /Change role/ });
    const dialog = await overlays.getHarness(MatDialogHarness);
    const roles = await dialog.getHarness(MatRadioGroupHarness);
    expect(await roles.getCheckedValue()).toBe('technician');
    await roles.checkRadioButton({ label: /Manager/ });
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Make manager' }))).click();

    const request = http.expectOne(PEOPLE_URLS.person(3));
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ role: 'manager' });
    request.flush(aUser('technician', { role: 'manager' }));
    await settle(fixture);
    http.expectOne(PEOPLE_URLS.list).flush(PEOPLE);
  });

  it('deactivates someone only once the owner confirms', async () => {
    const { loader, overlays, fixture } = await render('owner');
    let menu = await openActions(loader, 'Suvi Achterberg');
    await menu.clickItem({ text: /Deactivate/ });
    let dialog = await overlays.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Deactivate Suvi Achterberg?');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Cancel' }))).click();
    await settle(fixture);
    http.expectNone(PEOPLE_URLS.person(3));

    menu = await openActions(loader, 'Suvi Achterberg');
    await menu.clickItem({ text: /Deactivate/ });
    dialog = await overlays.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Deactivate' }))).click();
    await settle(fixture);
    const request = http.expectOne(PEOPLE_URLS.person(3));
    expect(request.request.body).toEqual({ status: 'deactivated' });
    request.flush(aUser('technician', { status: 'deactivated' }));
    await settle(fixture);
    http.expectOne(PEOPLE_URLS.list).flush(PEOPLE);
    await settle(fixture);
    // The menu item that asked is gone: the focus goes back to the person's actions button.
    expect(document.activeElement?.id).toBe('actions-3');
  });

  it('offers reactivation for a deactivated person', async () => {
    const { loader } = await render('owner');
    const menu = await openActions(loader, 'Ines Kowalczyk');
    expect(await Promise.all((await menu.getItems()).map((item) => item.getText()))).toEqual([
      'Change role…',
      'Reactivate…',
    ]);
  });

  it('lets a manager change the status of technicians and viewers only, and no one’s role', async () => {
    const { loader } = await render('manager');
    const technician = await openActions(loader, 'Suvi Achterberg');
    expect(await Promise.all((await technician.getItems()).map((item) => item.getText()))).toEqual([
      'Deactivate…',
    ]);
    await technician.close();
    expect(
      await loader.getAllHarnesses(
        MatMenuHarness.with({ selector: '[aria-label="Actions for Bram Oyelaran"]' }),
      ),
    ).toHaveLength(0);
    expect(
      await loader.getAllHarnesses(
        MatMenuHarness.with({ selector: '[aria-label="Actions for Marit Okafor"]' }),
      ),
    ).toHaveLength(0);
  });

  it('offers no actions on one’s own row, and no invitations to a role that cannot invite', async () => {
    const { loader } = await render('owner');
    expect(
      await loader.getAllHarnesses(
        MatMenuHarness.with({ selector: '[aria-label="Actions for Marit Okafor"]' }),
      ),
    ).toHaveLength(0);

    TestBed.inject(AuthSession).start(aSession('developer'));
    const fixture = TestBed.createComponent(PeoplePage);
    fixture.detectChanges();
    http.expectOne(PEOPLE_URLS.list).flush(PEOPLE);
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).textContent).not.toContain('Invite someone');
  });

  it('fits a phone: e-mail and status move under the name', async () => {
    wide.next(false);
    const { loader } = await render('owner');
    const table = await loader.getHarness(MatTableHarness.with({ selector: '.people' }));
    expect(await (await table.getHeaderRows())[0]?.getCellTextByIndex()).toEqual(['Name', 'Role', 'Actions']);
    expect((await names(loader))[2]).toBe('Ines Kowalczykines@example.comDeactivated');
  });

  it('says when the list cannot be fetched, and asks again on request', async () => {
    TestBed.inject(AuthSession).start(aSession('owner'));
    const fixture = TestBed.createComponent(PeoplePage);
    fixture.detectChanges();
    http.expectOne(PEOPLE_URLS.list).error(new ProgressEvent('error'));
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;
    expect(element.querySelector('[role=alert]')?.textContent).toContain('The server cannot be reached');
    [...element.querySelectorAll('button')]
      .find((button) => button.textContent?.includes('Try again'))
      ?.click();
    fixture.detectChanges();
    http.expectOne(PEOPLE_URLS.list).flush(PEOPLE);
  });
});
