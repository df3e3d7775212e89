/**
 * The glossary as Markdown, for docs/glossary.md (the README links to it). A test checks that the
 * file matches this output, so the documentation and the screens never name a figure differently.
 */
import { designValueExplain, designValueName, glossary, type Term } from './glossary';

const cell = (s: string) => s.replace(/\|/g, '\\|');

export function glossaryMarkdown(): string {
  const lines = [
    '# Glossary',
    '',
    'One name per figure for each reader: designers and estimators read the trade’s terms on their screens and in the CSV exports; homeowners read plain words in the report, its PDF and the e-mail. This file is written from `shared/glossary/glossary.ts`; `npm run glossary:doc` writes it again after a change.',
    '',
    '| Designer’s term | Homeowner’s words | What it means | CSV column |',
    '|---|---|---|---|',
  ];
  for (const t of Object.values(glossary) as Term[]) {
    lines.push(`| ${cell(t.designer)} | ${cell(t.homeowner)} | ${cell(t.explain)} | ${t.csv ? `\`${t.csv}\`` : ''} |`);
  }
  lines.push(
    '',
    '## The named design values',
    '',
    '| Designer’s term | Homeowner’s words | What it means |',
    '|---|---|---|',
  );
  for (const label of ['99 %', '99.6 %', 'Extreme mean', '5-year', '10-year', '20-year', '50-year']) {
    lines.push(
      `| ${cell(designValueName(label))} | ${cell(designValueName(label, 'homeowner'))} | ${cell(designValueExplain(label))} |`,
    );
  }
  return lines.join('\n') + '\n';
}
