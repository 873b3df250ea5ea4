import { HttpProblem } from '../core/problem';

/** A file Qwell will not read: said plainly, with what to do instead. Nothing is stored. */
export const unsupportedFile = (detail: string) => new HttpProblem(415, 'Not a spreadsheet Qwell reads', detail);
export const unreadableFile = (detail: string) => new HttpProblem(422, 'The file cannot be imported', detail);
export const emptyFile = (detail: string) => new HttpProblem(400, 'Empty file', detail);
export const tooLarge = (detail: string) => new HttpProblem(413, 'Too large', detail);
