import { Link } from 'react-router';

/** A variety's name, linking to its own page (every variety name in the app goes through this). */
export function VarietyLink({ id, name, className = '' }: { id: number | null | undefined; name: string; className?: string }) {
  if (!id) return <span className={className}>{name}</span>;
  return (
    <Link to={`/varieties/${id}`} className={`font-medium text-fig-700 underline decoration-fig-200 underline-offset-2 hover:decoration-fig-600 ${className}`}>
      {name}
    </Link>
  );
}
