import { LABELS } from '@shared/domain/codes';

/** Audit entries store the records' own field names; editors read these words instead. */
const FIELD_LABELS: Record<string, string> = {
  varietyId: 'Variety',
  proposedVarietyName: 'Proposed variety name',
  treeId: 'Tree',
  userId: 'Grower',
  lat: 'Latitude (exact)',
  lon: 'Longitude (exact)',
  gridLat: 'Grid cell latitude',
  gridLon: 'Grid cell longitude',
  form: 'Growing form',
  origin: 'Plant origin',
  yearPlanted: 'Year planted',
  season: 'Season',
  crop: 'Crop',
  outcome: 'Outcome',
  firstRipeDate: 'First ripe fig',
  lastHarvestDate: 'Last harvest',
  springFrostDate: 'Last spring frost',
  fallFrostDate: 'First fall frost',
  pinched: 'Pinched the tips',
  pinchedDate: 'Pinched on',
  winterProtection: 'Winter protection',
  feeding: 'Feeding',
  watering: 'Watering',
  notes: 'Notes',
  status: 'Status',
  hiddenReason: 'Reason for hiding',
  createdAt: 'Created',
  updatedAt: 'Last changed',
  publishedAt: 'Published',
  photoId: 'Photo',
  fileName: 'File',
  photoFiles: 'Photo files',
  flagId: 'Flag',
  reason: 'Reason',
  role: 'Role',
  name: 'Name',
  synonyms: 'Other names',
  figType: 'Fig type',
  ripeningClass: 'Ripening class',
  typicalDaysToRipen: 'Typical days to ripen',
  isFictional: 'Fictional (demo)',
  sources: 'Sources',
  reviewNote: 'Review note',
  mergedIntoId: 'Merged into',
  suspicions: 'Doubts raised',
  reviewed: 'Marked as fine',
  retiredAt: 'Retired',
  geometry: 'Outline',
  created: 'Added',
  updated: 'Changed',
  rows: 'Rows',
  width: 'Width (px)',
  height: 'Height (px)',
};

/** A field's label, or its name split into words ("hiddenReason" → "Hidden reason"). */
export function fieldLabel(key: string): string {
  if (FIELD_LABELS[key]) return FIELD_LABELS[key];
  const words = key.replace(/([a-z0-9])([A-Z])/g, '$1 $2').replace(/[_-]+/g, ' ').toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** Coded values in words where the app has a label for them (outcome "no-fruit" → "No fruit formed"...). */
export function valueLabel(key: string, value: string): string {
  const table: Record<string, Record<string, string> | undefined> = {
    form: LABELS.growingForm,
    origin: LABELS.plantOrigin,
    crop: LABELS.crop,
    outcome: LABELS.outcome,
    role: LABELS.role,
    figType: LABELS.figType,
  };
  if (value === 'true') return 'yes';
  if (value === 'false') return 'no';
  return table[key]?.[value] ?? value;
}
