// The acknowledgements of a recorded report as static HTML, written into the output's
// text/html so that a plain `jupyter nbconvert --to html` export shows them.

import { el } from './dom';
import type { Report } from './payload';
import { SEVERITY_WORD } from './present';
import { type Acknowledgement, findingKey } from './render';

export const ACK_BLOCK = /<div class="chemcheck-acknowledgements"[\s\S]*?<!-- end of chemcheck acknowledgements -->/g;

/**
 * The acknowledgements as static HTML (built as DOM, serialised: every string is escaped), so
 * that a plain `jupyter nbconvert --to html` export shows them under the recorded report.
 */
export function ackBlock(report: Report, acks: Acknowledgement[]): string {
  const byKey = new Map(acks.map(a => [a.finding, a]));
  const mine = report.findings.filter(f => byKey.has(findingKey(f)));
  if (mine.length === 0) {
    return '';
  }
  const box = el('div', 'chemcheck-acknowledgements');
  box.setAttribute('style', 'border-left:4px dashed #888888;padding-left:8px;margin:4px 0');
  box.appendChild(el('strong', undefined, 'Acknowledgements'));
  const ul = el('ul');
  for (const f of mine) {
    const a = byKey.get(findingKey(f))!;
    const when = a.when && !Number.isNaN(new Date(a.when).getTime()) ? `, ${new Date(a.when).toUTCString().replace(/:\d\d GMT$/, ' UTC')}` : '';
    ul.appendChild(
      el('li', undefined, `${SEVERITY_WORD[f.severity]} (${f.title || f.rule}): acknowledged by ${a.who || 'a reviewer'}${when}${a.note ? ': ' + a.note : ''}`)
    );
  }
  box.appendChild(ul);
  return box.outerHTML + '<!-- end of chemcheck acknowledgements -->';
}

