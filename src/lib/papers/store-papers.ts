/**
 * The store's own words on its customer papers: its terms, its cancellation policy and what
 * happens next. Saved in the store's profile; a blank one reads as Flushline's default wording,
 * which a store can replace in Store settings.
 */

export interface StorePapers {
	nextSteps: string;
	cancellation: string;
	terms: string;
}

/** Longest text a store may save for each (characters). */
export const PAPERS_MAX = { nextSteps: 2000, cancellation: 2000, terms: 4000 } as const;

export const DEFAULT_PAPERS: StorePapers = {
	nextSteps:
		'Accept the quote on this page by typing your name, then pay the deposit to book the install. We call you to agree the install days and confirm them by e-mail. If the installer finds something under the old floor that the measure could not show, we send you a change order to approve before that work is done. When the floor is down, you walk through it with the installer, sign off on this page and pay the balance.',
	cancellation:
		'You can cancel without charge until we order your flooring. After that, the deposit covers material that cannot be returned and any restocking fee, and the rest of it is refunded to the card you paid with. Once the install has started, you pay for the work done and the material delivered. To cancel, call or e-mail us.',
	terms:
		'Prices cover the rooms and work listed here and hold until the date on this quote. Subfloor preparation is priced from what was measured; anything more found once the old floor is up is priced from the same price list and done only after you approve it. Flooring is installed following its maker’s instructions and carries its maker’s warranty; ask us about the warranty on our installation work. The balance is due when the work is finished.'
};

/** The papers as saved by a store (blank: not set), with the default wording where one is blank. */
export function papersOf(saved: Partial<Record<keyof StorePapers, string | null>>): StorePapers {
	const pick = (key: keyof StorePapers) => saved[key]?.trim() || DEFAULT_PAPERS[key];
	return {
		nextSteps: pick('nextSteps'),
		cancellation: pick('cancellation'),
		terms: pick('terms')
	};
}
