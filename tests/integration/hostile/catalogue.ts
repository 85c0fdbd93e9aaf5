// Every way into the app that takes input: each form action, each `+server.ts` method and each
// page load, with where its form is drawn (to take realistic fields from the page) and which
// rows its route parameters name. `tests/integration/hostile.spec.ts` checks this list against
// the routes on disk, both ways, so a new action or method cannot be left out of the suite.

/**
 * Rows the suite seeds in each store; route parameters name them, and so does a field value in
 * `fields` that is exactly a fixture's name.
 */
export type Fixture =
	| 'store'
	| 'job'
	| 'quoteVersion'
	| 'customer'
	| 'site'
	| 'priceItem'
	| 'doomedJob'
	| 'doomedCustomer'
	| 'doomedSite'
	| 'doomedPriceItem'
	| 'token'
	| 'invitation'
	| 'member'
	| 'installer'
	| 'booking'
	| 'statement';

/** A route parameter: a fixture of the store (swapped for the other store's), or a fixed value. */
export type Param = Fixture | { fixed: string };

export type Role = 'owner' | 'manager' | 'sales' | 'installer';

interface Common {
	/** The route as on disk, e.g. `/app/jobs/[id]` (groups such as `(auth)` left out). */
	route: string;
	params?: Record<string, Param>;
	/**
	 * Side effects on the session (sign-out, switching or making a store, team changes): every
	 * role signs in again after this target.
	 */
	touchesSessions?: boolean;
}

export interface ActionTarget extends Common {
	kind: 'action';
	name: string;
	/** Fields that replace what the page's form has (throwaway rows, never a real member). */
	fields?: Record<string, string>;
	/** Who draws the page the form is taken from (the owner unless said). */
	drawnBy?: Role | 'nobody';
	/** The page the form is on, when not the route itself (same parameters). */
	page?: string;
}

export interface EndpointTarget extends Common {
	kind: 'endpoint';
	method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
	/** A body for routes the OpenAPI document does not describe. */
	body?: unknown;
}

export interface LoadTarget extends Common {
	kind: 'load';
}

export type Target = ActionTarget | EndpointTarget | LoadTarget;

const job = { id: 'job' } as const;
const customer = { id: 'customer' } as const;
const token = { token: 'token' } as const;
/** Change order 1 of the job (the suite seeds one awaiting review in each store). */
const changeOrder = { id: 'job', number: { fixed: '1' } } as const;

const loads: LoadTarget[] = [
	{ kind: 'load', route: '/reset-password' },
	{ kind: 'load', route: '/sign-in' },
	{ kind: 'load', route: '/sign-up' },
	{ kind: 'load', route: '/app' },
	{ kind: 'load', route: '/app/calculators' },
	{ kind: 'load', route: '/app/customers' },
	{ kind: 'load', route: '/app/customers/[id]', params: customer },
	{ kind: 'load', route: '/app/customers/new' },
	{ kind: 'load', route: '/app/jobs' },
	{ kind: 'load', route: '/app/jobs/[id]', params: job },
	{ kind: 'load', route: '/app/jobs/[id]/change-orders/[number]', params: changeOrder },
	{ kind: 'load', route: '/app/jobs/[id]/measure', params: job },
	{ kind: 'load', route: '/app/jobs/[id]/payments', params: job },
	{ kind: 'load', route: '/app/jobs/[id]/quote', params: job },
	{ kind: 'load', route: '/app/jobs/new' },
	{ kind: 'load', route: '/app/payments' },
	{ kind: 'load', route: '/app/price-book' },
	{ kind: 'load', route: '/app/price-book/[id]', params: { id: 'priceItem' } },
	{ kind: 'load', route: '/app/price-book/new/[section]', params: { section: { fixed: 'prep' } } },
	{ kind: 'load', route: '/app/settings' },
	{ kind: 'load', route: '/app/team' },
	{ kind: 'load', route: '/c/[token]', params: token },
	{ kind: 'load', route: '/dev/checkout/[id]', params: { id: { fixed: 'cs_test_none' } } },
	{ kind: 'load', route: '/dev/outbox' },
	{ kind: 'load', route: '/dev/stripe' },
	{ kind: 'load', route: '/field' },
	{ kind: 'load', route: '/field/calculators' },
	{ kind: 'load', route: '/field/jobs/[id]', params: job },
	{ kind: 'load', route: '/field/profile' },
	{ kind: 'load', route: '/field/statements' },
	{ kind: 'load', route: '/app/installers' },
	{ kind: 'load', route: '/app/installers/[id]', params: { id: 'installer' } },
	{ kind: 'load', route: '/app/schedule' },
	{ kind: 'load', route: '/app/statements' },
	{ kind: 'load', route: '/app/statements/[id]', params: { id: 'statement' } },
	{ kind: 'load', route: '/invite/[id]', params: { id: 'invitation' } },
	{ kind: 'load', route: '/sign-out' },
	{ kind: 'load', route: '/stores' }
];

const endpoints: EndpointTarget[] = [
	{
		kind: 'endpoint',
		route: '/app/statements/[id]/export.csv',
		method: 'GET',
		params: { id: 'statement' }
	},
	{
		kind: 'endpoint',
		route: '/api/v1/calc/[name]',
		method: 'POST',
		params: { name: { fixed: 'cartons' } }
	},
	{ kind: 'endpoint', route: '/api/v1/customers', method: 'GET' },
	{ kind: 'endpoint', route: '/api/v1/customers', method: 'POST' },
	{ kind: 'endpoint', route: '/api/v1/customers/[id]', method: 'GET', params: customer },
	{ kind: 'endpoint', route: '/api/v1/customers/[id]', method: 'PATCH', params: customer },
	{
		kind: 'endpoint',
		route: '/api/v1/customers/[id]',
		method: 'DELETE',
		params: { id: 'doomedCustomer' }
	},
	{ kind: 'endpoint', route: '/api/v1/customers/[id]/sites', method: 'GET', params: customer },
	{
		kind: 'endpoint',
		route: '/api/v1/customers/[id]/sites',
		method: 'POST',
		params: customer,
		body: {
			label: 'Back unit',
			address: '3 Sorrel Row',
			town: 'Bramblefield',
			postcode: '',
			builtYear: 1971,
			subfloor: 'plywood',
			notes: ''
		}
	},
	{ kind: 'endpoint', route: '/api/v1/estimates/preview', method: 'POST' },
	{ kind: 'endpoint', route: '/api/v1/jobs', method: 'GET' },
	{ kind: 'endpoint', route: '/api/v1/jobs', method: 'POST' },
	{ kind: 'endpoint', route: '/api/v1/jobs/[id]', method: 'GET', params: job },
	{ kind: 'endpoint', route: '/api/v1/jobs/[id]', method: 'PATCH', params: job },
	{ kind: 'endpoint', route: '/api/v1/jobs/[id]', method: 'DELETE', params: { id: 'doomedJob' } },
	{ kind: 'endpoint', route: '/api/v1/jobs/[id]/measure', method: 'GET', params: job },
	{
		kind: 'endpoint',
		route: '/api/v1/jobs/[id]/measure',
		method: 'PUT',
		params: job,
		body: {
			baseVersion: 0,
			draft: {
				builtYear: '1962',
				rooms: [
					{
						id: 'r1',
						name: 'Den',
						shape: { kind: 'rect', width: "12'", length: "10'" },
						holes: []
					}
				]
			}
		}
	},
	{ kind: 'endpoint', route: '/api/v1/jobs/[id]/moves', method: 'POST', params: job },
	{ kind: 'endpoint', route: '/api/v1/me', method: 'GET' },
	{ kind: 'endpoint', route: '/api/v1/health/session', method: 'GET' },
	{ kind: 'endpoint', route: '/health', method: 'GET' },
	{ kind: 'endpoint', route: '/api/v1/openapi.json', method: 'GET' },
	{ kind: 'endpoint', route: '/api/v1/price-items', method: 'GET' },
	{
		kind: 'endpoint',
		route: '/api/v1/price-items',
		method: 'POST',
		body: {
			section: 'prep',
			code: 'x1',
			name: 'Patch',
			data: { kind: 'patch', basis: 'sqft', priceCents: 100, costCents: 50, payCents: 20 }
		}
	},
	{
		kind: 'endpoint',
		route: '/api/v1/price-items/[id]',
		method: 'GET',
		params: { id: 'priceItem' }
	},
	{
		kind: 'endpoint',
		route: '/api/v1/price-items/[id]',
		method: 'PATCH',
		params: { id: 'priceItem' },
		body: { name: 'Renamed', active: true }
	},
	{
		kind: 'endpoint',
		route: '/api/v1/price-items/[id]',
		method: 'DELETE',
		params: { id: 'doomedPriceItem' }
	},
	{ kind: 'endpoint', route: '/api/v1/sites/[id]', method: 'GET', params: { id: 'site' } },
	{
		kind: 'endpoint',
		route: '/api/v1/sites/[id]',
		method: 'PATCH',
		params: { id: 'site' },
		body: { label: 'Home', notes: 'Gate code at the office' }
	},
	{ kind: 'endpoint', route: '/api/v1/sites/[id]', method: 'DELETE', params: { id: 'doomedSite' } },
	{
		kind: 'endpoint',
		route: '/api/v1/field/jobs/[id]/items',
		method: 'POST',
		params: job,
		body: {
			items: [
				{
					clientId: 'hostile-client-0001',
					kind: 'found',
					roomId: 'r1',
					refKey: 'prep:hole_repair',
					qty: 1,
					recordedAt: '2026-12-02T10:00:00Z'
				}
			]
		}
	},
	{
		kind: 'endpoint',
		route: '/api/v1/field/jobs/[id]/photos',
		method: 'POST',
		params: job,
		body: { clientId: 'hostile-photo-0001', purpose: 'report' }
	},
	{
		kind: 'endpoint',
		route: '/api/v1/field/jobs/[id]/photos/[photoId]',
		method: 'GET',
		params: { id: 'job', photoId: { fixed: 'no-such-photo' } }
	},
	{ kind: 'endpoint', route: '/api/v1/store/logo', method: 'GET' },
	{
		kind: 'endpoint',
		route: '/api/webhooks/stripe',
		method: 'POST',
		body: { id: 'evt_1', type: 'checkout.session.completed', data: { object: { id: 'cs_1' } } }
	},
	{
		kind: 'endpoint',
		route: '/app/jobs/[id]/quote/[version]/pdf',
		method: 'GET',
		params: { id: 'job', version: 'quoteVersion' }
	},
	{
		kind: 'endpoint',
		route: '/app/jobs/[id]/change-orders/[number]/photos/[photo]',
		method: 'GET',
		params: { ...changeOrder, photo: { fixed: 'no-such-photo' } }
	},
	{
		kind: 'endpoint',
		route: '/app/jobs/[id]/photos/[photo]',
		method: 'GET',
		params: { ...job, photo: { fixed: 'no-such-photo' } }
	},
	{ kind: 'endpoint', route: '/app/jobs/[id]/work-order.pdf', method: 'GET', params: job },
	{ kind: 'endpoint', route: '/app/payments/export.csv', method: 'GET' },
	{ kind: 'endpoint', route: '/field/jobs/[id]/work-order.pdf', method: 'GET', params: job },
	{ kind: 'endpoint', route: '/c/[token]/logo', method: 'GET', params: token },
	{
		kind: 'endpoint',
		route: '/c/[token]/photos/[photo]',
		method: 'GET',
		params: { ...token, photo: { fixed: 'no-such-photo' } }
	},
	{ kind: 'endpoint', route: '/c/[token]/quote.pdf', method: 'GET', params: token },
	{
		kind: 'endpoint',
		route: '/dev/stripe/checkout-sessions',
		method: 'POST',
		body: { account: 'acct_none', session: 'cs_none' }
	},
	{ kind: 'endpoint', route: '/dev/stripe/deliveries', method: 'GET' },
	{ kind: 'endpoint', route: '/dev/stripe/deliveries', method: 'POST', body: { id: 'evt_none' } },
	{ kind: 'endpoint', route: '/dev/stripe/delivery-mode', method: 'POST', body: { mode: 'now' } },
	{ kind: 'endpoint', route: '/dev/stripe/events', method: 'GET' },
	{
		kind: 'endpoint',
		route: '/dev/stripe/payouts',
		method: 'POST',
		body: { account: 'acct_none', amount: 100 }
	}
];

const actions: ActionTarget[] = [
	// The installers, the schedule and statements (issue 10's desk half).
	...['save', 'away', 'removeAway'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/app/installers/[id]',
		name,
		params: { id: 'installer' },
		fields:
			name === 'away'
				? { startsOn: '2027-03-01', endsOn: '2027-03-02', note: 'Away' }
				: name === 'removeAway'
					? { timeOffId: 'no-such-entry' }
					: { crewSize: '2', 'kinds.laminate': 'on', 'output.laminate': '400' }
	})),
	{
		kind: 'action',
		route: '/app/schedule',
		name: 'book',
		fields: { jobId: 'job', installerId: 'installer', startsOn: '2027-01-18', days: '2' }
	},
	{
		kind: 'action',
		route: '/app/schedule',
		name: 'move',
		fields: { bookingId: 'booking', installerId: 'installer', startsOn: '2027-01-25', days: '1' }
	},
	{ kind: 'action', route: '/app/schedule', name: 'cancel', fields: { bookingId: 'booking' } },
	{
		kind: 'action',
		route: '/app/statements',
		name: 'create',
		fields: { installerId: 'installer', periodStart: '2027-02-01', periodEnd: '2027-02-28' }
	},
	...['line', 'refresh', 'pay'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/app/statements/[id]',
		name,
		params: { id: 'statement' },
		fields:
			name === 'line'
				? { kind: 'chargeback', amount: '12.50', reason: 'Scuffed base' }
				: name === 'pay'
					? { reference: 'Transfer 77' }
					: {}
	})),
	{ kind: 'action', route: '/forgot-password', name: 'default', drawnBy: 'nobody' },
	{ kind: 'action', route: '/reset-password', name: 'default', drawnBy: 'nobody' },
	{
		kind: 'action',
		route: '/sign-in',
		name: 'default',
		drawnBy: 'nobody',
		fields: { email: 'nobody@test.example', password: 'wrong-password-1', redirectTo: '/app' }
	},
	{ kind: 'action', route: '/sign-up', name: 'default', drawnBy: 'nobody' },
	{
		kind: 'action',
		route: '/app/calculators',
		name: 'default',
		fields: { calculator: 'cartons', areaSqFt: '120', sqFtPerCarton: '20' }
	},
	{
		kind: 'action',
		route: '/field/calculators',
		name: 'default',
		drawnBy: 'installer',
		fields: { calculator: 'cartons', areaSqFt: '120', sqFtPerCarton: '20' }
	},
	...['save', 'startJob', 'addSite', 'saveSite'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/app/customers/[id]',
		name,
		params: customer
	})),
	{
		kind: 'action',
		route: '/app/customers/[id]',
		name: 'deleteSite',
		params: customer,
		fields: { siteId: 'doomedSite' }
	},
	{
		kind: 'action',
		route: '/app/customers/[id]',
		name: 'delete',
		params: { id: 'doomedCustomer' }
	},
	{ kind: 'action', route: '/app/customers/new', name: 'default' },
	...['site', 'save', 'move', 'assign'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/app/jobs/[id]',
		name,
		params: job
	})),
	{ kind: 'action', route: '/app/jobs/[id]', name: 'delete', params: { id: 'doomedJob' } },
	// Adjusted and sent first, so the customer's link then has a change order to answer.
	...['adjust', 'send', 'decline'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/app/jobs/[id]/change-orders/[number]',
		name,
		params: changeOrder
	})),
	...['save', 'resolve'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/app/jobs/[id]/measure',
		name,
		params: job
	})),
	...['record', 'refund'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/app/jobs/[id]/payments',
		name,
		params: job
	})),
	...['build', 'send', 'resend', 'revokeLink'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/app/jobs/[id]/quote',
		name,
		params: job
	})),
	{ kind: 'action', route: '/app/jobs/new', name: 'default' },
	{ kind: 'action', route: '/app/payments', name: 'catchUp' },
	{ kind: 'action', route: '/app/payments', name: 'sync' },
	// The Desk's "send again" form shows only beside an e-mail that failed: an id of none here.
	{ kind: 'action', route: '/app', name: 'resend', fields: { taskId: 'no-such-task' } },
	{
		kind: 'action',
		route: '/app/price-book',
		name: 'toggle',
		fields: { id: 'priceItem', active: 'on' }
	},
	...['save', 'toggle'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/app/price-book/[id]',
		name,
		params: { id: 'priceItem' }
	})),
	{
		kind: 'action',
		route: '/app/price-book/[id]',
		name: 'delete',
		params: { id: 'doomedPriceItem' }
	},
	{
		kind: 'action',
		route: '/app/price-book/new/[section]',
		name: 'default',
		params: { section: { fixed: 'prep' } }
	},
	...['stripe', 'profile', 'papers', 'trade', 'restoreDefaults', 'logo', 'removeLogo'].map(
		(name): ActionTarget => ({
			kind: 'action',
			route: '/app/settings',
			name
		})
	),
	// The access form left with its checkboxes off: the suite checks that salespeople see no
	// costs, and turns the setting back off after every target in case a variant turned it on.
	{ kind: 'action', route: '/app/settings', name: 'access', fields: { salesJobs: 'all' } },
	{
		kind: 'action',
		route: '/app/team',
		name: 'invite',
		touchesSessions: true,
		fields: { email: 'new-hire@test.example', role: 'installer' }
	},
	{
		kind: 'action',
		route: '/app/team',
		name: 'cancel',
		touchesSessions: true,
		fields: { invitationId: 'invitation' }
	},
	{
		kind: 'action',
		route: '/app/team',
		name: 'role',
		touchesSessions: true,
		fields: { memberId: 'member', role: 'sales' }
	},
	{
		kind: 'action',
		route: '/app/team',
		name: 'remove',
		touchesSessions: true,
		fields: { memberId: 'member' }
	},
	...['pay', 'accept', 'changes', 'approveChange', 'declineChange', 'signOff'].map(
		(name): ActionTarget => ({
			kind: 'action',
			route: '/c/[token]',
			name,
			params: token,
			drawnBy: 'nobody'
		})
	),
	{
		kind: 'action',
		route: '/dev/checkout/[id]',
		name: 'pay',
		params: { id: { fixed: 'cs_test_none' } },
		fields: { card: '4242424242424242', name: 'A Payer', email: 'payer@test.example' }
	},
	...['start', 'redeliver', 'late', 'badSignature', 'payout', 'mode'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/dev/stripe',
		name
	})),
	...['checkIn', 'record', 'submit', 'complete'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/field/jobs/[id]',
		name,
		params: job,
		drawnBy: 'installer',
		...(name === 'complete' ? { fields: { walkthroughNotes: 'Walked the floor together' } } : {}),
		...(name === 'record'
			? {
					fields: {
						clientId: 'hostile-form-0001',
						roomId: 'r1',
						refKey: 'prep:hole_repair',
						amount: '2',
						note: 'Found by the door'
					}
				}
			: {})
	})),
	...['accept', 'decline'].map((name): ActionTarget => ({
		kind: 'action',
		route: '/invite/[id]',
		name,
		params: { id: 'invitation' },
		touchesSessions: true
	})),
	{
		kind: 'action',
		route: '/stores',
		name: 'switch',
		touchesSessions: true,
		fields: { storeId: 'store' }
	},
	{
		kind: 'action',
		route: '/stores',
		name: 'create',
		touchesSessions: true,
		fields: { name: 'Second Shop', timeZone: 'UTC' }
	},
	// Last: it ends the session it is sent with (every role signs in again after it).
	{ kind: 'action', route: '/sign-out', name: 'default', touchesSessions: true }
];

export const CATALOGUE: Target[] = [...loads, ...endpoints, ...actions];

/** The key a target is compared by with the routes on disk. */
export function keyOf(t: Target): string {
	if (t.kind === 'action') return `${t.route} ?/${t.name}`;
	if (t.kind === 'endpoint') return `${t.route} ${t.method}`;
	return `${t.route} load`;
}
