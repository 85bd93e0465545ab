/* global document */
// The colour scheme chosen on this device, applied before the page's first paint: index.html loads this
// file in its head, before the styles, because the content security policy allows no inline script.
// The app's ColorSchemes service (src/app/appearance/color-scheme.ts) keeps the choice under the same key
// and sets the same attribute; keep the two in step.
(function () {
  try {
    var scheme = localStorage.getItem('counterpoise.color-scheme');
    if (scheme === 'light' || scheme === 'dark' || scheme === 'high-contrast') {
      document.documentElement.setAttribute('data-scheme', scheme);
    }
  } catch {
    // No storage on this device (a private window that refuses it): the device decides.
  }
})();
