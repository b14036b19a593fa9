import { useSearchParams } from 'react-router';
import { MODERATION_KINDS, type ModerationKind } from '@shared/schemas/moderation';
import { ModerationQueue } from '../features/moderation/components/moderation-queue';

export default function EditorsModerationRoute() {
  const [params] = useSearchParams();
  const kind = params.get('kind');
  return (
    <div className="mx-auto flex max-w-5xl flex-col gap-5 px-4 py-8">
      <div>
        <h1 className="text-2xl font-semibold text-fig-900">Moderation</h1>
        <p className="mt-1 max-w-2xl text-ink/80">
          Reports growers flagged, and reports our rules picked out: dates out of order, ripening far outside the variety’s usual season, or a result unlike nearly every nearby tree of the same variety. Hide a report with a reason (its grower sees it), restore it, clear a flag, or mark a picked-out report as fine.
        </p>
      </div>
      <ModerationQueue initialKind={(MODERATION_KINDS as readonly string[]).includes(kind ?? '') ? (kind as ModerationKind) : 'all'} />
    </div>
  );
}
