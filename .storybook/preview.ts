import '@fontsource/roboto/400.css';
import '@fontsource/roboto/500.css';
import '@fontsource/roboto/700.css';
import 'material-symbols/outlined.css';
import './preview.scss';
import type { Preview } from '@storybook/angular-vite';

/** Settings shared by every story of the widget library. */
const preview: Preview = {
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
