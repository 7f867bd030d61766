/**
 * One slide on the stage: its title and where the layout comes from, the cage diagram as large
 * as the screen allows (with the findings pinned on it), and the figures and findings beside it
 * in type meant for the back of a room — or, on request, the crop-path illustration.
 */
import { CageDiagram } from '~/components/cage/CageDiagram';
import { diagramGeometry } from '~/components/cage/geometry';
import { CropPath } from './CropPath';
import { SeverityLegend, SlideFacts } from './SlideFacts';
import { sourceWords, type ShowProps, type ShowSlide } from './types';

interface Props extends Pick<ShowProps, 'families' | 'catalogs' | 'units'> {
  slide: ShowSlide;
  cropPath: boolean;
  /** Vertical space the stage keeps for everything but the diagram (bars, padding, legend), px. */
  reserve?: number;
}

export function StageSlide({ slide, families, catalogs, units, cropPath, reserve = 150 }: Props) {
  const family = slide.familyId ? families[slide.familyId] : undefined;
  const catalog = slide.familyId ? catalogs[slide.familyId] : undefined;
  const ok = family && catalog && slide.layout && slide.settings;
  let aspect = 1.2;
  if (family) {
    const geo = diagramGeometry(family, { endView: false });
    aspect = geo.width / geo.height;
  }
  const header = (
    <header className="shrink-0">
      <h2 className={`${cropPath ? 'text-[44px]' : 'text-[52px]'} font-bold leading-tight tracking-tight`} data-testid="stage-title">
        {slide.title}
      </h2>
      <p className="mt-1 text-[22px] text-ink-muted">{sourceWords(slide, families)}</p>
    </header>
  );
  if (!ok) {
    return (
      <article className="h-full" aria-roledescription="slide" aria-label={`Slide ${slide.position}: ${slide.title}`}>
        {header}
        <p className="mt-10 text-[32px] text-ink-muted">There is no layout to show on this slide.</p>
      </article>
    );
  }
  if (cropPath) {
    return (
      <article
        className="flex h-full min-h-0 flex-col"
        aria-roledescription="slide"
        aria-label={`Slide ${slide.position}: ${slide.title}, crop path`}
      >
        {header}
        <div className="mt-3 min-h-0 flex-1">
          <CropPath family={family} catalog={catalog} layout={slide.layout!} stage />
        </div>
      </article>
    );
  }
  // The diagram takes the full height on the left; title, figures and findings go beside it.
  return (
    <article className="flex h-full min-h-0 gap-10" aria-roledescription="slide" aria-label={`Slide ${slide.position}: ${slide.title}`}>
      <div className="flex min-h-0 shrink-0 flex-col" style={{ width: `min(64vw, calc((100vh - ${reserve}px) * ${aspect.toFixed(3)}))` }}>
        <div data-testid="stage-diagram">
          <CageDiagram family={family} layout={slide.layout!} catalog={catalog} findings={slide.findings} units={units} endView={false} />
        </div>
        <div className="mt-2">
          <SeverityLegend stage />
        </div>
      </div>
      <div className="min-w-0 flex-1 space-y-6 overflow-auto" tabIndex={0}>
        {header}
        <SlideFacts
          layout={slide.layout!}
          family={family}
          settings={slide.settings!}
          findings={slide.findings}
          units={units}
          stage
          maxFindings={5}
        />
      </div>
    </article>
  );
}
