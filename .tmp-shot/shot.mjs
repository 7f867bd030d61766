import { chromium } from 'playwright';
const b = await chromium.launch({ executablePath: '/usr/bin/chromium' });
for (const [name, w] of [['full', 1440], ['compact', 390], ['full', 390]]) {
  const p = await b.newPage({ viewport: { width: w, height: 900 } });
  await p.goto(`file:///tmp/units-shot/s6-${name}.html`);
  await p.screenshot({ path: `/tmp/units-shot/${name}-${w}.png`, fullPage: true });
}
await b.close();
