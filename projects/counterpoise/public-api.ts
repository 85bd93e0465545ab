/*
 * Public API of the primary entry point, `@counterpoise/ng`.
 *
 * Each widget has its own secondary entry point (`@counterpoise/ng/core`, ...), so that a page that uses
 * one widget pays for that widget alone. The primary entry carries only the package version.
 */
export { VERSION } from './version';
