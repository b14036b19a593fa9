import { useId, useState, type FormEvent } from 'react';
import { Button } from '../../../components/button';
import { useBulkImport } from '../bulk-import';
import { UploadProgress } from '../../../components/upload-progress';

/**
 * The editors' bulk import: a whole file set at once (NOAA normals, or GHCN-Daily stations with
 * their inventory), loose or zipped. Shows the bytes going up, each station as the server reads it,
 * then what was added, replaced and refused. All or nothing: one bad file refuses the set.
 */
export function BulkImportForm() {
  const { phase, run } = useBulkImport();
  const [localError, setLocalError] = useState<string | null>(null);
  const id = useId();
  const busy = phase.state === 'uploading' || phase.state === 'reading';

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const files = form.getAll('files').filter((f): f is File => f instanceof File && f.size > 0);
    if (files.length === 0) return setLocalError('Please choose the files of one set');
    setLocalError(null);
    await run(form);
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3 rounded-lg border border-fig-100 bg-white p-5" aria-label="Import a file set">
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-files`} className="text-sm font-medium text-ink">
          Files of one set
        </label>
        <input
          id={`${id}-files`}
          name="files"
          type="file"
          multiple
          accept=".txt,.csv,.zip"
          aria-invalid={localError ? true : undefined}
          aria-describedby={`${id}-hint`}
          className="rounded-md border border-fig-200 bg-white px-3 py-2 text-sm file:mr-3 file:rounded file:border-0 file:bg-fig-50 file:px-3 file:py-1 file:text-fig-700"
        />
        <p id={`${id}-hint`} className="text-xs text-ink/70">
          One of: NOAA climate normals in the fixed-width layout (<code>allstations.txt</code> with the <code>ann-tmin-prb…</code> and <code>ann-grdd-base50.txt</code> files); NOAA 1991-2020
          normals, one CSV per station (columns such as <code>ANN-TMIN-PRBLST-T32FP50</code>); or GHCN-Daily station CSVs named by station id with the inventory <code>ghcnd-stations.txt</code>.
          Loose or in a .zip. A newer normals release replaces an older one station by station; an older one never overwrites a newer.
        </p>
        {localError && (
          <p role="alert" className="text-sm text-red-700">
            {localError}
          </p>
        )}
      </div>
      <div className="flex flex-col gap-1 sm:w-56">
        <label htmlFor={`${id}-release`} className="text-sm font-medium text-ink">
          Normals release (optional)
        </label>
        <input id={`${id}-release`} name="release" placeholder="e.g. 1991-2020" className="rounded-md border border-fig-200 bg-white px-3 py-2 text-base shadow-sm" />
      </div>

      {phase.state === 'uploading' && <UploadProgress fraction={phase.fraction} />}
      {phase.state === 'reading' && (
        <div role="status" className="text-sm text-ink/80">
          {phase.last ? (
            <>
              <p>
                Reading station {phase.last.index.toLocaleString()} of {phase.last.total.toLocaleString()} ({phase.last.code})…
              </p>
              <progress className="mt-1 h-2 w-full accent-fig-600" max={phase.last.total} value={phase.last.index} aria-label="Stations read" />
            </>
          ) : (
            <p>Reading the files…</p>
          )}
        </div>
      )}
      {phase.state === 'done' && (
        <div role="status" className="rounded-md border border-leaf-300 bg-leaf-100/50 p-3 text-sm" data-testid="bulk-summary">
          <p className="font-medium">
            Imported{phase.summary.release ? ` (normals ${phase.summary.release})` : ''}: {phase.summary.added.toLocaleString()} added, {phase.summary.replaced.toLocaleString()} replaced,{' '}
            {phase.summary.refused.toLocaleString()} refused.
          </p>
          {phase.summary.refused > 0 && (
            <ul className="mt-2 max-h-40 list-disc overflow-y-auto pl-5">
              {phase.summary.stations
                .filter((s) => s.status === 'refused')
                .map((s) => (
                  <li key={s.code}>
                    {s.code}: {s.reason}
                  </li>
                ))}
            </ul>
          )}
        </div>
      )}
      {phase.state === 'failed' && (
        <div role="alert" className="rounded-md border border-red-200 bg-red-50 p-3 text-sm text-red-800">
          <p className="font-medium">{phase.message}</p>
          {phase.problems.length > 0 && (
            <ul className="mt-2 max-h-60 list-disc overflow-y-auto pl-5" aria-label="Problems in the file set">
              {phase.problems.map((line) => (
                <li key={line}>{line}</li>
              ))}
            </ul>
          )}
          <p className="mt-2 text-red-900/80">Nothing was changed.</p>
        </div>
      )}
      <div>
        <Button type="submit" disabled={busy}>
          {busy ? 'Working…' : 'Import the set'}
        </Button>
      </div>
    </form>
  );
}
