import { useRef, useState, type FormEvent } from 'react';
import { stationUploadFieldsSchema } from '@shared/schemas/stations';
import { Button } from '../../../components/button';
import { FormField, useFocusFirstInvalid } from '../../../components/form-field';
import { useStationUpload } from '../api';
import { UploadProgress } from '../../../components/upload-progress';

type FieldErrors = Record<string, string[] | undefined>;

/**
 * The editors' station upload: station details and the daily CSV. Shows the bytes going up, then
 * "computing" while the server checks every row and works out the freeze dates.
 */
export function StationUploadForm({ onUploaded }: { onUploaded: (id: number) => void }) {
  const { phase, upload } = useStationUpload();
  const [localErrors, setLocalErrors] = useState<FieldErrors>({});
  const busy = phase.state === 'uploading' || phase.state === 'computing';
  const serverErrors: FieldErrors = phase.state === 'failed' ? phase.error.fields : {};
  const errors: FieldErrors = { ...serverErrors, ...localErrors };
  const fileErrors = errors.file ?? [];
  const formRef = useRef<HTMLFormElement>(null);
  const [attempts, setAttempts] = useState(0);
  useFocusFirstInvalid(formRef, { submitCount: attempts, isSubmitting: false, hasErrors: Object.keys(localErrors).length > 0 });

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const fields = Object.fromEntries([...form.entries()].filter(([key]) => key !== 'file'));
    const checked = stationUploadFieldsSchema.safeParse(fields);
    const next: FieldErrors = {};
    if (!checked.success) for (const issue of checked.error.issues) (next[String(issue.path[0])] ??= []).push(issue.message);
    const file = form.get('file');
    if (!(file instanceof File) || file.size === 0) next.file = ['Please choose a CSV file'];
    setLocalErrors(next);
    setAttempts((n) => n + 1);
    if (Object.keys(next).length > 0) return;
    const detail = await upload(form);
    if (detail) onUploaded(detail.station.id);
  }

  return (
    <form ref={formRef} onSubmit={submit} noValidate className="flex flex-col gap-4 rounded-lg border border-fig-100 bg-white p-5" aria-label="Upload a station">
      <div className="grid gap-4 sm:grid-cols-2">
        <FormField label="Station name" name="name" required error={errors.name?.[0]} hint="As people know it, e.g. “Albany International Airport, NY”." />
        <FormField label="Station code" name="code" error={errors.code?.[0]} hint="Optional, e.g. a GHCN id. Uploading again with the same code replaces that station’s data." />
        <FormField label="Latitude" name="lat" inputMode="decimal" required error={errors.lat?.[0]} hint="Decimal degrees, north positive (−90 to 90)." />
        <FormField label="Longitude" name="lon" inputMode="decimal" required error={errors.lon?.[0]} hint="Decimal degrees, east positive (−180 to 180)." />
        <FormField label="Elevation (m)" name="elevationM" inputMode="decimal" error={errors.elevationM?.[0]} hint="Optional, metres above sea level." />
        <div className="flex flex-col gap-1">
          <label htmlFor="station-unit" className="text-sm font-medium text-ink">
            Temperature unit in the file
          </label>
          <select id="station-unit" name="unit" defaultValue="" aria-describedby="station-unit-hint" className="rounded-md border border-fig-200 bg-white px-3 py-2 text-base shadow-sm">
            <option value="">As the file says</option>
            <option value="C">Degrees Celsius (°C)</option>
            <option value="F">Degrees Fahrenheit (°F)</option>
          </select>
          <p id="station-unit-hint" className="text-xs text-ink/70">
            “As the file says” reads a unit in the column name (<code>tmin_c</code>, <code>tmin_f</code>), else NOAA’s layouts: °C for <code>YYYY,MM,DD</code>, °F for <code>year,month,day</code>.
            Values are stored in °C; freeze dates are worked out at 32, 28 and 24 °F.
          </p>
        </div>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor="station-file" className="text-sm font-medium text-ink">
          Daily temperatures (CSV)
        </label>
        <input
          id="station-file"
          name="file"
          type="file"
          accept=".csv,text/csv"
          aria-invalid={fileErrors.length ? true : undefined}
          aria-describedby="station-file-hint"
          className="rounded-md border border-fig-200 bg-white px-3 py-2 text-sm file:mr-3 file:rounded file:border-0 file:bg-fig-50 file:px-3 file:py-1 file:text-fig-700"
        />
        <p id="station-file-hint" className="text-xs text-ink/70">
          One row per day under a header row: the dates (<code>date</code> as YYYY-MM-DD, or <code>YYYY,MM,DD</code>, or <code>year,month,day</code>), the daily minimum (<code>TMIN</code> or{' '}
          <code>tmin</code>) and optionally the maximum (<code>TMAX</code>). Missing values may be empty, <code>NA</code>, <code>M</code> or <code>-9999</code>. NOAA GHCN-Daily exports work as they
          are. Any bad row rejects the whole file, with the row and column named.
        </p>
        {localErrors.file && (
          <p role="alert" className="text-sm text-red-700">
            {localErrors.file[0]}
          </p>
        )}
      </div>

      {phase.state === 'uploading' && <UploadProgress fraction={phase.fraction} />}
      {phase.state === 'computing' && (
        <p role="status" className="text-sm text-ink/80">
          Computing freeze dates: checking every row and working out each year’s last spring and first fall freeze…
        </p>
      )}
      {phase.state === 'failed' && (
        <div role="alert" className="rounded-md border border-red-200 bg-red-50 p-3 text-sm text-red-800">
          <p className="font-medium">{phase.error.message}</p>
          {fileErrors.length > 0 && (
            <ul className="mt-2 max-h-60 list-disc overflow-y-auto pl-5" aria-label="Problems in the file">
              {fileErrors.map((line) => (
                <li key={line}>{line}</li>
              ))}
            </ul>
          )}
          <p className="mt-2 text-red-900/80">Nothing was changed: the station keeps its earlier data.</p>
        </div>
      )}

      <div>
        <Button type="submit" disabled={busy}>
          {busy ? 'Working…' : 'Upload and compute'}
        </Button>
      </div>
    </form>
  );
}
