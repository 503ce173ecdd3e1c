// Messages between the page and the logger import worker.
import type { LoggerMapping } from '../../core';
import type { LoggerFileRead } from './read-logger';

/** Page → worker: the file to read and the mapping to read it with. */
export interface ParseRequest {
  file: Blob;
  mapping: LoggerMapping;
}

/** Worker → page: progress (fraction 0–1 of the file read), the result, or why it failed. */
export type ParseReply =
  | { type: 'progress'; fraction: number }
  | { type: 'done'; read: LoggerFileRead }
  | { type: 'failed'; message: string };
