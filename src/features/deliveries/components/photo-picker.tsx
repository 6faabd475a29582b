import { useEffect, useId, useMemo } from 'react';
import { buttonClasses } from '../../../components/ui/button';
import { PHOTO_LIMIT } from '../lib/proof-form-schema';

interface PhotoPickerProps {
  photos: readonly Blob[];
  onChange: (photos: Blob[]) => void;
  error?: string;
  errorId: string;
}

/** Object URLs for the thumbnails, let go when the photos change or the form closes. */
function useThumbnails(photos: readonly Blob[]): string[] {
  const urls = useMemo(() => photos.map((p) => (typeof URL.createObjectURL === 'function' ? URL.createObjectURL(p) : '')), [photos]);
  useEffect(
    () => () => {
      for (const url of urls) if (url) URL.revokeObjectURL(url);
    },
    [urls],
  );
  return urls;
}

/** Up to six photos from the phone's camera (or its pictures), shown as thumbnails that can be taken out again. */
export function PhotoPicker({ photos, onChange, error, errorId }: PhotoPickerProps) {
  const inputId = useId();
  const thumbnails = useThumbnails(photos);
  const left = PHOTO_LIMIT - photos.length;
  return (
    <fieldset className="space-y-3" aria-describedby={error ? errorId : undefined}>
      <legend className="text-xl font-semibold">
        Photos ({photos.length} of {PHOTO_LIMIT})
      </legend>
      <p className="text-ink-700">Where the load was left, and any damage. JPEG, PNG or WebP, at most 8 MB each.</p>
      {photos.length > 0 ? (
        <ul className="grid grid-cols-3 gap-2" aria-label="Photos taken">
          {photos.map((photo, i) => (
            <li key={`${i}-${photo.size}`} className="relative">
              {thumbnails[i] ? (
                <img src={thumbnails[i]} alt={`Taken on site, ${i + 1} of ${photos.length}`} className="aspect-square w-full rounded-md border border-ink-300 object-cover" />
              ) : (
                <div role="img" className="aspect-square w-full rounded-md border border-ink-300 bg-ink-100" aria-label={`Taken on site, ${i + 1} of ${photos.length}`} />
              )}
              <button
                type="button"
                onClick={() => onChange(photos.filter((_, j) => j !== i))}
                className="mt-1 min-h-tap w-full rounded-md border border-ink-300 bg-white text-base font-semibold text-brick-700"
                aria-label={`Remove photo ${i + 1}`}
              >
                Remove
              </button>
            </li>
          ))}
        </ul>
      ) : null}
      <label htmlFor={inputId} className={buttonClasses('secondary', 'lg', `w-full cursor-pointer ${left <= 0 ? 'pointer-events-none opacity-60' : ''}`)}>
        {photos.length === 0 ? 'Take a photo' : left > 0 ? 'Take another photo' : 'Six photos taken'}
      </label>
      <input
        id={inputId}
        type="file"
        accept="image/*"
        capture="environment"
        multiple
        disabled={left <= 0}
        className="sr-only"
        aria-label="Take a photo"
        onChange={(event) => {
          const chosen = Array.from(event.target.files ?? []);
          // The same picture can be chosen again after it was removed.
          event.target.value = '';
          if (chosen.length) onChange([...photos, ...chosen]);
        }}
      />
      {error ? (
        <p id={errorId} className="text-lg font-semibold text-brick-700">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
