import { chromium } from 'playwright';
const b = await chromium.launch({ executablePath: '/usr/bin/chromium' });
const p = await b.newPage({ viewport: { width: 900, height: 700 } });
await p.goto(`file:///tmp/units-shot/cmp-B.html`);
await p.screenshot({ path: `/tmp/units-shot/cmp-B.png` });
await b.close();
