// The two baselines bench:lighthouse measures the sign-in page against, each the least an app of its kind
// can be, built by the Angular CLI for production and given the same treatment as the workbench (the
// first page's fonts preloaded, brotli and gzip copies), so that the ratios compare code, not transport:
//
// - `bare`: Angular alone, one component with a heading and a paragraph (no router, forms or Material);
// - `floor`: the least a Material sign-in page costs: Angular's router, reactive forms and HttpClient, and
//   Material's form fields, inputs and button on a Material 3 theme in Roboto, as the workbench has them.
import { rmSync } from 'node:fs';
import { join } from 'node:path';
import { compressStatic } from '../../scripts/compress-static.mjs';
import { preloadFirstPageFonts } from '../../scripts/preload-fonts.mjs';
import { buildAngularWorkspace, writeAngularWorkspace } from '../support/angular-workspace';

/** The baselines, by the name the benchmark prints. */
export type BaselineName = 'bare' | 'floor';

/** The paragraph both baselines show, as long as the sign-in page's own (its largest text). */
const LEAD =
  'New here? The owner or a manager of your shop sends you an invitation by e-mail; its link sets up your ' +
  'account.';

const INDEX_HTML = `<!doctype html>
<html lang="en">
  <head>
    <meta charset="utf-8" />
    <title>Sign in</title>
    <base href="/" />
    <meta name="viewport" content="width=device-width, initial-scale=1" />
  </head>
  <body><app-root></app-root></body>
</html>
`;

const BARE_MAIN = `import { ChangeDetectionStrategy, Component } from '@angular/core';
import { bootstrapApplication } from '@angular/platform-browser';

@Component({
  selector: 'app-root',
  template: '<h1>Sign in</h1><p>${LEAD}</p>',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class SignIn {}

bootstrapApplication(SignIn).catch((error: unknown) => console.error(error));
`;

const FLOOR_MAIN = `import { provideHttpClient, withFetch } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { bootstrapApplication } from '@angular/platform-browser';
import { provideRouter, RouterOutlet } from '@angular/router';

@Component({
  selector: 'app-sign-in',
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  template: \`
    <h1>Sign in</h1>
    <p>${LEAD}</p>
    <form [formGroup]="form" (ngSubmit)="form.markAllAsTouched()">
      <mat-form-field appearance="outline">
        <mat-label>E-mail address</mat-label>
        <input matInput type="email" formControlName="email" autocomplete="username" />
        <mat-error>Enter your e-mail address.</mat-error>
      </mat-form-field>
      <mat-form-field appearance="outline">
        <mat-label>Password</mat-label>
        <input matInput type="password" formControlName="password" autocomplete="current-password" />
        <mat-error>Enter your password.</mat-error>
      </mat-form-field>
      <button matButton="filled" type="submit">Sign in</button>
    </form>
  \`,
  styles: 'form { display: grid; gap: 8px; max-width: 420px; } :host { display: block; padding: 16px; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class SignInPage {
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', Validators.required],
    password: ['', Validators.required],
  });
}

@Component({
  selector: 'app-root',
  imports: [RouterOutlet],
  template: '<router-outlet />',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class App {}

bootstrapApplication(App, {
  providers: [provideHttpClient(withFetch()), provideRouter([{ path: '**', component: SignInPage }])],
}).catch((error: unknown) => console.error(error));
`;

const FLOOR_STYLES = `@use '@angular/material' as mat;

html {
  color-scheme: light;
  @include mat.theme((color: (primary: mat.$cyan-palette), typography: Roboto, density: 0));
}

body {
  margin: 0;
  background: var(--mat-sys-surface);
  color: var(--mat-sys-on-surface);
  font: var(--mat-sys-body-medium);
}
`;

/** A built baseline: the folder to serve, and the workspace to remove afterwards. */
export interface BuiltBaseline {
  readonly browserDir: string;
  remove(): void;
}

/** Writes and builds a baseline (about half a minute each), with the workbench's build steps after. */
export async function buildBaseline(root: string, name: BaselineName): Promise<BuiltBaseline> {
  const dir = writeAngularWorkspace(root, {
    project: name,
    files:
      name === 'bare'
        ? { 'src/main.ts': BARE_MAIN, 'src/index.html': INDEX_HTML }
        : { 'src/main.ts': FLOOR_MAIN, 'src/index.html': INDEX_HTML, 'src/styles.scss': FLOOR_STYLES },
    styles:
      name === 'bare'
        ? []
        : [
            'src/styles.scss',
            'node_modules/@fontsource/roboto/latin-400.css',
            'node_modules/@fontsource/roboto/latin-500.css',
          ],
  });
  try {
    buildAngularWorkspace(root, dir, name);
    const browserDir = join(dir, 'dist', 'browser');
    if (name === 'floor') await preloadFirstPageFonts(browserDir);
    await compressStatic(browserDir);
    return { browserDir, remove: () => rmSync(dir, { recursive: true, force: true }) };
  } catch (error) {
    rmSync(dir, { recursive: true, force: true });
    throw error;
  }
}
