import { and, asc, eq, gte, inArray, lte, sql } from 'drizzle-orm';
import { rolesThatCan } from '../../permissions';
import { installerProfile, installerTimeOff, member, user } from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';

export type InstallerProfile = typeof installerProfile.$inferSelect;
export type TimeOff = typeof installerTimeOff.$inferSelect;

/** The roles booked as installers: those who work the jobs assigned to them. */
const installerRoles = () => inArray(member.role, rolesThatCan({ assignedJob: ['report'] }));

/**
 * Makes the missing profiles of the store's installers (defaults: a crew of one, the store's
 * output, the book's pay), so a manager opening the list or booking never meets an installer
 * without one. Returns how many were made.
 */
export async function ensureProfiles(tx: StoreWriteTx, userId?: string): Promise<number> {
	const rows = await tx
		.select({ userId: member.userId })
		.from(member)
		.where(
			and(
				eq(member.organizationId, tx.storeId),
				installerRoles(),
				userId ? eq(member.userId, userId) : undefined
			)
		);
	if (!rows.length) return 0;
	const made = await tx
		.insert(installerProfile)
		.values(rows.map((r) => ({ organizationId: tx.storeId, userId: r.userId })))
		.onConflictDoNothing({ target: [installerProfile.organizationId, installerProfile.userId] })
		.returning({ id: installerProfile.id });
	return made.length;
}

/** The store's installers (members with the role) with their profile, by name. */
export async function list(tx: StoreTx) {
	return tx
		.select({
			userId: user.id,
			name: user.name,
			email: user.email,
			profile: installerProfile
		})
		.from(member)
		.innerJoin(user, eq(user.id, member.userId))
		.leftJoin(
			installerProfile,
			and(
				eq(installerProfile.organizationId, member.organizationId),
				eq(installerProfile.userId, member.userId)
			)
		)
		.where(and(eq(member.organizationId, tx.storeId), installerRoles()))
		.orderBy(asc(user.name), asc(user.id));
}

/** One installer of the store with their profile; undefined when not an installer here. */
export async function read(tx: StoreTx, userId: string) {
	const [row] = await tx
		.select({ userId: user.id, name: user.name, email: user.email, profile: installerProfile })
		.from(member)
		.innerJoin(user, eq(user.id, member.userId))
		.leftJoin(
			installerProfile,
			and(
				eq(installerProfile.organizationId, member.organizationId),
				eq(installerProfile.userId, member.userId)
			)
		)
		.where(and(eq(member.organizationId, tx.storeId), eq(member.userId, userId), installerRoles()));
	return row;
}

export interface ProfileInput {
	crewSize: number;
	floorKinds: InstallerProfile['floorKinds'];
	sqFtPerDay: InstallerProfile['sqFtPerDay'];
	payRates: InstallerProfile['payRates'];
	daysOff: number[];
	phone: string;
	notes: string;
}

/** Saves an installer's profile (made first where missing); undefined when not the store's. */
export async function save(tx: StoreWriteTx, userId: string, input: ProfileInput) {
	await ensureProfiles(tx, userId);
	const [row] = await tx
		.update(installerProfile)
		.set({ ...input, updatedAt: new Date() })
		.where(
			and(eq(installerProfile.organizationId, tx.storeId), eq(installerProfile.userId, userId))
		)
		.returning();
	return row;
}

/** An installer's time away that touches `from`..`to` (every entry when no range), by date. */
export async function listTimeOff(
	tx: StoreTx,
	range: { from?: string; to?: string; installerId?: string } = {}
) {
	return tx
		.select()
		.from(installerTimeOff)
		.where(
			and(
				eq(installerTimeOff.organizationId, tx.storeId),
				range.installerId ? eq(installerTimeOff.installerId, range.installerId) : undefined,
				range.to ? lte(installerTimeOff.startsOn, range.to) : undefined,
				range.from ? gte(installerTimeOff.endsOn, range.from) : undefined
			)
		)
		.orderBy(asc(installerTimeOff.startsOn))
		.limit(1000);
}

export async function addTimeOff(
	tx: StoreWriteTx,
	input: { installerId: string; startsOn: string; endsOn: string; note: string },
	actorId: string
) {
	await ensureProfiles(tx, input.installerId);
	const [row] = await tx
		.insert(installerTimeOff)
		.values({ organizationId: tx.storeId, ...input, createdBy: actorId })
		.returning();
	return row;
}

/** Removes one entry of time away of this installer; false when there was none. */
export async function removeTimeOff(tx: StoreWriteTx, installerId: string, id: string) {
	const gone = await tx
		.delete(installerTimeOff)
		.where(
			and(
				eq(installerTimeOff.organizationId, tx.storeId),
				eq(installerTimeOff.installerId, installerId),
				eq(installerTimeOff.id, id)
			)
		)
		.returning({ id: installerTimeOff.id });
	return gone.length > 0;
}

/** Whether the string is a profile's user here (used before writing rows that point at it). */
export async function isInstaller(tx: StoreTx, userId: string): Promise<boolean> {
	const [row] = await tx
		.select({ one: sql<number>`1` })
		.from(member)
		.where(and(eq(member.organizationId, tx.storeId), eq(member.userId, userId), installerRoles()));
	return Boolean(row);
}
