/**
 * Who reads what: the one place that decides, per caution, check result and line, whether it goes
 * on the customer's papers (quote page, quote PDF, e-mails), on the installer's work order, or on
 * both in different words. Templates never decide it by looking at the words themselves.
 */
import type { CautionKind, ItemRef, SupplyKind } from '$lib/estimating';

/** `customer`: the homeowner's papers only; `installer`: the work order only; `both`: each in its own words. */
export type Audience = 'customer' | 'installer' | 'both';

/**
 * The engine's cautions by reader. Those for the installer carry method and limits (saw depth,
 * the maker's moisture limits, "a planning aid"), which the homeowner has no use for; the ones
 * marked `both` are told to the homeowner in `HOMEOWNER_CAUTIONS`' words.
 */
export const CAUTION_AUDIENCE: Record<CautionKind, Audience> = {
	planning_aid: 'installer',
	maker_instructions: 'installer',
	structure: 'both',
	asbestos: 'both',
	moisture: 'installer',
	dust_tools: 'both'
};

/**
 * The engine's check results (findings: straightedge gaps, moisture readings and their limits,
 * joist spans and deflection) are in-house: the work order lists them as readings and structure
 * notes; the customer reads the prep they called for in plain words instead.
 */
export const FINDINGS_AUDIENCE: Audience = 'installer';

/**
 * The order of work with hours and cure waits is the installer's; the customer is told how many
 * days and which rooms are out of use (`rooms_out_of_use`).
 */
export const SCHEDULE_STEPS_AUDIENCE: Audience = 'installer';

/**
 * A priced line's quantity and description: supplies (fastener counts, bag and pail sizes, panel
 * counts) are the installer's to know; the customer reads what the supply is for, with its price.
 * Floors, installation and tear-out keep their quantities on both papers.
 */
export function lineQuantityAudience(ref: ItemRef): Audience {
	return ref.type === 'supply' || ref.type === 'prep' ? 'installer' : 'both';
}

/** What each supply line says to the customer: what it is, never how many or what size. */
export const SUPPLY_WORDS: Record<SupplyKind, string> = {
	underlayment_panel: 'Underlayment panels: a smooth, even base for the new floor',
	fastener: 'Nails or screws to hold the underlayment panels down',
	patch: 'Patch compound for seams, dents and low spots',
	leveller: 'Self-levelling compound to even out low spots',
	thinset: 'Tile adhesive (thinset mortar) to set the tile',
	grout: 'Grout to fill the joints between tiles',
	backer: 'Backer board or membrane under the tile',
	baseboard: 'New baseboard trim along the walls',
	shoe: 'New shoe moulding where the floor meets the baseboard'
};

/** The cautions that concern the homeowner, by what they are about. */
export type HomeownerCautionKind =
	'old_flooring' | 'structure' | 'dust' | 'clear_rooms' | 'fixtures' | 'rooms_out_of_use';

export const HOMEOWNER_CAUTION_KINDS: readonly HomeownerCautionKind[] = [
	'old_flooring',
	'structure',
	'clear_rooms',
	'fixtures',
	'rooms_out_of_use',
	'dust'
];

/** Where an engine caution marked `both` is told to the homeowner. */
export const HOMEOWNER_FOR: Partial<Record<CautionKind, HomeownerCautionKind>> = {
	asbestos: 'old_flooring',
	structure: 'structure',
	dust_tools: 'dust'
};

/** Headings for the homeowner's cautions. */
export const HOMEOWNER_CAUTION_TITLES: Record<HomeownerCautionKind, string> = {
	old_flooring: 'Old flooring',
	structure: 'Structural work',
	dust: 'Dust',
	clear_rooms: 'Clearing the rooms',
	fixtures: 'Kitchen and bathroom fixtures',
	rooms_out_of_use: 'Rooms out of use'
};

/**
 * The homeowner's words (TRADE.md "Cautions to show", PRODUCT.md "Safety"): what to expect and
 * what to do, deferring to local rules, the flooring maker and licensed professionals.
 */
export const HOMEOWNER_CAUTIONS: Record<HomeownerCautionKind, string> = {
	old_flooring:
		'Sheet vinyl, vinyl tiles and the adhesive under them in older homes can contain asbestos. Before the old floor comes up it may need testing; if it tests positive, local rules decide how it is removed, and some places require a licensed abatement contractor. Please do not sand, scrape or break it up yourself.',
	structure:
		'Work on joists or other framing is checked by a licensed professional and may need a permit under your local building code. The store will tell you if that changes the dates.',
	dust: 'Taking up old floors and cutting new ones raises dust. Close the doors to other rooms, turn off forced-air heating or cooling in the work area if you can, and keep children and pets away while the crew works.',
	clear_rooms:
		'Please move the furniture, and everything else on the floor, out of the rooms before the first day: small items, breakables and valuables too.',
	fixtures:
		'Appliances or toilets in these rooms are disconnected and put back by the crew, so that kitchen or bathroom cannot be used while the floor goes down.',
	rooms_out_of_use:
		'Plan to keep out of the rooms being worked on for the days of the install, including the waits while patch, leveller or adhesive dries.'
};

/** `clear_rooms` when the quote prices moving the furniture. */
export const CLEAR_ROOMS_CREW_MOVES_FURNITURE =
	'The crew moves the furniture this quote prices; please take small items, breakables, valuables and anything else on the floor out of the rooms before the first day.';
