import type { FollowedNews } from '../follows/follows-digest';
import { renderEmail, type Block, type RenderedEmail } from './layout';

/** Syconium's messages, in its own voice. Every function returns both parts. */

const SIGN_OFF: Block = { kind: 'p', text: 'Happy growing,\nthe Syconium atlas' };

export function verifyEmailMessage(input: { displayName: string; url: string; expiresHours: number }): RenderedEmail {
  return renderEmail({
    subject: 'Confirm your e-mail for Syconium',
    heading: `Welcome to the atlas, ${input.displayName}`,
    blocks: [
      { kind: 'p', text: 'Thank you for joining Syconium. One step is left: confirm that this address is yours. Until then you can browse the atlas and save your harvest reports as drafts; they are published as soon as the address is confirmed.' },
      { kind: 'button', label: 'Confirm my e-mail', url: input.url },
      { kind: 'p', text: `The link works once and for ${input.expiresHours} hours. You can ask for a new one from the banner on the site.` },
      SIGN_OFF,
    ],
    footer: [{ kind: 'p', text: 'You get this message because someone created a Syconium account with this address. If it was not you, ignore it: nothing is published until the address is confirmed.' }],
  });
}

/** To the owner of an address someone tried to join with: sign-up answers the same either way, so the owner hears it here. */
export function signUpAttemptMessage(input: { displayName: string; signInUrl: string; forgotUrl: string }): RenderedEmail {
  return renderEmail({
    subject: 'Someone tried to join Syconium with your address',
    heading: 'You already have an account',
    blocks: [
      { kind: 'p', text: `Hello ${input.displayName}, someone (perhaps you) just tried to create a new Syconium account with this address. It already has an account, so nothing was created and nothing changed.` },
      { kind: 'button', label: 'Sign in', url: input.signInUrl },
      { kind: 'p', text: 'Forgotten your password? Ask for a link to choose a new one:' },
      { kind: 'link', label: 'Choose a new password', url: input.forgotUrl },
      SIGN_OFF,
    ],
    footer: [{ kind: 'p', text: 'If it was not you, you can ignore this message: your account and password are as they were.' }],
  });
}

export function resetPasswordMessage(input: { displayName: string; url: string; expiresMinutes: number }): RenderedEmail {
  return renderEmail({
    subject: 'Choose a new Syconium password',
    heading: 'A new password for your account',
    blocks: [
      { kind: 'p', text: `Hello ${input.displayName}, someone (we hope you) asked to reset the password of your Syconium account.` },
      { kind: 'button', label: 'Choose a new password', url: input.url },
      { kind: 'p', text: `The link works once and for ${input.expiresMinutes} minutes. Setting a new password signs your account out everywhere else.` },
      SIGN_OFF,
    ],
    footer: [{ kind: 'p', text: 'If you did not ask for this, ignore this message: your password stays as it is.' }],
  });
}

export interface DigestItem {
  variety: string;
  crop: string;
  form: string;
  season: number;
  firstRipe: string;
  /** Town-level wording seen from the home place, e.g. "about 12 km north-east". */
  where: string;
  /** Public grid position, never the exact point. */
  grid: string;
}

/** A digest lists at most this many reports; the rest are counted and left to the atlas. */
export const DIGEST_MAX_ROWS = 30;

export function digestMessage(input: {
  displayName: string;
  homeName: string;
  /** The radius in the grower's unit, e.g. "50 km" or "31 mi". */
  radius: string;
  since: string;
  items: DigestItem[];
  /** News of the varieties and places the grower follows. */
  followed?: FollowedNews;
  varietyUrl?: (id: number) => string;
  atlasUrl: string;
  settingsUrl: string;
  unsubscribeUrl: string;
}): RenderedEmail {
  const count = input.items.length;
  const varieties = new Set(input.items.map((i) => i.variety)).size;
  const followed = followedBlocks(input.followed, input.radius, input.varietyUrl);
  return renderEmail({
    subject: count ? `${count} new ripening report${count === 1 ? '' : 's'} near ${input.homeName}` : `News of the figs you follow`,
    heading: count ? `New ripening reports within ${input.radius}` : 'News of the figs you follow',
    blocks: [
      ...(count
        ? ([
            {
              kind: 'p',
              text: `Hello ${input.displayName}, since ${input.since} growers posted ${count} report${count === 1 ? '' : 's'} of figs that ripened within ${input.radius} of ${input.homeName}, covering ${varieties} variet${varieties === 1 ? 'y' : 'ies'}.`,
            },
            {
              kind: 'table',
              head: ['Variety', 'Season and crop', 'Grown', 'First ripe', `From ${input.homeName}`],
              rows: input.items.slice(0, DIGEST_MAX_ROWS).map((i) => [i.variety, `${i.season}, ${i.crop}`, i.form, i.firstRipe, `${i.where} · grid ${i.grid}`]),
            },
            ...(count > DIGEST_MAX_ROWS ? [{ kind: 'p' as const, text: `…and ${count - DIGEST_MAX_ROWS} more on the atlas.` }] : []),
          ] satisfies Block[])
        : ([{ kind: 'p', text: `Hello ${input.displayName}, nothing new ripened near ${input.homeName} since ${input.since}, but there is news of what you follow.` }] satisfies Block[])),
      ...followed,
      { kind: 'note', text: 'Places are shown on the atlas’s public 5 km grid; growers’ exact gardens stay private.' },
      { kind: 'button', label: 'See the atlas around your home', url: input.atlasUrl },
      SIGN_OFF,
    ],
    footer: [
      { kind: 'p', text: `You get this weekly digest because you asked for it on your Syconium account page (radius ${input.radius}).` },
      { kind: 'link', label: 'Change the radius', url: input.settingsUrl },
      { kind: 'link', label: 'Unsubscribe from this digest', url: input.unsubscribeUrl },
    ],
  });
}

/** The digest's part for followed varieties and places (nothing when there is no news). */
function followedBlocks(news: FollowedNews | undefined, radius: string, varietyUrl?: (id: number) => string): Block[] {
  if (!news) return [];
  const blocks: Block[] = [];
  if (news.varieties.length) {
    blocks.push(
      { kind: 'p', text: 'Varieties you follow, anywhere in the atlas:' },
      {
        kind: 'list',
        items: news.varieties.map((v) => `${v.name}: ${v.reports} new ripened report${v.reports === 1 ? '' : 's'} from ${v.cells} place${v.cells === 1 ? '' : 's'}${varietyUrl ? ` (${varietyUrl(v.varietyId)})` : ''}`),
      },
    );
  }
  if (news.places.length) {
    blocks.push(
      { kind: 'p', text: `Places you follow (within ${radius}):` },
      { kind: 'list', items: news.places.map((p) => `${p.name}: ${p.reports} new ripened report${p.reports === 1 ? '' : 's'} (${p.varieties.join(', ')})`) },
    );
  }
  return blocks;
}

export interface AlertFlag {
  reportId: number;
  variety: string;
  reason: string;
  flaggedBy: string;
}
export interface AlertProposal {
  name: string;
  proposedBy: string;
}

export function editorAlertMessage(input: { displayName: string; flags: AlertFlag[]; proposals: AlertProposal[]; editorsUrl: string }): RenderedEmail {
  const parts = [
    input.flags.length ? `${input.flags.length} flagged report${input.flags.length === 1 ? '' : 's'}` : null,
    input.proposals.length ? `${input.proposals.length} proposed variety name${input.proposals.length === 1 ? '' : 's'}` : null,
  ].filter(Boolean);
  const blocks: Block[] = [{ kind: 'p', text: `Hello ${input.displayName}, this is what arrived for editors since the last summary.` }];
  if (input.flags.length) {
    blocks.push({ kind: 'table', head: ['Report', 'Variety', 'Reason', 'Flagged by'], rows: input.flags.map((f) => [`#${f.reportId}`, f.variety, f.reason, f.flaggedBy]) });
  }
  if (input.proposals.length) {
    blocks.push({ kind: 'list', items: input.proposals.map((p) => `“${p.name}”, proposed by ${p.proposedBy}`) });
  }
  blocks.push(
    input.flags.length
      ? { kind: 'button', label: 'Open the moderation queue', url: `${input.editorsUrl}/moderation` }
      : { kind: 'button', label: 'Review the proposed names', url: `${input.editorsUrl}/varieties` },
    SIGN_OFF,
  );
  return renderEmail({
    subject: `Syconium editors: ${parts.join(' and ')}`,
    heading: 'Waiting for an editor',
    blocks,
    footer: [{ kind: 'p', text: 'Editors and admins get one summary every few minutes at most, however many flags arrive.' }],
  });
}

export function supportReceiptMessage(input: {
  kind: 'first-monthly' | 'renewal' | 'one-off';
  amount: string;
  paidOn: string;
  reference: string;
  tierLabel: string | null;
  membershipUrl: string;
}): RenderedEmail {
  const monthly = input.kind !== 'one-off';
  const what = monthly ? `${input.tierLabel ?? 'Monthly'} membership${input.kind === 'renewal' ? ', renewal' : ''}` : 'One-off contribution';
  return renderEmail({
    subject: input.kind === 'renewal' ? 'Your Syconium membership receipt' : 'Thank you for supporting Syconium',
    heading: input.kind === 'renewal' ? 'Another month of the atlas, thanks to you' : 'Thank you for keeping the atlas open',
    blocks: [
      {
        kind: 'p',
        text: monthly
          ? 'Your membership pays for the map, the climate data work and the hours spent checking varieties and reports. Every page, number and download stays open to everyone, as it always will.'
          : 'Your contribution pays for the map, the climate data work and the hours spent checking varieties and reports. Every page, number and download stays open to everyone, as it always will.',
      },
      { kind: 'table', head: ['Receipt', ''], rows: [['For', what], ['Amount', input.amount], ['Paid on', input.paidOn], ['Reference', input.reference]] },
      ...(monthly ? [{ kind: 'link' as const, label: 'See or cancel your membership', url: input.membershipUrl }] : []),
      SIGN_OFF,
    ],
    footer: [{ kind: 'p', text: 'The payment provider took the card; Syconium never sees or keeps card details. Keep this message as your receipt.' }],
  });
}
