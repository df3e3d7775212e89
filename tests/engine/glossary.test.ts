/**
 * One name per concept per reader: the glossary's terms are distinct, the homeowner's words carry
 * none of the trade's terms, the CSV columns are snake_case with their unit, and docs/glossary.md
 * is the module's own output.
 */
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { describe, it } from 'node:test';
import {
  designValueName,
  designValueTag,
  glossary,
  gridStepText,
  term,
  type Term,
} from '../../shared/glossary/glossary';
import { glossaryMarkdown } from '../../shared/glossary/glossary-doc';

const terms = Object.values(glossary) as Term[];

describe('glossary', () => {
  it('gives each concept its own name for each reader', () => {
    for (const audience of ['designer', 'homeowner'] as const) {
      const names = terms.map((t) => t[audience].toLowerCase());
      assert.equal(new Set(names).size, names.length, `${audience}: a name is used for two concepts`);
    }
  });

  it('keeps the trade’s terms and the coined words out of the homeowner’s words', () => {
    const jargon = [
      /unmet/i,
      /design/i,
      /set-point/i,
      /life-cycle/i,
      /equivalent/i,
      /degree-hour/i,
      /\b(ladder|rung|sag)\b/i,
      /balance point/i,
    ];
    for (const t of terms) for (const j of jargon) assert.doesNotMatch(t.homeowner, j, t.homeowner);
    for (const t of terms) assert.doesNotMatch(`${t.designer} ${t.explain}`, /\b(ladder|rung|sag)\b/i);
  });

  it('names CSV columns in snake_case, with the SI unit where the figure has one', () => {
    for (const t of terms) if (t.csv) assert.match(t.csv, /^[a-z0-9]+(_[a-z0-9]+)*$/);
    assert.equal(glossary.designLoad.csv, 'design_load_w');
    assert.equal(glossary.lowestIndoor.csv, 'lowest_indoor_c');
  });

  it('names the design values for each reader, with the chance of a return period in a winter', () => {
    assert.equal(designValueName('Extreme mean'), 'Mean annual minimum');
    assert.equal(designValueName('Extreme mean', 'homeowner'), 'the average coldest hour of the year');
    assert.equal(designValueName('50-year'), '50-year return period');
    assert.equal(designValueName('50-year', 'homeowner'), 'the cold to expect once in 50 years');
    assert.equal(designValueTag('20-year'), '20-yr');
    assert.equal(term('unmetHours', 'homeowner'), 'Hours a year the house could get cooler than you set it');
    // The grid step in the reader's unit: 0.5 K = 0.9 °F (a difference, no offset).
    assert.equal(gridStepText(0.5, 'SI'), 'Show every 0.5 K step');
    assert.equal(gridStepText(0.5, 'IP'), 'Show every 0.9 °F step');
  });

  it('is what docs/glossary.md says', () => {
    assert.equal(readFileSync(new URL('../../docs/glossary.md', import.meta.url), 'utf8'), glossaryMarkdown());
  });
});
