import { AttentionCards } from '../features/moderation/components/attention-cards';

export default function EditorsOverviewRoute() {
  return (
    <div className="mx-auto max-w-4xl px-4 py-8">
      <h1 className="text-2xl font-semibold text-fig-900">Editors’ workspace</h1>
      <p className="mt-2 text-ink/80">Keep the atlas trustworthy: curate varieties, record wasp areas, load climate stations and review reports.</p>
      <h2 className="mt-6 mb-3 text-lg font-semibold text-fig-900">Needs attention</h2>
      <AttentionCards />
    </div>
  );
}
