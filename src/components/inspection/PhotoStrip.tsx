/** A line's photos as thumbnails, and the button that takes or picks a new one. */
import { useId, useState } from 'react';
import { ApiError, sendJson } from '~/components/shared/api';
import { sendPhoto } from './api';
import type { PhotoView } from './types';

/** Same limit as the server (which decides); checked here only to spare a phone the upload. */
const MAX_BYTES = 8 * 1024 * 1024;

interface Props {
  inspectionId: string;
  itemId: string;
  label: string;
  photos: PhotoView[];
  editable: boolean;
  onChange: (photos: PhotoView[]) => void;
}

export function PhotoStrip({ inspectionId, itemId, label, photos, editable, onChange }: Props) {
  const inputId = useId();
  const [busy, setBusy] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function add(files: FileList | null) {
    if (!files || files.length === 0) return;
    setError(null);
    let list = photos;
    for (const [i, file] of [...files].entries()) {
      if (file.size > MAX_BYTES) {
        setError(`“${file.name}” is larger than 8 MB. Take it at a lower resolution or crop it.`);
        continue;
      }
      setBusy(files.length > 1 ? `Uploading photo ${i + 1} of ${files.length}…` : 'Uploading the photo…');
      try {
        const p = await sendPhoto<PhotoView>(`/api/inspections/${inspectionId}/items/${itemId}/photos`, file);
        list = [...list, p];
        onChange(list);
      } catch (err) {
        setError(err instanceof ApiError ? err.message : 'The photo could not be sent. Check the connection and try again.');
      }
    }
    setBusy(null);
  }

  async function drop(photo: PhotoView) {
    setError(null);
    try {
      await sendJson('DELETE', photo.url);
      onChange(photos.filter((p) => p.id !== photo.id));
    } catch (err) {
      setError(err instanceof ApiError ? err.message : 'The photo could not be removed.');
    }
  }

  return (
    <div className="mt-3">
      {photos.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label={`Photos of ${label}`}>
          {photos.map((p, i) => (
            <li key={p.id} className="relative">
              <a
                href={p.url}
                target="_blank"
                rel="noopener"
                className="block rounded-md border border-steel-300 focus-visible:outline-iris-500"
              >
                <img src={p.thumbUrl} alt={`Photo ${i + 1} of ${label}`} loading="lazy" className="h-24 w-32 rounded-md object-cover" />
              </a>
              {editable && (
                <button
                  type="button"
                  onClick={() => void drop(p)}
                  className="absolute -right-2 -top-2 flex h-9 w-9 items-center justify-center rounded-full border border-steel-300 bg-white text-lg font-bold text-ink shadow hover:bg-fit-soft"
                  aria-label={`Remove photo ${i + 1} of ${label}`}
                >
                  ×
                </button>
              )}
            </li>
          ))}
        </ul>
      )}
      {editable && (
        <div className="mt-2">
          <label
            htmlFor={inputId}
            className="inline-flex min-h-[48px] cursor-pointer items-center gap-2 rounded-md border border-steel-300 bg-white px-4 text-base font-semibold text-ink shadow-sm hover:bg-steel-100 focus-within:outline focus-within:outline-[3px] focus-within:outline-offset-2 focus-within:outline-iris-500"
          >
            <svg width="22" height="20" viewBox="0 0 22 20" aria-hidden="true">
              <path d="M2 6h4l2-3h6l2 3h4v12H2z" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinejoin="round" />
              <circle cx="11" cy="11.5" r="3.8" fill="none" stroke="currentColor" strokeWidth="1.8" />
            </svg>
            {photos.length ? 'Add another photo' : 'Take or add a photo'}
            <input
              id={inputId}
              type="file"
              accept="image/*"
              capture="environment"
              multiple
              className="sr-only"
              data-testid="photo-input"
              disabled={busy !== null}
              onChange={(e) => {
                const input = e.currentTarget;
                void add(input.files).finally(() => {
                  input.value = '';
                });
              }}
            />
          </label>
          <p className="mt-1 text-sm text-ink-muted" aria-live="polite">
            {busy ?? ''}
          </p>
        </div>
      )}
      {error && (
        <p role="alert" className="field-error">
          {error}
        </p>
      )}
    </div>
  );
}
