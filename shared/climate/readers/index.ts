export * from './csv-reader';
export * from './detect-format';
export * from './isd-lite-reader';
export * from './iso-time';
export * from './parse-result';
export { SeriesBuilder } from './series-builder';

import { createCsvParser, type CsvParserOptions } from './csv-reader';
import type { WeatherFileFormat } from './detect-format';
import { createIsdLiteParser } from './isd-lite-reader';
import type { LineParser } from './parse-result';

/** A parser for the given format. */
export function createParser(format: WeatherFileFormat, options: CsvParserOptions = {}): LineParser {
  return format === 'isd-lite' ? createIsdLiteParser() : createCsvParser(options);
}

import type { CsvMapping } from './csv-reader';
import { detectFormat } from './detect-format';
import type { ParseResult } from './parse-result';

export interface ParseTextOptions {
  /** Detected from the first non-blank line when not given. */
  format?: WeatherFileFormat;
  mapping?: CsvMapping;
}

/** Parses a whole file held in memory (the streaming parsers do the work). */
export function parseWeatherText(
  text: string,
  options: ParseTextOptions = {},
): ParseResult & { format: WeatherFileFormat } {
  const lines = text.split('\n');
  const firstLine = lines.find((l) => l.trim() !== '') ?? '';
  const format = options.format ?? detectFormat(firstLine);
  const parser = createParser(format, { mapping: options.mapping });
  lines.forEach((line, i) => {
    parser.push(line, i + 1);
  });
  return { ...parser.finish(), format };
}
