// The default theme of VitePress with our colours (contrast of at least 4.5:1 for text and buttons, light
// and dark) and a home page layout whose content is the page's main landmark.
import type { Theme } from 'vitepress';
import DefaultTheme from 'vitepress/theme';
import HomeDoors from './HomeDoors.vue';
import './counterpoise.css';

export default {
  extends: DefaultTheme,
  enhanceApp({ app }) {
    app.component('home-doors', HomeDoors);
  },
} satisfies Theme;
