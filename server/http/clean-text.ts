/**
 * Free text that lands in a single line (an audit subject, a photo caption): control characters
 * become spaces and the text is cut to `max` characters.
 */
// eslint-disable-next-line no-control-regex -- control characters are what this matches
const CONTROLS = /[\u0000-\u001f\u007f]/g;

export function oneLine(text: string, max: number): string {
  return text.replace(CONTROLS, ' ').slice(0, max);
}
