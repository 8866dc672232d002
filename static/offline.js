// Joulewise offline support, plain JavaScript with no library. `cargo xtask
// dist` copies it into the build (as offline-<hash>.js, or inline in the
// single file).
// - Served from a web server: registers the service worker (sw.js) that
//   keeps the app working with no network. When a new version has been
//   deployed, a notice says so and offers Reload; nothing reloads until the
//   user presses it.
// - Opened from a file (the single-file copy): says that some browsers do
//   not keep saved work for such pages, and that export keeps it safe.
// The notice is built with DOM calls and a constructed style sheet, so the
// page's Content-Security-Policy needs no inline style or script.

const NOTICE_ID = 'jw-notice';

const NOTICE_CSS = `
#jw-notice { position: fixed; left: 0; right: 0; bottom: 0; z-index: 1000; box-sizing: border-box;
  display: flex; flex-wrap: wrap; align-items: center; gap: 0.5rem 1rem; padding: 0.75rem 1rem;
  background: #16181d; color: #fbfbf8; border-top: 3px solid #7fb8e6;
  font-family: system-ui, -apple-system, "Segoe UI", Roboto, sans-serif; font-size: 17px; line-height: 1.45; }
#jw-notice p { margin: 0; flex: 1 1 18rem; }
#jw-notice button { font: inherit; min-height: 44px; padding: 0.4rem 1rem; border-radius: 6px; cursor: pointer;
  border: 2px solid #fbfbf8; background: transparent; color: #fbfbf8; }
#jw-notice button.jw-primary { background: #fbfbf8; color: #16181d; font-weight: 600; }
#jw-notice button:focus-visible { outline: 3px solid #7fb8e6; outline-offset: 2px; }
@media print { #jw-notice { display: none; } }
`;

let styled = false;

function addStyles() {
  if (styled) return;
  styled = true;
  try {
    const sheet = new CSSStyleSheet();
    sheet.replaceSync(NOTICE_CSS);
    document.adoptedStyleSheets = [...document.adoptedStyleSheets, sheet];
  } catch {
    // Older browsers: the notice still shows, unstyled, at the end of the page.
  }
}

function hideNotice() {
  document.getElementById(NOTICE_ID)?.remove();
  document.body.style.paddingBottom = '';
}

/** Show one notice (replacing any other): a sentence and buttons [label, action, primary]. */
function showNotice(text, buttons) {
  addStyles();
  hideNotice();
  const box = document.createElement('div');
  box.id = NOTICE_ID;
  box.setAttribute('role', 'status');
  const p = document.createElement('p');
  p.textContent = text;
  box.append(p);
  for (const [label, action, primary] of buttons) {
    const button = document.createElement('button');
    button.type = 'button';
    button.textContent = label;
    if (primary) button.className = 'jw-primary';
    button.addEventListener('click', action);
    box.append(button);
  }
  document.body.append(box);
  // Keep the end of the sheet reachable above the notice.
  document.body.style.paddingBottom = `${box.offsetHeight}px`;
}

async function startServiceWorker() {
  const sw = navigator.serviceWorker;
  let registration;
  try {
    registration = await sw.register('sw.js', { updateViaCache: 'none' });
  } catch (error) {
    console.warn('Joulewise: offline use is not available here:', error);
    return;
  }
  // True once a version of the app controlled this page: a later change of
  // controller is a new version, not the first install.
  let hadController = sw.controller !== null;
  let reloadAsked = false;

  const offer = (worker) => showNotice(
    'A new version of Joulewise is ready. Your work is saved: reload when it suits you.',
    [
      ['Reload now', () => {
        reloadAsked = true;
        if (worker.state === 'activated') location.reload();
        else worker.postMessage('SKIP_WAITING');
      }, true],
      ['Later', hideNotice, false],
    ],
  );

  if (registration.waiting && hadController) offer(registration.waiting);
  registration.addEventListener('updatefound', () => {
    const worker = registration.installing;
    if (!worker) return;
    worker.addEventListener('statechange', () => {
      if (worker.state === 'installed' && sw.controller) offer(worker);
    });
  });
  sw.addEventListener('controllerchange', () => {
    if (reloadAsked) {
      location.reload();
    } else if (hadController) {
      // Another tab took the new version: this one keeps running until the user chooses.
      showNotice('A new version of Joulewise is now in use. Your work is saved: reload when it suits you.', [
        ['Reload now', () => location.reload(), true],
        ['Later', hideNotice, false],
      ]);
    }
    hadController = true;
  });
  // A tablet may keep the app open for days: look for a new version whenever
  // it comes back to the front (the browser also looks on every page load).
  document.addEventListener('visibilitychange', () => {
    if (document.visibilityState === 'visible') registration.update().catch(() => {});
  });
}

if (location.protocol === 'file:') {
  showNotice(
    'Opened from a file. Some browsers do not keep saved work for pages opened from disk: '
      + 'use Export to keep your work safe.',
    [['Got it', hideNotice, true]],
  );
} else if ('serviceWorker' in navigator) {
  // After the page has loaded, so caching the files does not slow the start.
  if (document.readyState === 'complete') startServiceWorker();
  else addEventListener('load', () => startServiceWorker());
}
