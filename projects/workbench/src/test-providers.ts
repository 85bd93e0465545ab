// Providers every workbench spec gets (angular.json's `providersFile` of the unit tests): the icons that
// the app itself registers at start (app.config.ts), so that components draw them as in the app.
import { provideAppIcons } from './app/icons/app-icons';

export default [provideAppIcons()];
