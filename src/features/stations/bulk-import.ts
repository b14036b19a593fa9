import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useState } from 'react';
import { bulkImportLineSchema, type BulkImportLine, type BulkImportSummary } from '@shared/schemas/stations';
import { ApiError, errorFromBody } from '../../lib/api-client';
import { stationQueries } from './api';

export type BulkProgressLine = Extract<BulkImportLine, { type: 'progress' }>;

export type BulkPhase =
  | { state: 'idle' }
  | { state: 'uploading'; fraction: number }
  | { state: 'reading'; last: BulkProgressLine | null; refused: BulkProgressLine[] }
  | { state: 'done'; summary: BulkImportSummary }
  | { state: 'failed'; message: string; problems: string[] };

/** Complete JSON lines of a streamed answer, from `from` on; returns the lines and where the next starts. */
function completeLines(text: string, from: number): { lines: BulkImportLine[]; next: number } {
  const end = text.lastIndexOf('\n');
  if (end < from) return { lines: [], next: from };
  const lines = text
    .slice(from, end)
    .split('\n')
    .filter((l) => l.trim() !== '')
    .map((l) => bulkImportLineSchema.parse(JSON.parse(l)));
  return { lines, next: end + 1 };
}

/**
 * Send a file set to POST /api/stations/bulk and follow it: the bytes going up, then one line per
 * station as the server reads it (a streamed answer, read as it arrives), then the summary.
 */
export function useBulkImport() {
  const queryClient = useQueryClient();
  const [phase, setPhase] = useState<BulkPhase>({ state: 'idle' });
  const run = useCallback(
    (form: FormData) =>
      new Promise<void>((resolve) => {
        setPhase({ state: 'uploading', fraction: 0 });
        const xhr = new XMLHttpRequest();
        xhr.open('POST', '/api/stations/bulk');
        xhr.setRequestHeader('X-Syconium-Request', '1');
        let read = 0;
        const refused: BulkProgressLine[] = [];
        let last: BulkProgressLine | null = null;
        let finished: BulkImportLine | null = null;
        const consume = () => {
          if (xhr.status !== 200) return;
          const { lines, next } = completeLines(xhr.responseText, read);
          read = next;
          for (const line of lines) {
            if (line.type === 'progress') {
              last = line;
              if (line.status === 'refused') refused.push(line);
            } else finished = line;
          }
          if (lines.length) setPhase({ state: 'reading', last, refused: [...refused] });
        };
        xhr.upload.onprogress = (event) => {
          if (event.lengthComputable) setPhase({ state: 'uploading', fraction: event.loaded / event.total });
        };
        xhr.upload.onload = () => setPhase({ state: 'reading', last: null, refused: [] });
        xhr.onprogress = consume;
        xhr.onerror = () => {
          setPhase({ state: 'failed', message: 'The upload did not reach the server. Check the connection and try again.', problems: [] });
          resolve();
        };
        xhr.onload = async () => {
          if (xhr.status !== 200) {
            let body: unknown;
            try {
              body = JSON.parse(xhr.responseText);
            } catch {
              body = undefined;
            }
            const error: ApiError = errorFromBody(xhr.status, body);
            setPhase({ state: 'failed', message: error.message, problems: Object.values(error.fields).flatMap((v) => v ?? []) });
            return resolve();
          }
          consume();
          const end = finished as BulkImportLine | null;
          if (end?.type === 'summary') {
            await queryClient.invalidateQueries({ queryKey: stationQueries.all });
            setPhase({ state: 'done', summary: end.summary });
          } else if (end?.type === 'failed') setPhase({ state: 'failed', message: end.message, problems: end.problems });
          else setPhase({ state: 'failed', message: 'The answer stopped before the end; nothing may have been imported.', problems: [] });
          resolve();
        };
        xhr.send(form);
      }),
    [queryClient],
  );
  return { phase, run };
}
