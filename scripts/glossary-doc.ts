/** Writes docs/glossary.md from the glossary module. */
import { writeFileSync } from 'node:fs';
import { glossaryMarkdown } from '../shared/glossary/glossary-doc';

writeFileSync(new URL('../docs/glossary.md', import.meta.url), glossaryMarkdown());
