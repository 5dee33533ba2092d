// Invented history entries in Lensplane's stored layout (schema 2), for the
// browser tests and the benchmark. No patient identifiers: labels are rooms
// and benches. The figures are placeholders for listing and filtering, not
// clinical check values.

const PANELS = ['vertex', 'equivalent', 'near'];

const fmt = (d) => (d === 0 ? 'plano' : (d > 0 ? '+' : '') + d.toFixed(2));

/** `n` entries `step` ms apart (one minute by default) from `start` (ms, UTC). */
export function makeEntries(n, start = Date.UTC(2024, 4, 3, 8, 0), step = 60000) {
  const out = [];
  for (let i = 0; i < n; i++) {
    const sph = -0.25 * (i % 40);
    const cyl = -0.25 * (i % 9);
    const axis = (i * 5) % 180 || 180;
    const input = cyl === 0 ? `${fmt(sph)} DS` : `${fmt(sph)} ${fmt(cyl)} ×${axis}`;
    const p = PANELS[i % 3];
    const eyes = [{ s: 'R', i: input, r: input, o: input }];
    if (i % 2 === 0) eyes.push({ s: 'L', i: input, r: input });
    const e = { id: `seed-${i}`, t: start + i * step, p, q: `r=${encodeURIComponent(input)}`, e: eyes };
    if (i % 4 !== 3) e.l = `Room ${i % 7}`;
    out.push(e);
  }
  return out;
}

/** The localStorage keys and texts that hold `entries` (oldest first). */
export function storedLayout(entries) {
  const months = new Map();
  for (const e of entries) {
    const d = new Date(e.t);
    const m = `${d.getUTCFullYear()}-${String(d.getUTCMonth() + 1).padStart(2, '0')}`;
    if (!months.has(m)) months.set(m, []);
    months.get(m).push(e);
  }
  const items = {};
  const chunks = [];
  let n = 0;
  for (const [m, list] of [...months].sort()) {
    const key = `lensplane.history.2.${n++}`;
    items[key] = JSON.stringify(list);
    chunks.push([m, key]);
  }
  items['lensplane.history'] = JSON.stringify({ schema: 2, next: n, chunks });
  return items;
}

/** Writes `items` into the page origin's localStorage (run with page.evaluate). */
export function writeItems(items) {
  for (const [k, v] of Object.entries(items)) localStorage.setItem(k, v);
}
