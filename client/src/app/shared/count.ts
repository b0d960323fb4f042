import { Pipe, PipeTransform } from '@angular/core';

/**
 * "1 pipe", "4 pipes", "2 fixes": a count with its noun in the right number, instead of "pipe(s)".
 * The plural is the noun + "s" unless given.
 */
export function countOf(n: number, singular: string, plural = `${singular}s`): string {
  return `${n} ${n === 1 ? singular : plural}`;
}

/** {{ changed.length | count: 'pipe' }} → "4 pipes". */
@Pipe({ name: 'count' })
export class CountPipe implements PipeTransform {
  transform(n: number, singular: string, plural?: string): string {
    return countOf(n, singular, plural);
  }
}
