/**
 * For tests: words that belong to the installer's work order and never to the customer's papers
 * (saw depth, fasteners and their schedules, pail and bag sizes, joist and span notes, readings
 * and their limits). The papers are built by the audience rules, never by matching these.
 */
export const IN_HOUSE =
	/saw|fastener|\bpail|\d+\s*lb\b|\bo\.c\.|\bL\/\d|psf|psi\b|MVER|\bRH\b|span|straightedge|blocking|planning aid|% MC|deflection/i;

/** The first in-house word in a text, or undefined: an assertion that names what leaked. */
export function inHouseWord(text: string): string | undefined {
	return IN_HOUSE.exec(text)?.[0];
}
