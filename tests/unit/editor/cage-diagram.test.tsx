import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { CageDiagram } from '~/components/cage/CageDiagram';
import { CageLegend } from '~/components/cage/CageLegend';
import { diagramGeometry } from '~/components/cage/geometry';
import { demoCatalog, sedgeS6, tamarackM4 } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import { allPlaces, placeKey } from '~/lib/domain/places';
import { checkLayout } from '~/lib/domain/rules';
import type { Layout } from '~/lib/domain/schemas';

const ariaOf = (html: string, key: string) => html.match(new RegExp(`data-place="${key}"[^>]*aria-label="([^"]*)"`))?.[1];

describe('cage diagram on the server', () => {
  it('draws every slot of the family with data-place and an accessible name', () => {
    for (const family of [tamarackM4, sedgeS6]) {
      const layout = starterLayout(family, 'wheat', demoCatalog);
      const html = renderToStaticMarkup(<CageDiagram family={family} layout={layout} catalog={demoCatalog} units="metric" />);
      for (const p of allPlaces(family)) expect(ariaOf(html, placeKey(p)), placeKey(p)).toBeTruthy();
      expect(html.match(/data-place="/g)).toHaveLength(allPlaces(family).length);
    }
  });

  it('names the hand, the part and the zone; lengths follow the unit choice', () => {
    const layout = starterLayout(tamarackM4, 'wheat', demoCatalog);
    const metric = renderToStaticMarkup(<CageDiagram family={tamarackM4} layout={layout} catalog={demoCatalog} units="metric" />);
    expect(ariaOf(metric, 'element:1:left')).toBe('Position 1, left: left-hand fine-wire element, CW-FW-L-04');
    expect(ariaOf(metric, 'cover:1:left')).toBe('Cage-top section 1, left: no plate seat');
    expect(ariaOf(metric, 'cover:2:left')).toBe('Cage-top section 2, left: empty');
    expect(metric).toContain('THRESHING ZONE');
    expect(metric).toContain('SEPARATING ZONE');
    expect(metric).toContain('CW-FW-L-04 · 5.0 mm');
    const imperial = renderToStaticMarkup(<CageDiagram family={tamarackM4} layout={layout} catalog={demoCatalog} units="imperial" />);
    expect(imperial).toContain('CW-FW-L-04 · 0.20 in');
    expect(imperial).not.toContain('5.0 mm');
  });

  it('marks findings on their places with words, not colour alone', () => {
    const base = starterLayout(tamarackM4, 'wheat', demoCatalog);
    const layout: Layout = {
      ...base,
      elements: base.elements.map((e) => (e.position === 3 && e.side === 'right' ? { ...e, partNumber: 'CW-WW-L-04' } : e)),
    };
    const findings = checkLayout(tamarackM4, demoCatalog, layout);
    const html = renderToStaticMarkup(
      <CageDiagram family={tamarackM4} layout={layout} catalog={demoCatalog} findings={findings} units="metric" />,
    );
    expect(ariaOf(html, 'element:3:right')).toContain('Blocks fit: Left-hand element in the right half');
    expect(html).toContain('>Blocks fit<');
    expect(html).toContain('left-hand part');
    expect(ariaOf(html, 'element:3:left')).not.toContain('Blocks fit');
  });

  it('marks changed places in compare views, and the selection', () => {
    const layout = starterLayout(tamarackM4, 'corn', demoCatalog);
    const html = renderToStaticMarkup(
      <CageDiagram
        family={tamarackM4}
        layout={layout}
        catalog={demoCatalog}
        units="metric"
        diffPlaces={[
          { kind: 'bar', row: 1, position: 1 },
          { kind: 'element', position: 1, side: 'left' },
        ]}
        selectedPlace={{ kind: 'element', position: 2, side: 'left' }}
      />,
    );
    expect(ariaOf(html, 'bar:1:1')).toBe(
      'Rotor row 1, position 1: straight bar, CW-BR-ST-04, across this mount and the one behind it. Changed',
    );
    expect(html).toContain('Δ CHANGED');
    // Elements carry the badge across their top edge; rotor bars, whose rows touch, a "Δ" inside the slot.
    expect(/data-place="bar:1:1"[^]*?<\/g><\/g>/.exec(html)![0]).toContain('data-mark="changed"');
    expect(html).toContain('Straight · 2 mounts');
  });

  it('draws a straight bar as one part across its pair of in-line mounts', () => {
    const corn = starterLayout(tamarackM4, 'corn', demoCatalog);
    const html = renderToStaticMarkup(<CageDiagram family={tamarackM4} layout={corn} catalog={demoCatalog} units="metric" />);
    expect(ariaOf(html, 'bar:1:1')).toBe('Rotor row 1, position 1: straight bar, CW-BR-ST-04, across this mount and the one behind it');
    expect(ariaOf(html, 'bar:1:2')).toBe('Rotor row 1, position 2: taken by the straight bar from position 1');
    expect(html).toContain('Straight, from pos. 1');
    // Without the straight bar the rear mount is simply empty (and a finding).
    const bare = { ...corn, rotorBars: corn.rotorBars.filter((b) => !(b.row === 1 && b.position === 1)) };
    const html2 = renderToStaticMarkup(
      <CageDiagram
        family={tamarackM4}
        layout={bare}
        catalog={demoCatalog}
        units="metric"
        findings={checkLayout(tamarackM4, demoCatalog, bare)}
      />,
    );
    expect(ariaOf(html2, 'bar:1:2')).toMatch(/^Rotor row 1, position 2: empty\. /);
    expect(ariaOf(html2, 'bar:1:2')).toContain('Rotor bar row 1: nothing at positions 1 and 2');
    expect(ariaOf(html2, 'bar:1:2')).toContain('Rotor out of balance at position 2: rows 1 and 3');
  });

  it('two diagrams on one page never share pattern ids', () => {
    const layout = starterLayout(tamarackM4, 'wheat', demoCatalog);
    const html = renderToStaticMarkup(
      <div>
        <CageDiagram family={tamarackM4} layout={layout} catalog={demoCatalog} units="metric" />
        <CageDiagram family={tamarackM4} layout={layout} catalog={demoCatalog} units="metric" compact />
        <CageLegend />
      </div>,
    );
    const ids = [...html.matchAll(/<pattern id="([^"]+)"/g)].map((m) => m[1]);
    expect(ids.length).toBeGreaterThan(10);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('compact mode leaves out the end view and part numbers', () => {
    const layout = starterLayout(sedgeS6, 'corn', demoCatalog);
    const full = renderToStaticMarkup(<CageDiagram family={sedgeS6} layout={layout} catalog={demoCatalog} units="metric" />);
    const compact = renderToStaticMarkup(<CageDiagram family={sedgeS6} layout={layout} catalog={demoCatalog} units="metric" compact />);
    expect(full).toContain('End view from the front');
    expect(compact).not.toContain('End view from the front');
    expect(compact).not.toContain('CW-WW-L-06C ·');
    expect(diagramGeometry(sedgeS6, { compact: true }).width).toBeLessThan(diagramGeometry(sedgeS6).width);
  });
});
