import type { Routes } from '@angular/router';

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
    path: '**',
    title: 'Page not found · Counterpoise',
    loadComponent: () => import('./shell/not-found-page').then((m) => m.NotFoundPage),
  },
];
