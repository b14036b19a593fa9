import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router';
import { varietyPageQueries } from '../features/varieties/api';
import { VarietyProfile } from '../features/varieties/components/variety-profile';

export default function VarietyRoute() {
  const id = Number(useParams().id);
  const page = useQuery({ ...varietyPageQueries.page(id), enabled: Number.isInteger(id) && id > 0 });
  return (
    <div className="h-full overflow-y-auto">
      <div className="mx-auto max-w-5xl px-4 py-8">
        {page.isLoading && <p className="text-ink/70">Loading…</p>}
        {(page.isError || !(Number.isInteger(id) && id > 0)) && (
          <div>
            <h1 className="text-xl font-semibold">Variety not found</h1>
            <p className="mt-2 text-ink/80">
              It may have been merged into another name. <Link to="/here" className="text-fig-600 underline">See what ripens near you</Link>.
            </p>
          </div>
        )}
        {page.data && <VarietyProfile page={page.data} />}
      </div>
    </div>
  );
}
