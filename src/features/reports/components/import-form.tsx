import { useState } from 'react';
import { Link } from 'react-router';
import { IMPORT_COLUMNS, IMPORT_MAX_ROWS } from '@shared/domain/report-csv';
import { Button } from '../../../components/button';
import { ApiError } from '../../../lib/api-client';
import { importErrorsByLine, useImportReports } from '../api';
import { countOf } from '@shared/domain/plural';

/** Upload a CSV of past seasons; all rows go in together, or none with a list of what to fix. */
export function ImportForm() {
  const [file, setFile] = useState<File | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const importReports = useImportReports();
  const error = importReports.error;
  const rowErrors = error instanceof ApiError ? importErrorsByLine(error.fields) : [];

  return (
    <div className="flex flex-col gap-6">
      <form
        className="flex flex-col gap-3 rounded-lg border border-fig-100 bg-white p-5"
        onSubmit={(e) => {
          e.preventDefault();
          if (!file) return;
          setProgress(0);
          importReports.mutate({ file, onProgress: setProgress }, { onSettled: () => setProgress(null) });
        }}
      >
        <p className="flex flex-wrap items-center gap-3 text-sm text-ink/80">
          Start from the template, one row per tree, season and crop:
          <a
            href="/api/reports/import/template.csv"
            download
            className="rounded-md border border-fig-200 bg-white px-3 py-1.5 text-sm font-medium text-fig-700 hover:bg-fig-50"
          >
            Download the template (CSV)
          </a>
        </p>
        <label htmlFor="import-file" className="text-sm font-medium">
          CSV file
        </label>
        <input
          id="import-file"
          type="file"
          accept=".csv,text/csv"
          className="text-sm file:mr-3 file:rounded-md file:border-0 file:bg-fig-100 file:px-3 file:py-1.5 file:text-fig-700"
          onChange={(e) => {
            setFile(e.target.files?.[0] ?? null);
            importReports.reset();
          }}
        />
        <p className="text-xs text-ink/70">
          UTF-8 CSV with a header row, up to {IMPORT_MAX_ROWS.toLocaleString()} rows and 2 MB. Every row is checked first: if any row has a problem, nothing is imported and you
          get the list of what to fix.
        </p>
        {progress !== null && <progress max={1} value={progress} className="h-2 w-48 accent-fig-600" aria-label="Upload progress" />}
        <Button type="submit" className="self-start" disabled={!file || importReports.isPending}>
          {importReports.isPending ? 'Checking and importing…' : 'Import reports'}
        </Button>
      </form>

      {importReports.isSuccess && (
        <p role="status" className="rounded-md bg-leaf-100 px-4 py-3 text-sm text-leaf-700">
          Imported {countOf(importReports.data.imported, 'report')}.
          {importReports.data.drafts > 0 && ' They are drafts until your e-mail address is verified.'}{' '}
          <Link to="/my/reports" className="underline">
            See them in My reports
          </Link>
          .
        </p>
      )}

      {error && (
        <div role="alert" className="rounded-lg border border-red-200 bg-red-50 p-4 text-sm">
          <p className="font-medium text-red-900">{error.message}</p>
          {rowErrors.length > 0 && (
            <table className="mt-3 w-full text-left">
              <caption className="sr-only">Problems by row and column</caption>
              <thead>
                <tr className="text-red-900/80">
                  <th scope="col" className="py-1 pr-4 font-medium">Line</th>
                  <th scope="col" className="py-1 pr-4 font-medium">Column</th>
                  <th scope="col" className="py-1 font-medium">What to fix</th>
                </tr>
              </thead>
              <tbody>
                {rowErrors.flatMap(({ line, problems }) =>
                  problems.map((problem) => (
                    <tr key={`${line}-${problem.column}`} className="border-t border-red-100 align-top">
                      <td className="py-1 pr-4 tabular-nums">{line}</td>
                      <td className="py-1 pr-4 font-mono text-xs">{problem.column}</td>
                      <td className="py-1">{problem.messages.join('; ')}</td>
                    </tr>
                  )),
                )}
              </tbody>
            </table>
          )}
        </div>
      )}

      <section>
        <h2 className="text-lg font-semibold text-fig-900">Columns</h2>
        <p className="mt-1 text-sm text-ink/75">Column names must match exactly; the order does not matter and empty optional columns may be left out. Line 1 is the header, so your first report is line 2.</p>
        <table className="mt-3 w-full text-left text-sm">
          <thead className="bg-fig-50">
            <tr>
              <th scope="col" className="px-2 py-1 font-medium">Column</th>
              <th scope="col" className="px-2 py-1 font-medium">Needed</th>
              <th scope="col" className="px-2 py-1 font-medium">What to write</th>
            </tr>
          </thead>
          <tbody>
            {IMPORT_COLUMNS.map((c) => (
              <tr key={c.name} className="border-t border-fig-50 align-top">
                <td className="px-2 py-1 font-mono text-xs">{c.name}</td>
                <td className="px-2 py-1">{c.required ? 'yes' : ''}</td>
                <td className="px-2 py-1">{c.help}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
