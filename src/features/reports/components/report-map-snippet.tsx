/** The report's public grid cell, drawn as a small locator (no map tiles needed). */
export function ReportMapSnippet({ lat, lon }: { lat: number; lon: number }) {
  // Equirectangular placement on a world frame: enough to show roughly where on Earth.
  const x = ((lon + 180) / 360) * 240;
  const y = ((90 - lat) / 180) * 120;
  return (
    <figure className="overflow-hidden rounded-lg border border-fig-100 bg-leaf-100/50">
      <svg viewBox="0 0 240 120" className="h-auto w-full" role="img" aria-label={`Grid cell near ${lat}, ${lon}`}>
        <rect width="240" height="120" fill="#eef3ea" />
        {[-60, -30, 0, 30, 60].map((g) => (
          <line key={`lat${g}`} x1="0" x2="240" y1={((90 - g) / 180) * 120} y2={((90 - g) / 180) * 120} stroke="#cfdcc8" strokeWidth="0.5" />
        ))}
        {[-120, -60, 0, 60, 120].map((g) => (
          <line key={`lon${g}`} y1="0" y2="120" x1={((g + 180) / 360) * 240} x2={((g + 180) / 360) * 240} stroke="#cfdcc8" strokeWidth="0.5" />
        ))}
        <circle cx={x} cy={y} r="6" fill="#6b3a5b" fillOpacity="0.25" />
        <circle cx={x} cy={y} r="2.5" fill="#6b3a5b" />
      </svg>
    </figure>
  );
}
