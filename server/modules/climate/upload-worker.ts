/**
 * Worker thread of the upload pool (piscina): reads, checks and previews an uploaded weather file
 * off the request thread — unpacked as a stream, parsed line by line, rounded to the stored
 * precision, analysed, and indexed for the sweep — and hands back only what the upload keeps.
 */
import type { QualitySummary } from '@shared/climate/climate-schemas';
import type { DesignConditions } from '@shared/climate/design-conditions-schema';
import type { WeatherFileFormat } from '@shared/climate/readers';
import type { CsvMapping } from '@shared/climate/readers/csv-reader';
import type { FieldIssue } from '@shared/api/api-error';
import { HttpError } from '../../http/http-error';
import type { StoredComputation, StoredSweepIndex } from './climate-repo';
import { analyse, qualitySummary, storedComputation, storedSweepIndex } from './climate-service';
import { atStoragePrecision, encodeSeries } from './series-codec';
import { readWeatherFiles } from './weather-files';

export interface UploadParseTask {
  files: { name: string; content: Uint8Array }[];
  format: 'auto' | WeatherFileFormat;
  mapping?: CsvMapping;
  elevationM: number | null;
  /** The name the upload is shown under. */
  fileName: string;
}

export type UploadParseResult =
  | {
      ok: true;
      format: WeatherFileFormat;
      rowCount: number;
      /** The series at stored precision, packed (series-codec.ts). */
      series: Uint8Array;
      quality: QualitySummary;
      computed: StoredComputation | null;
      preview: DesignConditions | null;
      warnings: string[];
      sweepIndex: StoredSweepIndex | null;
    }
  | { ok: false; status: number; code: string; message: string; details?: FieldIssue[] };

export default async function parseUpload(task: UploadParseTask): Promise<UploadParseResult> {
  try {
    const { series, format, rowCount } = await readWeatherFiles(
      task.files.map((f) => ({
        name: f.name,
        content: Buffer.from(f.content.buffer, f.content.byteOffset, f.content.byteLength),
      })),
      { format: task.format, mapping: task.mapping },
    );
    const stored = atStoragePrecision(series);
    const analysis = analyse(stored, task.elevationM);
    const { result, quality } = analysis;
    const computed = storedComputation(analysis, { fileName: task.fileName, rowCount }) ?? null;
    const packed = encodeSeries(stored);
    return {
      ok: true,
      format,
      rowCount,
      series: new Uint8Array(packed.buffer, packed.byteOffset, packed.byteLength),
      quality: qualitySummary(quality),
      computed,
      preview: result.ok ? result.conditions : null,
      warnings: [...(result.ok ? [] : [result.error.message]), ...result.warnings.map((w) => w.message)],
      sweepIndex: computed ? storedSweepIndex(analysis.prepared, computed.conditions.period.qualifyingYears) : null,
    };
  } catch (err) {
    if (err instanceof HttpError)
      return { ok: false, status: err.status, code: err.code, message: err.message, details: err.details };
    throw err;
  }
}
