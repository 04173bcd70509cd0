// Runs before the first paint (a plain, blocking, same-origin script, so a strict CSP allows it).
// It only mirrors src/app/theme.ts: the key and the two values must stay the same.
(function () {
  var theme = 'daylight';
  try {
    if (window.localStorage.getItem('holdfire.theme') === 'night') theme = 'night';
  } catch (e) {
    // Storage blocked: stay on Daylight.
  }
  document.documentElement.setAttribute('data-theme', theme);
})();
