/** The editor's own live region: what an edit did and what the rules now say. */
import { useEditor } from './store/context';

export function LiveRegion() {
  const a = useEditor((s) => s.announcement);
  return (
    <div role="status" aria-live="polite" aria-atomic="true" className="sr-only" data-testid="editor-announcer" data-seq={a.seq}>
      {a.text}
    </div>
  );
}
