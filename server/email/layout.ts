/**
 * One description of a message renders both parts: a plain-text part and a simple HTML part with
 * inline styles only (mail clients drop style sheets) and no remote images.
 */

export type Block =
  | { kind: 'p'; text: string }
  | { kind: 'button'; label: string; url: string }
  | { kind: 'link'; label: string; url: string }
  | { kind: 'list'; items: string[] }
  | { kind: 'table'; head: string[]; rows: string[][] }
  | { kind: 'note'; text: string };

export interface EmailContent {
  subject: string;
  heading: string;
  blocks: Block[];
  /** Small print under the message: why it came, how to stop it. */
  footer: Block[];
}

export interface RenderedEmail {
  subject: string;
  text: string;
  html: string;
}

const COLORS = { plum: '#6b3a5b', plumDark: '#552c48', blush: '#f8f1f5', border: '#efdfe8', leaf: '#5e8a57', leafPale: '#e4eedf', paper: '#faf6ef', ink: '#2b2230', muted: '#6f6474' };
const FONT = "'Fira Sans', 'Segoe UI', Helvetica, Arial, sans-serif";

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function blockHtml(block: Block, small = false): string {
  const size = small ? '13px' : '16px';
  const color = small ? COLORS.muted : COLORS.ink;
  switch (block.kind) {
    case 'p':
      return `<p style="margin:0 0 14px;font-size:${size};line-height:1.5;color:${color}">${escapeHtml(block.text).replace(/\n/g, '<br>')}</p>`;
    case 'note':
      return `<p style="margin:0 0 14px;padding:10px 14px;border-left:4px solid ${COLORS.leaf};background:${COLORS.leafPale};font-size:14px;line-height:1.5;color:${COLORS.ink}">${escapeHtml(block.text)}</p>`;
    case 'button':
      return `<p style="margin:20px 0"><a href="${escapeHtml(block.url)}" style="display:inline-block;padding:11px 20px;border-radius:6px;background:${COLORS.plum};color:#ffffff;font-weight:600;font-size:16px;text-decoration:none">${escapeHtml(block.label)}</a></p>
<p style="margin:0 0 14px;font-size:13px;line-height:1.5;color:${COLORS.muted}">If the button does not work, paste this address into your browser:<br><span style="word-break:break-all;color:${COLORS.plum}">${escapeHtml(block.url)}</span></p>`;
    case 'link':
      return `<p style="margin:0 0 10px;font-size:${size};line-height:1.5;color:${color}"><a href="${escapeHtml(block.url)}" style="color:${COLORS.plum}">${escapeHtml(block.label)}</a></p>`;
    case 'list':
      return `<ul style="margin:0 0 14px;padding-left:20px;font-size:${size};line-height:1.5;color:${color}">${block.items.map((i) => `<li style="margin:0 0 6px">${escapeHtml(i)}</li>`).join('')}</ul>`;
    case 'table':
      return `<table role="presentation" cellpadding="0" cellspacing="0" style="width:100%;border-collapse:collapse;margin:0 0 16px;font-size:14px;color:${COLORS.ink}">
<tr>${block.head.map((h) => `<th align="left" style="padding:6px 8px;border-bottom:2px solid ${COLORS.border};color:${COLORS.plumDark};font-weight:600">${escapeHtml(h)}</th>`).join('')}</tr>
${block.rows.map((row, i) => `<tr style="background:${i % 2 ? COLORS.blush : '#ffffff'}">${row.map((cell) => `<td style="padding:6px 8px;border-bottom:1px solid ${COLORS.border};vertical-align:top">${escapeHtml(cell)}</td>`).join('')}</tr>`).join('\n')}
</table>`;
  }
}

function wrap(text: string, width = 72): string {
  const words = text.split(/\s+/).filter(Boolean);
  const lines: string[] = [];
  let line = '';
  for (const word of words) {
    if (line && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines.join('\n');
}

function blockText(block: Block): string {
  switch (block.kind) {
    case 'p':
      return block.text.split('\n').map((line) => wrap(line)).join('\n');
    case 'note':
      return wrap(`Note: ${block.text}`);
    case 'button':
    case 'link':
      return `${block.label}:\n${block.url}`;
    case 'list':
      return block.items.map((i) => `- ${i}`).join('\n');
    case 'table':
      return block.rows.map((row) => `- ${row.map((cell, i) => (block.head[i] ? `${block.head[i]}: ${cell}` : cell)).join(' | ')}`).join('\n');
  }
}

/** Render the message in Syconium's look: a plum band with the name, a white card on warm paper. */
export function renderEmail(content: EmailContent): RenderedEmail {
  const text = [`SYCONIUM · the fig ripening atlas`, '', content.heading, '='.repeat(Math.min(content.heading.length, 72)), '', ...content.blocks.map(blockText).flatMap((b) => [b, '']), '--', ...content.footer.map(blockText)].join('\n');
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>${escapeHtml(content.subject)}</title></head>
<body style="margin:0;padding:0;background:${COLORS.paper};font-family:${FONT}">
<table role="presentation" cellpadding="0" cellspacing="0" style="width:100%;background:${COLORS.paper}"><tr><td align="center" style="padding:24px 12px">
<table role="presentation" cellpadding="0" cellspacing="0" style="width:100%;max-width:600px;border-collapse:collapse">
<tr><td style="background:${COLORS.plum};border-radius:10px 10px 0 0;padding:16px 24px;color:#ffffff;font-size:20px;font-weight:600;letter-spacing:0.2px">
<span style="display:inline-block;width:12px;height:12px;border-radius:6px;background:${COLORS.leaf};margin-right:8px"></span>Syconium <span style="font-weight:400;font-size:14px;opacity:0.85">· the fig ripening atlas</span></td></tr>
<tr><td style="background:#ffffff;border:1px solid ${COLORS.border};border-top:0;border-radius:0 0 10px 10px;padding:24px">
<h1 style="margin:0 0 16px;font-size:22px;line-height:1.3;color:${COLORS.plumDark}">${escapeHtml(content.heading)}</h1>
${content.blocks.map((b) => blockHtml(b)).join('\n')}
</td></tr>
<tr><td style="padding:16px 24px">${content.footer.map((b) => blockHtml(b, true)).join('\n')}</td></tr>
</table></td></tr></table>
</body></html>`;
  return { subject: content.subject, text, html };
}
