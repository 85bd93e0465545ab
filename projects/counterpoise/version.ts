import { Version } from '@angular/core';

/** The version of `@counterpoise/ng` that is loaded in the page. */
export const VERSION = new Version('0.1.0');
