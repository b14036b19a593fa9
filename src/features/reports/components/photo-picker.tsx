import { useEffect, useId, useMemo } from 'react';
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
      <label htmlFor={id} className="text-sm font-medium text-ink">
        Add photos
      </label>
      <input
        id={id}
        type="file"
        accept={ACCEPT}
        multiple
        disabled={room <= 0}
        className="text-sm file:mr-3 file:rounded-md file:border-0 file:bg-fig-100 file:px-3 file:py-1.5 file:text-fig-700"
        onChange={(e) => {
          const chosen = Array.from(e.target.files ?? []);
          e.target.value = '';
          onChange([...files, ...chosen]);
        }}
      />
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
