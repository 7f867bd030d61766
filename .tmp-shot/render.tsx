import React from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { writeFileSync } from 'node:fs';
(globalThis as any).React = React;
import { CageDiagram } from '../src/components/cage/CageDiagram';
import { demoCatalog, sedgeS6, starterLayout } from '../src/lib/domain';
import { checkLayout } from '../src/lib/domain/rules';
const base = starterLayout(sedgeS6, 'corn', demoCatalog);
// Findings on rotor bars: put a wrong-family bar or a discharge bar in the front
const bars = demoCatalog.filter((p) => p.kind === 'rotor-bar');
const wrong = bars.find((p) => p.familyId !== sedgeS6.id)!;
const layout = { ...base, rotorBars: base.rotorBars.map((b, i) => (i % 3 === 0 ? { ...b, partNumber: wrong.partNumber } : b)), elements: base.elements.map((e, i) => (i % 4 === 0 ? { ...e, partNumber: wrong.partNumber } : e)) };
const findings = checkLayout(sedgeS6, demoCatalog, layout);
console.error(findings.length, 'findings', findings.filter(f=>f.places.some(p=>p.kind==='bar')).length, 'on bars');
for (const compact of [false, true]) {
  const svg = renderToStaticMarkup(<CageDiagram family={sedgeS6} layout={layout} catalog={demoCatalog} findings={findings} units="metric" compact={compact} className="block h-auto w-full" />);
  writeFileSync(`/tmp/units-shot/s6-${compact ? 'compact' : 'full'}.html`, `<html><body style="margin:0">${svg}</body></html>`);
}
import { diffLayouts, diffPlaces } from '../src/lib/domain/diff';
{
  const a = starterLayout(sedgeS6, 'wheat', demoCatalog);
  const b = { ...starterLayout(sedgeS6, 'corn', demoCatalog), vaneSetting: 'fast' as const, drum: sedgeS6.drumOptions.at(-1)!.id };
  const places = diffPlaces(diffLayouts(a, b));
  console.error('diff places', places.filter((p) => p.kind === 'setting'));
  for (const [n, l] of [['A', a], ['B', b]] as const) {
    const svg = renderToStaticMarkup(<CageDiagram family={sedgeS6} layout={l} catalog={demoCatalog} findings={checkLayout(sedgeS6, demoCatalog, l)} units="metric" diffPlaces={places} highlightPlaces={places} endView={false} />);
    writeFileSync(`/tmp/units-shot/cmp-${n}.html`, `<html><body style="margin:0;width:900px">${svg}</body></html>`);
  }
}
