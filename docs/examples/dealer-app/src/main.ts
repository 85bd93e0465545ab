import { bootstrapApplication } from '@angular/platform-browser';
import { appConfig } from './app/app.config';
import { ServiceVisitPage } from './app/service-visit-page';

bootstrapApplication(ServiceVisitPage, appConfig).catch((error: unknown) => console.error(error));
