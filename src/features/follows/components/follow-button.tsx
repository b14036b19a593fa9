import { useQuery } from '@tanstack/react-query';
import { Link, useLocation } from 'react-router';
import { Button } from '../../../components/button';
import { useCurrentUser } from '../../auth/api';
import { followQueries, useFollowMutation } from '../api';

type Target = { kind: 'variety'; varietyId: number; name: string } | { kind: 'place'; name: string; lat: number; lon: number };

/** Follow a variety or a place: its news then comes in the weekly nearby digest. */
export function FollowButton({ target }: { target: Target }) {
  const { user } = useCurrentUser();
  const location = useLocation();
  const list = useQuery({ ...followQueries.mine(), enabled: !!user });
  const mutation = useFollowMutation();
  if (!user)
    return (
      <Link to={`/sign-in?next=${encodeURIComponent(location.pathname + location.search)}`} className="text-sm font-medium text-fig-600 underline">
        Sign in to follow {target.kind === 'variety' ? target.name : 'this place'}
      </Link>
    );
  const followedPlace = target.kind === 'place' ? list.data?.places.find((p) => Math.abs(p.lat - target.lat) < 1e-6 && Math.abs(p.lon - target.lon) < 1e-6) : undefined;
  const following = target.kind === 'variety' ? !!list.data?.varieties.some((v) => v.varietyId === target.varietyId) : !!followedPlace;
  const label = target.kind === 'variety' ? target.name : 'this place';
  return (
    <div className="flex flex-col items-start gap-1">
      <Button
        type="button"
        variant={following ? 'secondary' : 'primary'}
        aria-pressed={following}
        disabled={list.isLoading || mutation.isPending}
        onClick={() =>
          mutation.mutate(
            following
              ? target.kind === 'variety'
                ? { unfollowVariety: target.varietyId }
                : { unfollowPlace: followedPlace!.id }
              : { follow: target.kind === 'variety' ? { kind: 'variety', varietyId: target.varietyId } : { kind: 'place', name: target.name, lat: target.lat, lon: target.lon } },
          )
        }
      >
        {following ? `Following ${label} ✓` : `Follow ${label}`}
      </Button>
      <p className="text-xs text-ink/70" role="status">
        {mutation.error ? mutation.error.message : following ? 'Its news comes in your weekly digest.' : 'Get its news in your weekly digest.'}
      </p>
    </div>
  );
}
