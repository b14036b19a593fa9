import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { CreateReportValues } from '@shared/schemas/reports';

/**
 * The phone's outbox: new reports (photos included, as Blobs) kept in IndexedDB until the server
 * has them. A report is written here before the first attempt to send it, so closing the tab, losing
 * the signal or a flat battery mid-send loses nothing; the next page load sends it.
 */
export interface OutboxPhoto {
  name: string;
  type: string;
  blob: Blob;
}

export interface OutboxReport {
  /** Made on the phone (crypto.randomUUID); the server stores a report once per grower and clientId. */
  clientId: string;
  /** Whose report: it is only ever sent while this grower is signed in (a shared phone). */
  userId: number;
  values: CreateReportValues;
  photos: OutboxPhoto[];
  /** For the list: when it was written. */
  keptAt: string;
  /** `waiting`: sent when the connection allows; `refused`: the server said what is wrong (not sent again). */
  state: 'waiting' | 'refused';
  /** Once the report itself is stored: its id (only the photos are left to send). */
  reportId?: number;
  refusal?: { message: string; fields: Record<string, string[]> };
}

interface OutboxDb extends DBSchema {
  reports: { key: string; value: OutboxReport };
}

let opened: Promise<IDBPDatabase<OutboxDb>> | undefined;
const database = () => (opened ??= openDB<OutboxDb>('syconium-outbox', 1, { upgrade: (db) => void db.createObjectStore('reports', { keyPath: 'clientId' }) }));

/** Other tabs and this one hear about every change (the queue indicator redraws). */
const channel = typeof BroadcastChannel === 'undefined' ? null : new BroadcastChannel('syconium-outbox');
const listeners = new Set<() => void>();
channel?.addEventListener('message', () => listeners.forEach((listener) => listener()));
const changed = () => {
  listeners.forEach((listener) => listener());
  channel?.postMessage('changed');
};

export function onOutboxChange(listener: () => void): () => void {
  listeners.add(listener);
  return () => void listeners.delete(listener);
}

export async function keepReport(report: OutboxReport): Promise<void> {
  await (await database()).put('reports', report);
  changed();
}

export async function outboxReports(): Promise<OutboxReport[]> {
  const all = await (await database()).getAll('reports');
  return all.sort((a, b) => a.keptAt.localeCompare(b.keptAt));
}

export async function dropReport(clientId: string): Promise<void> {
  await (await database()).delete('reports', clientId);
  changed();
}
