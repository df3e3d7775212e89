/** Recognises the format of an uploaded hourly file from its first lines. */
import { looksLikeIsdLite } from './isd-lite-reader';

export const weatherFileFormats = ['csv', 'isd-lite'] as const;
export type WeatherFileFormat = (typeof weatherFileFormats)[number];

/**
 * `isd-lite` when the first non-blank line is 12 integer fields starting with a year, else `csv`
 * (whose reader then explains what is wrong, if anything).
 */
export function detectFormat(firstLine: string): WeatherFileFormat {
  return looksLikeIsdLite(firstLine.replace(/^\uFEFF/, '')) ? 'isd-lite' : 'csv';
}
