// The docs site: VitePress over the Markdown in docs/, served by the server at /docs (the widget
// catalogue, the static Storybook, beside it at /docs/widgets/). `npm run docs:build` (scripts/build-docs.mjs)
// builds both; nothing is fetched from the network at build or run time (the search index is built with
// the site, the fonts ship with the theme).
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type MarkdownIt from 'markdown-it';
import { type DefaultTheme, defineConfig } from 'vitepress';

const docsRoot = fileURLToPath(new URL('..', import.meta.url));

interface Page {
  readonly text: string;
  /** The page's file under docs/, without `.md`. */
  readonly page: string;
}

/**
 * A sidebar group of the pages that exist: the doors are written by several people, and a page not
 * written yet is left out rather than linked to nothing (the build fails on a dead link in a page).
 */
function group(text: string, pages: readonly Page[]): DefaultTheme.SidebarItem {
  // Not collapsible: the theme's collapsible group is a button holding another (axe: nested-interactive).
  return {
    text,
    items: pages
      .filter(({ page }) => existsSync(`${docsRoot}/${page}.md`))
      .map(({ text, page }) => ({ text, link: `/${page}` })),
  };
}

const sidebar: DefaultTheme.SidebarItem[] = [
  group('Start', [
    { text: 'Home', page: 'index' },
    { text: 'Getting started', page: 'getting-started' },
  ]),
  group('Field guide', [
    { text: 'Overview', page: 'field-guide/index' },
    { text: 'Safety first', page: 'field-guide/safety' },
    { text: 'A balancing job, step by step', page: 'field-guide/balancing-job' },
    { text: 'Fitting the weights', page: 'field-guide/fitting-weights' },
    { text: 'The service report', page: 'field-guide/report' },
    { text: 'Working offline', page: 'field-guide/offline' },
    { text: 'Sunlight, dark and gloves', page: 'field-guide/appearance' },
  ]),
  group('Dealer developers', [
    { text: 'Overview', page: 'dealers/index' },
    { text: 'Install the package', page: 'dealers/install' },
    { text: 'Widgets in reactive forms', page: 'dealers/widgets-in-forms' },
    { text: 'Theming', page: 'dealers/theming' },
    { text: 'Testing with harnesses', page: 'dealers/testing' },
    { text: 'A complete example app', page: 'dealers/example-app' },
  ]),
  group('Integrators', [
    { text: 'Overview', page: 'integrators/index' },
    { text: 'Getting a key', page: 'integrators/keys' },
    { text: 'Every route', page: 'integrators/routes' },
    { text: 'Errors', page: 'integrators/errors' },
    { text: 'Rate limits', page: 'integrators/rate-limits' },
    { text: 'Usage', page: 'integrators/usage' },
    { text: 'Batch', page: 'integrators/batch' },
    { text: 'The typed client', page: 'integrators/client' },
    { text: 'Keys in a browser', page: 'integrators/browser-keys' },
  ]),
  group('Methods and figures', [
    { text: 'Balancing methods', page: 'methods' },
    { text: 'Benchmarks', page: 'benchmarks' },
  ]),
  group('Reference', [
    { text: 'Balancing jobs', page: 'jobs' },
    { text: 'Shop records', page: 'records' },
    { text: 'Service reports', page: 'reports' },
    { text: 'Photos', page: 'photos' },
    { text: 'Readings from CSV', page: 'readings-csv' },
    { text: 'Machine history', page: 'machine-history' },
    { text: 'Offline work', page: 'offline' },
    { text: 'Appearance', page: 'appearance' },
    { text: 'The calculation API', page: 'api' },
  ]),
  group('Maintainers', [{ text: 'Contributor guide', page: 'maintainers' }]),
];

/**
 * The contributor guide (DEVELOPERS.md at the repository's root) is included whole in `maintainers.md`;
 * its links are written from the root (`docs/jobs.md`), so on that page they are made relative to docs/.
 * A link to a file of the repository that is not a page (a source file) stays as text in code.
 */
function contributorGuideLinks(md: MarkdownIt): void {
  md.core.ruler.push('contributor-guide-links', (state) => {
    if (state.env?.relativePath !== 'maintainers.md') return;
    for (const token of state.tokens) {
      for (const child of token.children ?? []) {
        if (child.type !== 'link_open') continue;
        const href = child.attrGet('href') ?? '';
        if (href.startsWith('docs/')) child.attrSet('href', `./${href.slice('docs/'.length)}`);
      }
    }
  });
}

export default defineConfig({
  title: 'Counterpoise',
  description: 'Field balancing of rotating equipment: the workbench, the widgets and the calculation API.',
  lang: 'en',
  // The workbench's icon (docs/public/favicon.svg is a copy of projects/workbench/public/favicon.svg).
  head: [['link', { rel: 'icon', type: 'image/svg+xml', href: '/docs/favicon.svg' }]],
  base: '/docs/',
  srcExclude: ['examples/**', 'samples/**', '**/README.md'],
  outDir: process.env.DOCS_OUT_DIR ?? '../dist/docs/',
  cacheDir: fileURLToPath(new URL('../../node_modules/.cache/vitepress', import.meta.url)),
  // The site's data and page hashes in a file of their own, not an inline script in every page: the
  // server's Content-Security-Policy allows only the inline scripts whose hashes the build lists.
  metaChunk: true,
  lastUpdated: false,
  // Addresses of a local server (`http://localhost:4300`) and of the pages beside the site on the same
  // server (the widget catalogue, Swagger UI) are not pages of this site; every other link must resolve.
  ignoreDeadLinks: [/^https?:\/\/localhost[:/]/, /^\/widgets\//, /^\/api\//],
  markdown: { config: contributorGuideLinks },
  themeConfig: {
    search: { provider: 'local' },
    nav: [
      { text: 'Field guide', link: '/field-guide/', activeMatch: '^/field-guide/' },
      { text: 'Dealers', link: '/dealers/', activeMatch: '^/dealers/' },
      { text: 'Integrators', link: '/integrators/', activeMatch: '^/integrators/' },
      { text: 'Methods', link: '/methods' },
      { text: 'Widgets', link: '/widgets/index.html', target: '_self' },
    ].filter(({ link }) => link.startsWith('/widgets/') || existsSync(`${docsRoot}${pageFile(link)}`)),
    sidebar,
    outline: { level: [2, 3] },
    docFooter: { prev: 'Previous page', next: 'Next page' },
    footer: {
      message: 'Counterpoise documentation. Balancing work follows local codes and licensed practice.',
    },
  },
});

/** The Markdown file of a site link (`/dealers/` → `dealers/index.md`). */
function pageFile(link: string): string {
  return link.endsWith('/') ? `${link}index.md` : `${link}.md`;
}
