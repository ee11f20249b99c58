/**
 * The formats an answer can be downloaded in, each with its media type: the HTTP service offers one
 * route per entry (POST /api/v1/georeference.<extension>), so a new format is one entry here.
 */
import type { RecordAnswer } from '../locate/georeference-record.ts';
import { recordCsv } from './csv.ts';
import { answerGeoJsonText } from './geojson.ts';

export interface AnswerFormat {
  /** The route's and the file's extension. */
  extension: string;
  mediaType: string;
  /** What the file holds, for the OpenAPI document. */
  description: string;
  write(answer: RecordAnswer, locality: string): string;
}

/**
 * Every downloadable format.
 * @example ANSWER_FORMATS.map((f) => f.extension) // ['csv', 'geojson']
 */
export const ANSWER_FORMATS: readonly AnswerFormat[] = [
  {
    extension: 'csv',
    mediaType: 'text/csv',
    description: 'A CSV row of the Darwin Core fields: a header line and one row, every field quoted (RFC 4180).',
    write: (answer, locality) => recordCsv(locality, answer.darwinCore),
  },
  {
    extension: 'geojson',
    mediaType: 'application/geo+json',
    description: 'A GeoJSON FeatureCollection (RFC 7946): the point with the Darwin Core terms as properties, and the footprint.',
    write: (answer, locality) => answerGeoJsonText(answer, locality),
  },
];
