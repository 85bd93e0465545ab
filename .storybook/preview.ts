import '@fontsource/roboto/400.css';
import '@fontsource/roboto/500.css';
import '@fontsource/roboto/700.css';
import './preview.scss';
import type { Preview } from '@storybook/angular-vite';

/** Settings shared by every story of the widget library. */
const preview: Preview = {
  // The portal's colour scheme: the widgets take every colour from the theme's system tokens, so a dark
  // portal gets dark widgets. A story can set it with `globals: { scheme: 'dark' }`.
  globalTypes: {
    scheme: {
      description: 'Colour scheme of the portal',
      toolbar: {
        title: 'Scheme',
        icon: 'contrast',
        items: [
          { value: 'light', title: 'Light' },
          { value: 'dark', title: 'Dark' },
        ],
        dynamicTitle: true,
      },
    },
  },
  initialGlobals: { scheme: 'light' },
  decorators: [
    (story, context) => {
      document.documentElement.dataset['scheme'] = context.globals['scheme'] === 'dark' ? 'dark' : 'light';
      return story();
    },
  ],
  parameters: {
    layout: 'padded',
    controls: { expanded: true },
    // axe runs on every story; a violation fails the story's test, in `npm test` as in the UI.
    a11y: { test: 'error' },
    viewport: {
      options: {
        phone: { name: 'Phone (390 x 844)', styles: { width: '390px', height: '844px' }, type: 'mobile' },
        tablet: { name: 'Tablet (1024 x 768)', styles: { width: '1024px', height: '768px' }, type: 'tablet' },
      },
    },
  },
};

export default preview;
