/**
 * Each prep item in one plain sentence for the homeowner: what is done and why, in the room it is
 * done in. The installer's words (methods, fastening schedules, blocking and backing) stay on the
 * work order; these are the customer's.
 */
import type { PrepKind } from '$lib/estimating';

/** Where: " in Kitchen" for a room's line, "" for a job-wide one. */
const inRoom = (room?: string) => (room ? ` in ${room}` : '');

export const PLAIN_PREP: Record<PrepKind, (room?: string) => string> = {
	fastener_removal: (r) =>
		`Pull the nails and staples left by the old floor${inRoom(r)} and vacuum, so nothing pokes through the new one.`,
	hole_repair: (r) =>
		`Close the hole in the subfloor${inRoom(r)} so the new floor has solid support everywhere.`,
	seam_patch: (r) =>
		`Fill the open seams in the subfloor${inRoom(r)} so they do not show through the new floor.`,
	dent_patch: (r) =>
		`Fill dents and hollows in the subfloor${inRoom(r)} so they do not show through the new floor.`,
	underlayment: (r) =>
		`Lay new underlayment panels${inRoom(r)} to give the new floor a smooth, even base.`,
	level: (r) => `Level low spots${inRoom(r)} so the new floor lies flat.`,
	grind: (r) => `Take down high spots${inRoom(r)} so the new floor lies flat.`,
	joist_sister: (r) =>
		`Strengthen the floor joists${inRoom(r)} so the floor is stiff enough for the new surface.`,
	structural_consult: (r) =>
		`Have a licensed professional look at the floor structure${inRoom(r)} before the new floor goes down.`,
	subfloor_overlay: (r) =>
		`Add a layer of subfloor panels${inRoom(r)} so the floor is stiff enough for the new surface.`,
	moisture_barrier: (r) =>
		`Put down a moisture barrier${inRoom(r)} to keep damp from the slab out of the new floor.`,
	moisture_retest: (r) =>
		`Let the floor${inRoom(r)} dry out, then test it again before the new floor goes down.`,
	moisture_test: (r) =>
		`Test the concrete${inRoom(r)} for moisture before the new floor goes down, as the flooring maker asks.`,
	trim: (r) => `Fit trim along the walls${inRoom(r)} for a neat finished edge.`,
	transition: (r) => `Fit transition strips at the doorways${inRoom(r)} where the floor changes.`,
	underlayment_skim: (r) =>
		`Smooth over the underlayment joints${inRoom(r)} so they do not show through the new floor.`,
	primer: (r) => `Prime the low spots${inRoom(r)} so the levelling compound bonds to them.`,
	tile_backer: (r) =>
		`Lay a backer board or membrane under the tile${inRoom(r)} so it stays bonded and does not crack.`,
	tile_setting: (r) => `Set the tile in mortar and grout the joints${inRoom(r)}.`,
	underlay: (r) =>
		`Lay an underlay under the new floor${inRoom(r)} for a quieter, more even floor.`,
	vapour_retarder: (r) =>
		`Lay a vapour retarder on the concrete${inRoom(r)} to keep damp out of the new floor.`,
	felt_paper: (r) =>
		`Lay felt or building paper under the wood floor${inRoom(r)} to cut squeaks and slow damp.`,
	carpet_pad: (r) => `Lay new carpet pad${inRoom(r)} for comfort and a longer-lasting carpet.`,
	tack_strip: (r) => `Fit tack strip along the walls${inRoom(r)} to hold the carpet tight.`,
	carpet_seam: (r) => `Join the carpet pieces${inRoom(r)} with seams that lie flat.`,
	base_reset: (r) => `Take off the baseboard${inRoom(r)} and put it back after the floor is down.`,
	base_new: (r) => `Fit new baseboard${inRoom(r)}.`,
	shoe_new: (r) =>
		`Fit new shoe or quarter-round moulding${inRoom(r)} to cover the gap at the walls.`,
	reducer: (r) => `Fit reducers at the doorways${inRoom(r)} where the floor height changes.`,
	threshold: (r) => `Fit thresholds at the doorways${inRoom(r)}.`,
	door_undercut: (r) => `Trim the bottom of the doors${inRoom(r)} so they clear the new floor.`,
	furniture: (r) => `Move the furniture out${inRoom(r)} and back again after the floor is down.`,
	appliance_reset: (r) =>
		`Disconnect the appliances${inRoom(r)} and reconnect them when the floor is down.`,
	toilet_reset: (r) =>
		`Take up the toilet${inRoom(r)} and reset it on a new seal when the floor is down.`,
	stairs: (r) => `Cover the stairs${inRoom(r)}: treads, risers and nosings.`,
	haul_away: (r) => `Haul away the old flooring${inRoom(r)} and dispose of it.`,
	trip_charge: () => 'The trip to your home for the install.',
	minimum_job: () => 'The smallest job the store takes on, charged as one amount.'
};

/** The plain sentence for a prep item; a kind the table lacks (an older stored quote) gets its label. */
export function plainPrep(kind: string, room: string | undefined, fallback: string): string {
	return Object.hasOwn(PLAIN_PREP, kind) ? PLAIN_PREP[kind as PrepKind](room) : fallback;
}
