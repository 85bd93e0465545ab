import type { Routes } from '@angular/router';
import { provideCounterpoise } from '@counterpoise/ng/solver';
import { requirePermission, requireSignedOut, requireSignIn } from './auth/auth.guards';
import { SignInPage } from './auth/sign-in-page';
import { confirmLeavingUnsaved } from './records/unsaved-changes';

export const routes: Routes = [
  {
    path: '',
    pathMatch: 'full',
    title: 'Counterpoise',
    loadComponent: () => import('./home/home-page').then((m) => m.HomePage),
  },
  {
    path: 'safety',
    title: 'Safety · Counterpoise',
    loadComponent: () => import('./safety/safety-page').then((m) => m.SafetyPage),
  },
  {
    path: 'widgets',
    title: 'Widgets · Counterpoise',
    // The showcase computes on the device, so it works without a connection or an account.
    providers: [provideCounterpoise({ solver: 'local' })],
    loadComponent: () => import('./widgets/widgets-page').then((m) => m.WidgetsPage),
  },
  {
    path: 'sign-in',
    title: 'Sign in · Counterpoise',
    canActivate: [requireSignedOut],
    // Part of the first load, not a chunk of its own: every new device starts here, and its form then
    // draws without a second round trip for its code (tests/browser/first-load.spec.ts).
    component: SignInPage,
  },
  {
    path: 'forgot-password',
    title: 'Forgotten password · Counterpoise',
    loadComponent: () => import('./auth/forgot-password-page').then((m) => m.ForgotPasswordPage),
  },
  {
    // The path of the link in the reset e-mail.
    path: 'reset-password',
    title: 'New password · Counterpoise',
    loadComponent: () => import('./auth/reset-password-page').then((m) => m.ResetPasswordPage),
  },
  {
    // The path of the link in the invitation e-mail.
    path: 'accept-invitation',
    title: 'Accept the invitation · Counterpoise',
    loadComponent: () => import('./auth/accept-invitation-page').then((m) => m.AcceptInvitationPage),
  },
  {
    path: 'account',
    title: 'Your account · Counterpoise',
    canActivate: [requireSignIn],
    loadComponent: () => import('./auth/account-page').then((m) => m.AccountPage),
  },
  {
    // The changes of jobs kept on this device with no connection (the shell's status links here).
    path: 'offline',
    title: 'Kept on this device · Counterpoise',
    canActivate: [requireSignIn],
    loadComponent: () => import('./offline/offline-page').then((m) => m.OfflinePage),
  },
  {
    path: 'customers',
    canActivate: [requirePermission('records:read')],
    children: [
      {
        path: '',
        title: 'Customers · Counterpoise',
        loadComponent: () => import('./customers/customers-page').then((m) => m.CustomersPage),
      },
      {
        path: 'new',
        title: 'Add a customer · Counterpoise',
        canActivate: [requirePermission('customers:write')],
        canDeactivate: [confirmLeavingUnsaved],
        loadComponent: () => import('./customers/customer-form-page').then((m) => m.CustomerFormPage),
      },
      {
        path: ':id',
        title: 'Customer · Counterpoise',
        loadComponent: () => import('./customers/customer-page').then((m) => m.CustomerPage),
      },
      {
        path: ':id/edit',
        title: 'Edit the customer · Counterpoise',
        canActivate: [requirePermission('customers:write')],
        canDeactivate: [confirmLeavingUnsaved],
        loadComponent: () => import('./customers/customer-form-page').then((m) => m.CustomerFormPage),
      },
    ],
  },
  {
    path: 'machines',
    canActivate: [requirePermission('records:read')],
    children: [
      {
        path: '',
        title: 'Machines · Counterpoise',
        loadComponent: () => import('./machines/machines-page').then((m) => m.MachinesPage),
      },
      {
        path: 'new',
        title: 'Add a machine · Counterpoise',
        canActivate: [requirePermission('machines:write')],
        canDeactivate: [confirmLeavingUnsaved],
        loadComponent: () => import('./machines/machine-form-page').then((m) => m.MachineFormPage),
      },
      {
        path: ':id',
        title: 'Machine · Counterpoise',
        loadComponent: () => import('./machines/machine-page').then((m) => m.MachinePage),
      },
      {
        path: ':id/history',
        title: 'Machine history · Counterpoise',
        canActivate: [requirePermission('jobs:read')],
        loadComponent: () =>
          import('./machine-history/machine-history-page').then((m) => m.MachineHistoryPage),
      },
      {
        path: ':id/edit',
        title: 'Edit the machine · Counterpoise',
        canActivate: [requirePermission('machines:write')],
        canDeactivate: [confirmLeavingUnsaved],
        loadComponent: () => import('./machines/machine-form-page').then((m) => m.MachineFormPage),
      },
    ],
  },
  {
    path: 'machine-families',
    canActivate: [requirePermission('records:read')],
    children: [
      {
        path: '',
        title: 'Machine families · Counterpoise',
        loadComponent: () =>
          import('./machine-families/machine-families-page').then((m) => m.MachineFamiliesPage),
      },
      {
        path: 'new',
        title: 'Add a machine family · Counterpoise',
        canActivate: [requirePermission('families:write')],
        canDeactivate: [confirmLeavingUnsaved],
        loadComponent: () =>
          import('./machine-families/machine-family-form-page').then((m) => m.MachineFamilyFormPage),
      },
      {
        path: ':id',
        title: 'Machine family · Counterpoise',
        loadComponent: () =>
          import('./machine-families/machine-family-page').then((m) => m.MachineFamilyPage),
      },
      {
        path: ':id/edit',
        title: 'Edit the machine family · Counterpoise',
        canActivate: [requirePermission('families:write')],
        canDeactivate: [confirmLeavingUnsaved],
        loadComponent: () =>
          import('./machine-families/machine-family-form-page').then((m) => m.MachineFamilyFormPage),
      },
    ],
  },
  {
    path: 'jobs',
    canActivate: [requirePermission('jobs:read')],
    children: [
      {
        path: '',
        title: 'Jobs · Counterpoise',
        loadComponent: () => import('./jobs/jobs-page').then((m) => m.JobsPage),
      },
      {
        path: ':id',
        title: 'Job · Counterpoise',
        // The correction step's calculator and overlay compute on the device: a job goes on without signal.
        providers: [provideCounterpoise({ solver: 'local' })],
        loadComponent: () => import('./jobs/job-page').then((m) => m.JobPage),
      },
    ],
  },
  {
    path: 'people',
    title: 'People · Counterpoise',
    canActivate: [requirePermission('people:read')],
    loadComponent: () => import('./people/people-page').then((m) => m.PeoplePage),
  },
  {
    path: 'keys',
    title: 'API keys · Counterpoise',
    canActivate: [requirePermission('keys:manage')],
    loadComponent: () => import('./keys/keys-page').then((m) => m.KeysPage),
  },
  {
    path: 'outbox',
    title: 'Outbox · Counterpoise',
    canActivate: [requirePermission('outbox:read')],
    loadComponent: () => import('./outbox/outbox-page').then((m) => m.OutboxPage),
  },
  {
    path: 'not-available',
    title: 'Not available for your role · Counterpoise',
    loadComponent: () => import('./auth/not-available-page').then((m) => m.NotAvailablePage),
  },
  {
    path: '**',
    title: 'Page not found · Counterpoise',
    loadComponent: () => import('./shell/not-found-page').then((m) => m.NotFoundPage),
  },
];
