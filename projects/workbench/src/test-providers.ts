// Providers every workbench spec gets (angular.json's `providersFile` of the unit tests): the icons that
// the app registers (app.config.ts), all of them at start (the app imports the later ones when a page first
// names one), so that components draw them at once.
import { provideAppIcons } from './app/icons/app-icons';
import { LATER_ICONS } from './app/icons/app-icons-later';

export default [provideAppIcons(LATER_ICONS)];
