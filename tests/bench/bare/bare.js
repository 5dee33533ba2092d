// The bare page's whole program: read "sphere cylinder xaxis" from the link,
// move both principal meridians from the spectacle plane (from, mm) to the
// target plane (to, mm) with F / (1 − dF), and print the lens in the same
// notation the app prints (minus cylinder form, two decimals, three-digit axis).
const params = new URLSearchParams(location.search);
const input = document.getElementById('sphere');
const out = document.getElementById('at-cornea');
const message = document.getElementById('message');
const from = Number(params.get('from') ?? 12);
const to = Number(params.get('to') ?? 0);

const vertex = (power, d) => power / (1 - d * power);
const signed = (x) => (x > 0 ? '+' : x < 0 ? '-' : '') + Math.abs(x).toFixed(2);
const axis = (a) => String(a).padStart(3, '0');

function show(text) {
  const m = text.replace(/\u2212/g, '-').trim().match(/^([+-]?\d+(?:[.,]\d+)?)(?:\s+([+-]?\d+(?:[.,]\d+)?)\s*[x×]\s*(\d{1,3}))?$/i);
  if (!m) { message.textContent = 'Type a lens such as -8.00 -2.00 x180.'; return; }
  message.textContent = '';
  const num = (s) => Number(s.replace(',', '.'));
  const sphere = num(m[1]);
  const cyl = m[2] ? num(m[2]) : 0;
  const ax = m[3] ? Number(m[3]) : 180;
  const d = (from - to) / 1000;
  let first = vertex(sphere, d);
  let second = vertex(sphere + cyl, d);
  let a = ax;
  // Minus-cylinder form: the more plus meridian is the sphere.
  if (second > first) { [first, second] = [second, first]; a = ax > 90 ? ax - 90 : ax + 90; }
  const c = Math.round(second * 100) / 100 - Math.round(first * 100) / 100;
  out.textContent = cyl === 0 ? `${signed(first)} DS` : `${signed(first)} ${signed(c)} ×${axis(a)}`;
}

input.value = params.get('r') ?? '';
input.addEventListener('input', () => show(input.value));
show(input.value);

// The same offline story as the app: a worker keeps these files.
if ('serviceWorker' in navigator) navigator.serviceWorker.register('./sw.js').catch(() => {});
