import { and, asc, desc, eq, gt, isNotNull, sql, type SQL } from 'drizzle-orm';
import { isRole, SALES_JOB_SCOPES, type Role, type StoreAccess } from '../../permissions';
import { timeZoneOr } from '../../../time-zone';
import { db } from '../index';
import { runShape } from '../named';
import { invitation, member, organization, session, storeProfile, user } from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';

export interface Membership {
	memberId: string;
	role: Role;
	store: { id: string; name: string; slug: string; logo: string | null; timeZone: string };
	/** The owner's choices about who sees what. */
	access: StoreAccess;
}

const membershipColumns = {
	memberId: member.id,
	role: member.role,
	id: organization.id,
	name: organization.name,
	slug: organization.slug,
	logo: organization.logo,
	timeZone: organization.timeZone,
	salesSeeCosts: organization.salesSeeCosts,
	salesJobs: organization.salesJobs
};

function toMembership(row: {
	memberId: string;
	role: string;
	id: string;
	name: string;
	slug: string;
	logo: string | null;
	timeZone: string | null;
	salesSeeCosts: boolean;
	salesJobs: string;
}): Membership | null {
	if (!isRole(row.role)) return null;
	const salesJobs = SALES_JOB_SCOPES.find((s) => s === row.salesJobs);
	// The database refuses any other value (organization_sales_jobs_check): never guess one.
	if (!salesJobs) throw new Error(`Store ${row.id} has an unknown sales job scope`);
	return {
		memberId: row.memberId,
		role: row.role,
		store: {
			id: row.id,
			name: row.name,
			slug: row.slug,
			logo: row.logo,
			timeZone: timeZoneOr(row.timeZone)
		},
		access: { salesSeeCosts: row.salesSeeCosts, salesJobs }
	};
}

/** Every store the user belongs to, by name. */
export async function listMemberships(userId: string): Promise<Membership[]> {
	return memberships(userId, asc(organization.name));
}

/**
 * The store a new session starts in: where the user last worked (their latest session with a
 * store), else the store they joined first.
 */
export async function defaultMembership(userId: string): Promise<Membership | null> {
	const [last] = await db
		.select({ storeId: session.activeOrganizationId })
		.from(session)
		.where(and(eq(session.userId, userId), isNotNull(session.activeOrganizationId)))
		.orderBy(desc(session.updatedAt))
		.limit(1);
	if (last?.storeId) {
		const membership = await readMembership(userId, last.storeId);
		if (membership) return membership;
	}
	const [first] = await memberships(userId, asc(member.createdAt));
	return first ?? null;
}

async function memberships(userId: string, order: SQL): Promise<Membership[]> {
	const rows = await db
		.select(membershipColumns)
		.from(member)
		.innerJoin(organization, eq(organization.id, member.organizationId))
		.where(eq(member.userId, userId))
		.orderBy(order);
	return rows.map(toMembership).filter((m): m is Membership => m !== null);
}

/**
 * The user's membership of one store, if any. Every signed-in request reads it (hooks.server.ts),
 * so it is built once and prepared by name (runShape, on the pool): each pooled connection parses
 * it once and keeps its plan, where building and planning it again took about as long as the
 * session's own read.
 */
export async function readMembership(userId: string, storeId: string): Promise<Membership | null> {
	const [row] = await runShape(
		null,
		'membership of a store',
		() =>
			db
				.select(membershipColumns)
				.from(member)
				.innerJoin(organization, eq(organization.id, member.organizationId))
				.where(
					and(
						eq(member.userId, sql.placeholder('user')),
						eq(member.organizationId, sql.placeholder('store'))
					)
				),
		{ user: userId, store: storeId }
	);
	return row ? toMembership(row) : null;
}

export type StoreProfile = typeof storeProfile.$inferSelect;

/** The store's contact details; empty ones when never saved. */
export async function readProfile(tx: StoreTx) {
	const [row] = await tx
		.select()
		.from(storeProfile)
		.where(eq(storeProfile.organizationId, tx.storeId));
	return (
		row ?? {
			organizationId: tx.storeId,
			address: '',
			town: '',
			phone: '',
			email: '',
			logoKey: null,
			papersNextSteps: '',
			papersCancellation: '',
			papersTerms: ''
		}
	);
}

/** Sets (or, with null, clears) the storage key of the store's logo. */
export async function saveLogoKey(tx: StoreWriteTx, logoKey: string | null) {
	await tx
		.insert(storeProfile)
		.values({ organizationId: tx.storeId, logoKey })
		.onConflictDoUpdate({
			target: storeProfile.organizationId,
			set: { logoKey, updatedAt: new Date() }
		});
}

export async function saveProfile(
	tx: StoreWriteTx,
	input: { address: string; town: string; phone: string; email: string }
) {
	const [row] = await tx
		.insert(storeProfile)
		.values({ organizationId: tx.storeId, ...input })
		.onConflictDoUpdate({
			target: storeProfile.organizationId,
			set: { ...input, updatedAt: new Date() }
		})
		.returning();
	return row;
}

/** Saves the store's own words on its customer papers (blank: the default wording). */
export async function savePapers(
	tx: StoreWriteTx,
	input: { nextSteps: string; cancellation: string; terms: string }
) {
	const set = {
		papersNextSteps: input.nextSteps,
		papersCancellation: input.cancellation,
		papersTerms: input.terms
	};
	await tx
		.insert(storeProfile)
		.values({ organizationId: tx.storeId, ...set })
		.onConflictDoUpdate({
			target: storeProfile.organizationId,
			set: { ...set, updatedAt: new Date() }
		});
}

/** An invitation with its store and inviter, for the invitation page (no session needed). */
export async function readInvitation(id: string) {
	const [row] = await db
		.select({
			id: invitation.id,
			email: invitation.email,
			role: invitation.role,
			status: invitation.status,
			expiresAt: invitation.expiresAt,
			storeId: organization.id,
			storeName: organization.name,
			storeTimeZone: organization.timeZone,
			inviterName: user.name
		})
		.from(invitation)
		.innerJoin(organization, eq(organization.id, invitation.organizationId))
		.innerJoin(user, eq(user.id, invitation.inviterId))
		.where(eq(invitation.id, id));
	return row;
}

/** Open invitations addressed to an e-mail, for the store chooser. */
export async function listOpenInvitations(email: string) {
	return db
		.select({
			id: invitation.id,
			role: invitation.role,
			expiresAt: invitation.expiresAt,
			storeName: organization.name
		})
		.from(invitation)
		.innerJoin(organization, eq(organization.id, invitation.organizationId))
		.where(
			and(
				eq(invitation.email, email.toLowerCase()),
				eq(invitation.status, 'pending'),
				gt(invitation.expiresAt, new Date())
			)
		)
		.orderBy(asc(organization.name));
}

/** The store's members with their logins, by name. */
export async function listMembers(tx: StoreTx) {
	return tx
		.select({
			memberId: member.id,
			userId: user.id,
			name: user.name,
			email: user.email,
			role: member.role,
			since: member.createdAt
		})
		.from(member)
		.innerJoin(user, eq(user.id, member.userId))
		.where(eq(member.organizationId, tx.storeId))
		.orderBy(asc(user.name));
}

/** The store's invitations that are still open or lapsed unused, newest first. */
export async function listInvitations(tx: StoreTx) {
	return tx
		.select({
			id: invitation.id,
			email: invitation.email,
			role: invitation.role,
			status: invitation.status,
			expiresAt: invitation.expiresAt,
			createdAt: invitation.createdAt
		})
		.from(invitation)
		.where(and(eq(invitation.organizationId, tx.storeId), eq(invitation.status, 'pending')))
		.orderBy(desc(invitation.createdAt));
}

/** The transaction's store by its name (for customer pages and documents, which have no session). */
export async function readStore(tx: StoreTx) {
	const [row] = await tx
		.select({ id: organization.id, name: organization.name, timeZone: organization.timeZone })
		.from(organization)
		.where(eq(organization.id, tx.storeId));
	return row && { ...row, timeZone: timeZoneOr(row.timeZone) };
}

/** A login's e-mail (to tell a salesperson what their customer did), or null. */
export async function emailOf(tx: StoreTx, userId: string | null): Promise<string | null> {
	if (!userId) return null;
	const [row] = await tx.select({ email: user.email }).from(user).where(eq(user.id, userId));
	return row?.email ?? null;
}

/** Sets the store's time zone (validated by the caller with `timeZoneSchema`). */
export async function saveTimeZone(tx: StoreWriteTx, timeZone: string) {
	await tx.update(organization).set({ timeZone }).where(eq(organization.id, tx.storeId));
}

/** Every store's id, oldest first, for work done for each store in turn (at most `limit`). */
export async function listStoreIds(limit = 10_000): Promise<string[]> {
	const rows = await db
		.select({ id: organization.id })
		.from(organization)
		.orderBy(asc(organization.createdAt))
		.limit(limit);
	return rows.map((r) => r.id);
}
