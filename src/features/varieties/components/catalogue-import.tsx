import { useState } from 'react';
import { parseCatalogueCsv, type CsvProblem } from '@shared/domain/variety-csv';
import { CATALOGUE_CSV_COLUMNS } from '@shared/schemas/varieties';
import { ApiError } from '../../../lib/api-client';
import { EXPORT_URL, useImportCatalogue } from '../api';

/**
 * Import the catalogue from CSV (the export's columns). The file is checked here first, then on
 * the server; either way a single problem means nothing is imported, and every problem is listed.
 */
export function CatalogueImport() {
  const importCsv = useImportCatalogue();
  const [problems, setProblems] = useState<CsvProblem[]>([]);
  const [message, setMessage] = useState<string | null>(null);

  async function onFile(file: File) {
    setMessage(null);
    setProblems([]);
    const text = await file.text();
    const checked = parseCatalogueCsv(text);
    if (!checked.ok) {
      setProblems(checked.problems);
      return;
    }
    try {
      const result = await importCsv.mutateAsync(text);
      setMessage(`Imported ${file.name}: ${result.created} new, ${result.updated} updated.`);
    } catch (error) {
      if (!(error instanceof ApiError)) throw error;
      const listed = Object.entries(error.fields).flatMap(([key, messages]) => {
        const match = /^row (\d+)\.(.+)$/.exec(key);
        return messages.map((m) => ({ row: match ? Number(match[1]) : 0, column: match ? match[2]! : key, message: m }));
      });
      setProblems(listed.length ? listed : [{ row: 0, column: '_', message: error.message }]);
    }
  }

  return (
    <div className="flex flex-col gap-2 rounded-lg border border-fig-100 bg-white/70 p-4 text-sm">
      <div className="flex flex-wrap items-center gap-3">
        <a href={EXPORT_URL} download className="rounded-md border border-fig-200 bg-white px-3 py-1.5 font-medium text-fig-700 hover:bg-fig-50">
          Export catalogue (CSV)
        </a>
        <label className="cursor-pointer rounded-md border border-fig-200 bg-white px-3 py-1.5 font-medium text-fig-700 hover:bg-fig-50">
          {importCsv.isPending ? 'Importing…' : 'Import CSV…'}
          <input
            type="file"
            accept=".csv,text/csv"
            className="sr-only"
            onChange={(e) => {
              const file = e.target.files?.[0];
              e.target.value = '';
              if (file) void onFile(file);
            }}
          />
        </label>
      </div>
      <p className="text-xs text-ink/70">
        Columns: {CATALOGUE_CSV_COLUMNS.join(', ')}. A row whose name matches a variety updates it; other rows add varieties. Synonyms are separated by semicolons. All or nothing: one bad cell and nothing is imported.
      </p>
      {message && <p role="status" className="text-leaf-700">{message}</p>}
      {problems.length > 0 && (
        <div role="alert">
          <p className="font-medium text-red-800">Nothing was imported. Fix these and try again:</p>
          <table className="mt-1 text-left">
            <thead className="text-ink/70">
              <tr>
                <th className="pr-4 font-medium">Row</th>
                <th className="pr-4 font-medium">Column</th>
                <th className="font-medium">Problem</th>
              </tr>
            </thead>
            <tbody>
              {problems.slice(0, 50).map((p, i) => (
                <tr key={i}>
                  <td className="pr-4 tabular-nums">{p.row || '—'}</td>
                  <td className="pr-4">{p.column}</td>
                  <td>{p.message}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {problems.length > 50 && <p className="text-ink/70">…and {problems.length - 50} more.</p>}
        </div>
      )}
    </div>
  );
}
