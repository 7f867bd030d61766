/**
 * One slide on the stage: its title and where the layout comes from, the cage diagram as large
 * as the screen allows (with the findings pinned on it), and the figures and findings beside it
 * in type meant for the back of a room — or, on request, the crop-path illustration.
 */
import { CageDiagram } from '../cage/CageDiagram';
import { diagramGeometry } from '../cage/geometry';
import { CropPath } from './CropPath';
import { SeverityLegend, SlideFacts } from './SlideFacts';
import { sourceWords, type ShowProps, type ShowSlide } from './types';

interface Props extends Pick<ShowProps, 'families' | 'catalogs' | 'units'> {
  slide: ShowSlide;
  cropPath: boolean;
  /** Vertical space the stage keeps for everything but the diagram, px. */
  reserve?: number;
}

export function StageSlide({ slide, families, catalogs, units, cropPath, reserve = 250 }: Props) {
  const family = slide.familyId ? families[slide.familyId] : undefined;
  const catalog = slide.familyId ? catalogs[slide.familyId] : undefined;
  const ok = family && catalog && slide.layout && slide.settings;
  let aspect = 1.2;
  if (family) {
    const geo = diagramGeometry(family, { endView: false });
    aspect = geo.width / geo.height;
  }
  return (
    <article className="flex h-full min-h-0 flex-col" aria-roledescription="slide" aria-label={`Slide ${slide.position}: ${slide.title}`}>
      <header className="shrink-0">
        <h2 className="text-[56px] font-bold leading-tight tracking-tight" data-testid="stage-title">
          {slide.title}
        </h2>
        <p className="mt-1 text-[24px] text-ink-muted">{sourceWords(slide, families)}</p>
      </header>
      {!ok ? (
        <p className="mt-10 text-[32px] text-ink-muted">There is no layout to show on this slide.</p>
      ) : cropPath ? (
        <div className="mt-4 min-h-0 flex-1 overflow-auto">
          <div style={{ maxWidth: `calc((100vh - ${reserve + 190}px) * ${1200 / 728})` }} className="mx-auto">
            <CropPath family={family} catalog={catalog} layout={slide.layout!} stage />
          </div>
        </div>
      ) : (
        <div className="mt-4 flex min-h-0 flex-1 gap-10">
          <div className="min-w-0 flex-[1.9]">
            <div style={{ maxWidth: `calc((100vh - ${reserve}px) * ${aspect.toFixed(3)})` }} data-testid="stage-diagram">
              <CageDiagram family={family} layout={slide.layout!} catalog={catalog} findings={slide.findings} units={units} endView={false} />
            </div>
            <div className="mt-3">
              <SeverityLegend stage />
            </div>
          </div>
          <div className="min-w-[520px] flex-1 overflow-auto">
            <SlideFacts layout={slide.layout!} family={family} settings={slide.settings!} findings={slide.findings} units={units} stage maxFindings={5} />
          </div>
        </div>
      )}
    </article>
  );
}
