import { useEffect, useState } from 'react';
import { useCurrentUser } from '../auth/api';
import { onOutboxChange, outboxReports, type OutboxReport } from './store';
import { sendWaitingReports } from './send';

/**
 * The outbox's reports, kept current; while mounted (the app shell) it sends waiting reports when the
 * app starts, when the connection comes back and when the grower returns to the tab.
 */
export function useOutbox(): { reports: OutboxReport[]; send: () => void } {
  const [reports, setReports] = useState<OutboxReport[]>([]);
  const userId = useCurrentUser().user?.id ?? null;
  // Offline the signed-in grower is not known (the check needs the server): show every kept report.
  const own = userId === null ? reports : reports.filter((r) => r.userId === userId);
  const send = () => void (userId !== null && sendWaitingReports(userId).catch(() => undefined));
  useEffect(() => {
    let live = true;
    const read = () => void outboxReports().then((all) => live && setReports(all), () => undefined);
    const send = () => void (userId !== null && sendWaitingReports(userId).catch(() => undefined));
    const onVisible = () => document.visibilityState === 'visible' && send();
    const stop = onOutboxChange(read);
    read();
    send();
    window.addEventListener('online', send);
    document.addEventListener('visibilitychange', onVisible);
    return () => {
      live = false;
      stop();
      window.removeEventListener('online', send);
      document.removeEventListener('visibilitychange', onVisible);
    };
  }, [userId]);
  return { reports: own, send };
}
