import { LABELS } from '@shared/domain/codes';
import { Page } from '../components/page';
import { RequireRole } from '../features/auth/components/require-role';
import { useCurrentUser } from '../features/auth/api';
import { DigestSettings } from '../features/email/components/digest-settings';
import { SavedPlaceList } from '../features/places/components/saved-place-list';
import { MembershipPanel } from '../features/support/components/membership-panel';
import { DateText } from '../features/units/components/date-text';
import { UnitsControl } from '../features/units/components/units-control';
import { FollowList } from '../features/follows/components/follow-list';

export default function AccountRoute() {
  const { user } = useCurrentUser();
  return (
    <RequireRole role="grower">
      {user && (
        <Page title="My account">
          <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-2 rounded-lg border border-fig-100 bg-white p-5">
            <dt className="text-ink/70">Name</dt>
            <dd className="min-w-0 break-words">{user.displayName}</dd>
            <dt className="text-ink/70">E-mail</dt>
            <dd className="min-w-0 break-words">{user.email}</dd>
            <dt className="text-ink/70">Role</dt>
            <dd>{LABELS.role[user.role]}</dd>
            <dt className="text-ink/70">Member since</dt>
            <dd>
              <DateText iso={user.createdAt} />
            </dd>
          </dl>
          <section className="mt-6 rounded-lg border border-fig-100 bg-white p-5" aria-labelledby="units-title">
            <h2 id="units-title" className="mb-2 text-lg font-semibold text-fig-900">
              Units and dates
            </h2>
            <UnitsControl />
          </section>
          <div className="mt-6">
            <DigestSettings />
          </div>
          <div className="mt-6">
            <MembershipPanel />
          </div>
          <section className="mt-6" aria-labelledby="follows-title">
            <h2 id="follows-title" className="mb-2 text-lg font-semibold text-fig-900">
              Following
            </h2>
            <FollowList />
          </section>
          <section className="mt-6" aria-labelledby="saved-places-title">
            <h2 id="saved-places-title" className="mb-2 text-lg font-semibold text-fig-900">
              Saved places
            </h2>
            <SavedPlaceList />
          </section>
        </Page>
      )}
    </RequireRole>
  );
}
