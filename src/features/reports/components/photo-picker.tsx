import { useEffect, useId, useMemo } from 'react';
import { countOf } from '@shared/domain/plural';
import { PHOTO_MAX_BYTES, PHOTOS_PER_REPORT, type ReportPhoto } from '@shared/schemas/reports';

const ACCEPT = 'image/jpeg,image/png,image/webp';

/** Check chosen files before sending them: type by the browser's guess (the server checks the bytes), size, count. */
export function checkPhotoFiles(files: File[], room: number): string | null {
  if (files.length > room) return `You can add ${room} more photo${room === 1 ? '' : 's'} (a report keeps at most ${PHOTOS_PER_REPORT})`;
  const big = files.find((f) => f.size > PHOTO_MAX_BYTES);
  if (big) return `“${big.name}” is larger than ${PHOTO_MAX_BYTES / 1024 / 1024} MB`;
  const odd = files.find((f) => f.type && !ACCEPT.split(',').includes(f.type));
  if (odd) return `“${odd.name}” is not a JPEG, PNG or WebP photo`;
  return null;
}

interface PhotoPickerProps {
  files: File[];
  onChange: (files: File[]) => void;
  existing?: ReportPhoto[];
  onDeleteExisting?: (photo: ReportPhoto) => void;
  error?: string | null;
  progress?: number | null;
}

/** Choose photos with previews; existing photos (when editing) can be removed. */
export function PhotoPicker({ files, onChange, existing = [], onDeleteExisting, error, progress }: PhotoPickerProps) {
  const id = useId();
  const previews = useMemo(() => files.map((file) => ({ file, url: URL.createObjectURL(file) })), [files]);
  useEffect(() => () => previews.forEach((p) => URL.revokeObjectURL(p.url)), [previews]);
  const room = PHOTOS_PER_REPORT - existing.length - files.length;

  return (
    <div className="flex flex-col gap-2">
      {(existing.length > 0 || previews.length > 0) && (
        <ul className="grid grid-cols-3 gap-2 sm:grid-cols-6">
          {existing.map((photo) => (
            <li key={`e${photo.id}`} className="relative">
              <img src={photo.thumbUrl} alt="A photo of this report" className="aspect-square w-full rounded-md object-cover" />
              {onDeleteExisting && (
                <button type="button" className="absolute right-1 top-1 rounded bg-white/90 px-1.5 text-xs text-red-800" onClick={() => onDeleteExisting(photo)} aria-label="Remove this photo">
                  Remove
                </button>
              )}
            </li>
          ))}
          {previews.map(({ file, url }) => (
            <li key={url} className="relative">
              <img src={url} alt={`Preview of ${file.name}`} className="aspect-square w-full rounded-md object-cover opacity-90" />
              <button
                type="button"
                className="absolute right-1 top-1 rounded bg-white/90 px-1.5 text-xs text-red-800"
                onClick={() => onChange(files.filter((f) => f !== file))}
                aria-label={`Do not upload ${file.name}`}
              >
                Remove
              </button>
            </li>
          ))}
        </ul>
      )}
      {/* The browser's own file button keeps saying "No file chosen" once the photos are shown above: a button of our own says what is chosen instead. */}
      <div className="flex flex-wrap items-center gap-3">
        <label
          htmlFor={id}
          className={`inline-flex items-center gap-2 rounded-md border border-fig-200 bg-white px-4 py-2 text-sm font-medium text-fig-700 focus-within:ring-2 focus-within:ring-fig-500 ${room <= 0 ? 'cursor-not-allowed opacity-45' : 'cursor-pointer hover:bg-fig-50'}`}
        >
          <span aria-hidden>＋</span> {files.length ? 'Add more photos' : 'Add photos'}
          <input
            id={id}
            type="file"
            accept={ACCEPT}
            multiple
            disabled={room <= 0}
            className="sr-only"
            onChange={(e) => {
              const chosen = Array.from(e.target.files ?? []);
              e.target.value = '';
              onChange([...files, ...chosen]);
            }}
          />
        </label>
        <span className="text-sm text-ink/75" aria-live="polite" data-testid="photo-count">
          {files.length === 0 ? 'No photos chosen yet.' : `${countOf(files.length, 'photo')} chosen, sent with the report.`}
          {room <= 0 ? ' No room for more.' : ''}
        </span>
      </div>
      <p className="text-xs text-ink/70">
        Up to {PHOTOS_PER_REPORT} photos (JPEG, PNG or WebP, {PHOTO_MAX_BYTES / 1024 / 1024} MB each): the tree, the fruit, a cut fig. Location and camera details are removed from every photo before it is stored.
      </p>
      {progress != null && (
        <div className="flex items-center gap-2 text-sm text-ink/80">
          <progress max={1} value={progress} className="h-2 w-48 accent-fig-600" aria-label="Upload progress" />
          {Math.round(progress * 100)} %
        </div>
      )}
      {error && (
        <p role="alert" className="text-sm text-red-700">
          {error}
        </p>
      )}
    </div>
  );
}
