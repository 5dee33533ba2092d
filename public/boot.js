// Lensplane start-up: record where the app is deployed, start the wasm, and
// look after the service worker (offline cache and the update offer).
// Kept as a separate file: the Content-Security-Policy allows no inline script.
import init from './__APP_JS__';

// The remembered theme, before the first paint (the app keeps it in step).
try {
  const theme = localStorage.getItem('lensplane.theme');
  if (theme === 'light' || theme === 'dark') document.documentElement.dataset.theme = theme;
} catch (_) { /* storage unavailable: follow the system */ }

// Escape closes what is open: a settings group, or the update offer.
document.addEventListener('keydown', (event) => {
  if (event.key !== 'Escape') return;
  const open = document.activeElement && document.activeElement.closest('details[open]');
  if (open) { open.open = false; open.querySelector('summary')?.focus(); return; }
  const offer = document.getElementById('update-offer');
  if (offer && !offer.hidden) offer.hidden = true;
});

const root = new URL('./', import.meta.url);
// The router reads this, so the app works at / and under any sub-path.
globalThis.LENSPLANE_ROOT = root.pathname;

// Each lazy destination's chunks (written by the build). A link straight to
// one starts fetching them now, beside the main wasm, instead of after it.
const CHUNKS = __CHUNKS__;
const here = location.pathname.startsWith(root.pathname) ? location.pathname.slice(root.pathname.length) : '';
const lazy = CHUNKS[here.replace(/\/+$/, '')];
if (lazy) {
  // The lazy destinations' styles, with their code (the page links them too, for in-app moves).
  const css = document.createElement('link');
  Object.assign(css, { rel: 'stylesheet', href: document.querySelector('meta[name="lensplane-panels-css"]').content });
  document.head.append(css);
}
for (const file of lazy || []) {
  const link = document.createElement('link');
  // The same request the chunk loader's fetch() makes, so it takes this one.
  Object.assign(link, { rel: 'preload', as: 'fetch', crossOrigin: 'anonymous', href: new URL(file, root).href });
  document.head.append(link);
}

const status = document.getElementById('boot-status');

function offerUpdate(worker) {
  const offer = document.getElementById('update-offer');
  if (!offer) return;
  offer.hidden = false;
  document.documentElement.dataset.updateReady = 'true';
  const accept = document.getElementById('update-accept');
  const later = document.getElementById('update-later');
  accept.onclick = () => {
    globalThis.LENSPLANE_ACCEPTED_UPDATE = true;
    accept.disabled = true;
    worker.postMessage({ type: 'lensplane-activate' });
  };
  later.onclick = () => { offer.hidden = true; };
}

async function startWorker() {
  if (!('serviceWorker' in navigator)) return;
  try {
    const reg = await navigator.serviceWorker.register(new URL('sw.js', root), { scope: root.pathname });
    if (reg.waiting && navigator.serviceWorker.controller) offerUpdate(reg.waiting);
    reg.addEventListener('updatefound', () => {
      const worker = reg.installing;
      if (!worker) return;
      worker.addEventListener('statechange', () => {
        // A worker that installs while another controls the page is an update;
        // the first install of all is not.
        if (worker.state === 'installed' && navigator.serviceWorker.controller) offerUpdate(worker);
      });
    });
    navigator.serviceWorker.addEventListener('controllerchange', () => {
      // Reload only when the user asked for the new version: never mix an old
      // page with new assets behind the user's back.
      if (globalThis.LENSPLANE_ACCEPTED_UPDATE && !globalThis.LENSPLANE_RELOADING) {
        globalThis.LENSPLANE_RELOADING = true;
        location.reload();
      }
    });
    const check = () => { if (navigator.onLine) reg.update().catch(() => {}); };
    document.addEventListener('visibilitychange', () => { if (document.visibilityState === 'visible') check(); });
    setInterval(check, 30 * 60 * 1000);
    globalThis.LENSPLANE_CHECK_UPDATE = check;
  } catch (err) {
    console.warn('Lensplane: offline cache unavailable', err);
  }
}

try {
  await init({ module_or_path: new URL('./__APP_WASM__', import.meta.url) });
  if (status) status.remove();
} catch (err) {
  console.error(err);
  if (status) {
    status.textContent = 'Lensplane could not start in this browser (it needs WebAssembly). Nothing was stored or sent.';
    status.classList.add('boot-failed');
  }
}
// Only once the app runs: on a first visit the worker's download of the whole
// shell would otherwise share a slow connection with the page's own files.
startWorker();
