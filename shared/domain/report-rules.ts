/**
 * Rules a harvest report must keep across its fields (the single-field limits live in the zod
 * schema). Pure: used by the shared schema (form and API) and again by the server after merging a
 * partial edit into the stored report.
 */

export interface ReportRuleInput {
  season: number;
  yearPlanted?: number | null;
  outcome: string;
  firstRipeDate?: string | null;
  lastHarvestDate?: string | null;
  springFrostDate?: string | null;
  fallFrostDate?: string | null;
  pinched?: boolean;
  pinchedDate?: string | null;
}

/** One broken rule, on the field a grower should correct. */
export interface ReportRuleIssue {
  field: keyof ReportRuleInput;
  message: string;
}

const DATE_LABELS = {
  springFrostDate: 'last spring frost',
  firstRipeDate: 'first ripe fig',
  lastHarvestDate: 'last harvest',
  fallFrostDate: 'first fall frost',
} as const;
type DateField = keyof typeof DATE_LABELS;

/**
 * The season's dates must run in order: last spring frost < first ripe fig <= last harvest <= first
 * fall frost, all in the season year. Each broken pair is reported on the later field, so a grower
 * sees the message beside the date that is out of place.
 */
export function reportRuleIssues(input: ReportRuleInput): ReportRuleIssue[] {
  const issues: ReportRuleIssue[] = [];
  const dates: DateField[] = ['springFrostDate', 'firstRipeDate', 'lastHarvestDate', 'fallFrostDate'];

  for (const field of [...dates, 'pinchedDate'] as const) {
    const value = input[field];
    if (value && Number(value.slice(0, 4)) !== input.season) {
      issues.push({ field, message: `Use a date in the season year ${input.season}` });
    }
  }

  // Compare each present date with the nearest present date before it.
  for (let i = 1; i < dates.length; i++) {
    const later = dates[i]!;
    const laterValue = input[later];
    if (!laterValue || issues.some((issue) => issue.field === later)) continue;
    for (let j = i - 1; j >= 0; j--) {
      const earlier = dates[j]!;
      const earlierValue = input[earlier];
      if (!earlierValue || issues.some((issue) => issue.field === earlier)) continue;
      // Fruit cannot ripen on the day of the last spring frost; the other steps may share a day.
      const strict = earlier === 'springFrostDate';
      const bad = strict ? laterValue <= earlierValue : laterValue < earlierValue;
      if (bad) {
        issues.push({
          field: later,
          message: `The ${DATE_LABELS[later]} must come ${strict ? 'after' : 'on or after'} the ${DATE_LABELS[earlier]} (${earlierValue})`,
        });
      }
      break;
    }
  }

  if (input.outcome !== 'ripened') {
    for (const field of ['firstRipeDate', 'lastHarvestDate'] as const) {
      if (input[field]) issues.push({ field, message: 'Only a crop that ripened has this date; clear it or set the outcome to “Ripened”' });
    }
  }
  if (input.pinchedDate && !input.pinched) {
    issues.push({ field: 'pinchedDate', message: 'Tick “pinched the tips” or clear this date' });
  }
  if (input.yearPlanted != null && input.yearPlanted > input.season) {
    issues.push({ field: 'yearPlanted', message: `The tree must be planted in or before the season year ${input.season}` });
  }
  return issues;
}
