/** The Syconium mark: a ripe fig in section, drawn for this project. */
export function Logo({ className = 'h-7 w-7' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <path d="M16 3c1.5 0 2.5 1 2.6 2.4 5.2 2 8.4 7.6 8.4 13.1C27 25 22.2 29 16 29S5 25 5 18.5c0-5.5 3.2-11.1 8.4-13.1C13.5 4 14.5 3 16 3z" fill="#6b3a5b" />
      <path d="M16 9.5c3.6 1.2 6 4.6 6 8.6 0 3.9-2.7 6.4-6 6.4s-6-2.5-6-6.4c0-4 2.4-7.4 6-8.6z" fill="#e9a0a8" />
      <circle cx="14" cy="17" r="0.9" fill="#f3d9a4" />
      <circle cx="17.5" cy="19.5" r="0.9" fill="#f3d9a4" />
      <circle cx="16.5" cy="15" r="0.9" fill="#f3d9a4" />
      <path d="M16 3c1 0 1.6.7 1.7 1.6" stroke="#5e8a57" strokeWidth="2" fill="none" strokeLinecap="round" />
    </svg>
  );
}
