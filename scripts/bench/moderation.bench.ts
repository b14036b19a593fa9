// `npm run bench -- moderation`: the moderation rules over synthetic reports (200k, as on a large
// atlas). Prints wall and CPU time; the target is a rule run under 5 s of CPU. The queue and the
// overview reuse the last run until reports, varieties or the audit log change (moderation.repo.ts).
import { findSuspiciousReports, type ReportForRules } from '../../shared/domain/moderation-rules';

let seed = 1;
const random = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
const day = (doy: number) => new Date(Date.UTC(2024, 0, doy)).toISOString().slice(0, 10);

const reports: ReportForRules[] = Array.from({ length: 200_000 }, (_, i) => {
  const spring = 80 + Math.floor(random() * 50);
  const ripe = spring + 90 + Math.floor(random() * 100);
  return {
    id: i,
    treeId: Math.floor(i / 3),
    varietyId: 1 + Math.floor(random() * 40),
    lat: 30 + random() * 15,
    lon: -120 + random() * 45,
    season: 2024,
    crop: random() < 0.3 ? 'breba' : 'main',
    outcome: random() < 0.5 ? 'ripened' : 'unripe',
    form: 'ground',
    springFrostDate: day(spring),
    firstRipeDate: day(ripe),
    lastHarvestDate: day(ripe + 20),
    fallFrostDate: day(Math.min(365, ripe + 40)),
    pinchedDate: null,
  };
});
const varieties = Array.from({ length: 40 }, (_, i) => ({ id: i + 1, name: `V${i + 1}`, typicalDaysToRipen: 120 + i }));

for (let run = 1; run <= 2; run++) {
  const start = performance.now();
  const cpu = process.cpuUsage();
  const found = findSuspiciousReports(reports, varieties);
  const used = process.cpuUsage(cpu);
  // CPU time is printed beside wall time: on a shared machine the wall clock mostly measures the neighbours
  console.log(`rules over ${reports.length.toLocaleString('en')} reports: ${Math.round(performance.now() - start)} ms wall, ${Math.round((used.user + used.system) / 1000)} ms CPU (${found.size} picked out)`);
}
