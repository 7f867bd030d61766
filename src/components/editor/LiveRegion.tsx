/**
 * The editor's own live region: what an edit did and what the rules now say. The words follow
 * the frame that shows the edit (a screen reader reads them a moment later anyway).
 */
import { useEditorLazy } from './store/context';

export function LiveRegion() {
  // Not rendered at all in the frame of the edit (useEditorLazy): the words come after it.
  const a = useEditorLazy((s) => s.announcement);
  return (
    <div role="status" aria-live="polite" aria-atomic="true" className="sr-only" data-testid="editor-announcer" data-seq={a.seq}>
      {a.text}
    </div>
  );
}
