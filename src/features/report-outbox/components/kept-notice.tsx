import { Link } from 'react-router';

/** After a report was written with no connection: where it is and what happens next. */
export function KeptNotice({ onAnother }: { onAnother: () => void }) {
  return (
    <div role="status" className="rounded-lg border border-amber-soft bg-amber-soft/25 p-4 text-sm text-ink">
      <p className="font-semibold text-fig-900">Kept on this phone</p>
      <p className="mt-1">
        There is no connection just now. Your report and its photos are saved on this phone and will be sent as soon as the connection returns, even if you
        close this page (open Syconium again to send them). The bar under the header counts the reports waiting.
      </p>
      <p className="mt-3 flex flex-wrap gap-3">
        <button type="button" onClick={onAnother} className="rounded-md bg-fig-700 px-3 py-1.5 font-medium text-white hover:bg-fig-800">
          Write another report
        </button>
        <Link to="/" className="rounded-md px-3 py-1.5 font-medium text-fig-700 hover:bg-fig-50">
          Back to the atlas
        </Link>
      </p>
    </div>
  );
}
