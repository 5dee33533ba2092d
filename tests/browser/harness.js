// Shared helpers for the browser tests: a built folder, the app's own server
// on a free loopback port, and Debian's Chromium driven by playwright-core.
import { chromium } from 'playwright-core';
import { after } from 'node:test';
import { spawn, execFileSync } from 'node:child_process';
import { mkdtempSync, existsSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
export const DIST = process.env.LENSPLANE_DIST || path.join(ROOT, 'target', 'browser-dist');
export const TOOL = path.join(ROOT, 'target', 'release', 'lensplane');
export const CHROMIUM = process.env.CHROMIUM || '/usr/bin/chromium';
export const ARTIFACTS = path.join(ROOT, 'tests', 'artifacts');

const CHROMIUM_ARGS = [
  '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
];

export function freePort() {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.unref();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

/** Builds a folder with the app's own build program (used by the update test). */
export function buildInto(out, buildId) {
  execFileSync(TOOL, ['build', '--out', out, '--build-id', buildId], { cwd: ROOT, stdio: 'inherit' });
}

// Every server this file started: a test that fails midway leaves its own
// server running, and a running child would keep the test file's process
// (and so the whole suite) waiting forever after its last test.
const servers = new Set();
// (Only under the test runner: the benchmarks import this file too.)
if (process.env.NODE_TEST_CONTEXT) after(() => Promise.all([...servers].map((s) => s.stop())));

/** Starts `lensplane serve --no-build` on a free port; resolves once it answers. */
export async function startServer({ dir = DIST, port, prefix = '/' } = {}) {
  if (!existsSync(path.join(dir, 'index.html'))) throw new Error(`no build at ${dir}: run tests/run-all.sh`);
  port = port || (await freePort());
  const child = spawn(TOOL, ['serve', '--no-build', '--out', dir, '--port', String(port), '--prefix', prefix], {
    cwd: ROOT, stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise((resolve, reject) => {
    let seen = '';
    child.stdout.on('data', (d) => { seen += d; if (seen.includes('served at')) resolve(); });
    child.on('exit', (code) => reject(new Error(`server exited early (${code})`)));
  });
  const origin = `http://127.0.0.1:${port}`;
  const server = {
    port, origin, url: (p = '') => origin + prefix + p.replace(/^\//, ''),
    stop: () => new Promise((resolve) => {
      servers.delete(server);
      if (child.exitCode !== null || child.signalCode !== null) return resolve();
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
    }),
  };
  servers.add(server);
  return server;
}

export async function launch(options = {}) {
  return chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, ...options });
}

/** A persistent profile (needed for installability checks). */
export async function launchPersistent(options = {}) {
  const dir = mkdtempSync(path.join(tmpdir(), 'lensplane-profile-'));
  return chromium.launchPersistentContext(dir, { executablePath: CHROMIUM, args: CHROMIUM_ARGS, ...options });
}

/** Waits until a service worker controls the page. */
export async function waitForWorkerControl(page) {
  await page.waitForFunction(() => navigator.serviceWorker && navigator.serviceWorker.controller !== null, null, { timeout: 30000 });
}

/** Waits until the wasm app has mounted (the loading note is gone and the nav exists). */
/**
 * A page of a fresh context that has visited `path` on its own server once,
 * with the worker in control, and the server then stopped: the next
 * `page.goto(server.url(…))` is answered by the worker alone.
 */
export async function offlineAfterVisit(browser, path) {
  const server = await startServer();
  const context = await browser.newContext();
  const page = await context.newPage();
  await page.goto(server.url(path));
  await waitForApp(page);
  await waitForWorkerControl(page);
  await server.stop();
  return { server, context, page };
}

export async function waitForApp(page) {
  await page.waitForSelector('nav.destinations a', { timeout: 30000 });
}

export function artifact(name) {
  mkdirSync(ARTIFACTS, { recursive: true });
  return path.join(ARTIFACTS, name);
}

/** Collects console errors and page errors, so a test can assert there were none. */
export function watchErrors(page) {
  const errors = [];
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => { if (m.type() === 'error') errors.push(`console: ${m.text()}`); });
  return errors;
}
