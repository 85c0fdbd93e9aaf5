/**
 * The JSON API as an OpenAPI 3.1 document. Request bodies and query parameters come from the
 * same zod schemas the routes validate with (zod 4's `z.toJSONSchema`, JSON Schema 2020-12, the
 * dialect of OpenAPI 3.1); responses are written here and checked against the real routes by
 * the browser tests. Calculator examples carry the engine's own answer.
 */
import { z } from 'zod';
import { calculatorExamples } from '$lib/calculators/examples';
import { CALCULATOR_ORDER } from '$lib/calculators/forms';
import { defaultSettings, type StoreSettings } from '$lib/estimating';
import { sampleJob, samplePriceBook } from '$lib/estimating/sample';
import { JOB_STATUSES } from '$lib/jobs/status';
import { customerListSchema, customerPatchSchema, customerSchema } from '$lib/schemas/customer';
import { calculators, type CalculatorName, type CalculatorResult } from '$lib/calculators/registry';
import {
	estimateInputSchema,
	jobSchema,
	priceBookSchema,
	settingsSchema
} from '$lib/schemas/estimate';
import { optionalEmail, phone } from '$lib/schemas/fields';
import { jobCreateSchema, jobListSchema, jobMoveSchema, jobUpdateSchema } from '$lib/schemas/job';
import { estimatePreviewSchema } from '$lib/schemas/preview';
import { ROLES } from './permissions';

type Json = Record<string, unknown>;

const ref = (id: string) => ({ $ref: `#/components/schemas/${id}` });
const pascal = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** The component name of a calculator's input, e.g. `CartonsCalculatorInput`. */
export const calculatorInputId = (name: CalculatorName) => `${pascal(name)}CalculatorInput`;

/**
 * Checks applied after a transform (an e-mail's format once it is trimmed) are not part of the
 * input's JSON Schema: said in words instead, so the document claims no more than it checks.
 */
const AFTER_TRANSFORM = new Map<z.ZodType, string>([
	[
		optionalEmail,
		'An e-mail address such as name@example.com, checked after trimming; empty or left out for none (null)'
	],
	[
		phone,
		'A phone number of 7 to 20 digits, spaces and + ( ) . -, checked after trimming; empty or left out for none (null)'
	]
]);

function toJsonSchema(schema: z.ZodType | z.core.$ZodRegistry<{ id?: string }>) {
	return z.toJSONSchema(schema as never, {
		target: 'draft-2020-12',
		io: 'input',
		// Anything zod cannot state in JSON Schema fails here (and in the tests), never silently.
		unrepresentable: 'throw',
		uri: (id: string) => `#/components/schemas/${id}`,
		override: (ctx: { zodSchema: unknown; jsonSchema: Json }) => {
			const note = AFTER_TRANSFORM.get(ctx.zodSchema as z.ZodType);
			if (note) ctx.jsonSchema.description = note;
		}
	}) as Json;
}

function clean(schema: Json): Json {
	const { $schema: _s, $id: _i, ...rest } = schema;
	return rest;
}

/** Request schemas from zod, as components that refer to each other. */
function requestSchemas(): Record<string, Json> {
	const registry = z.registry<{ id: string }>();
	registry.add(settingsSchema, { id: 'StoreSettings' });
	registry.add(priceBookSchema, { id: 'PriceBook' });
	registry.add(jobSchema, { id: 'JobMeasure' });
	registry.add(estimateInputSchema, { id: 'EstimateInput' });
	registry.add(estimatePreviewSchema, { id: 'EstimatePreviewInput' });
	for (const name of CALCULATOR_ORDER)
		registry.add(calculators[name].input, { id: calculatorInputId(name) });
	registry.add(customerSchema, { id: 'CustomerInput' });
	registry.add(customerPatchSchema, { id: 'CustomerPatch' });
	registry.add(jobCreateSchema, { id: 'JobCreate' });
	registry.add(jobUpdateSchema, { id: 'JobUpdate' });
	registry.add(jobMoveSchema, { id: 'JobMove' });
	const { schemas } = toJsonSchema(registry) as { schemas: Record<string, Json> };
	return Object.fromEntries(Object.entries(schemas).map(([id, s]) => [id, clean(s)]));
}

/** Query parameters from a zod object schema. */
function queryParameters(schema: z.ZodObject): Json[] {
	const json = clean(toJsonSchema(schema)) as { properties: Record<string, Json> };
	return Object.entries(json.properties).map(([name, s]) => ({
		name,
		in: 'query',
		required: false,
		schema: s
	}));
}

const text = { type: 'string' };
const nullableText = { type: ['string', 'null'] };
const time = { type: 'string', format: 'date-time' };
const integer = { type: 'integer' };
const object = (properties: Record<string, unknown>, required = Object.keys(properties)): Json => ({
	type: 'object',
	properties,
	required
});
const list = (items: unknown) => ({ type: 'array', items });

/** The engine's whole result, as the preview sends it to those who see costs. */
const estimateProperties = {
	ok: { type: 'boolean' },
	errors: list(object({ path: text, roomId: text, message: text }, ['path', 'message'])),
	rooms: list({ type: 'object' }),
	findings: list({ type: 'object' }),
	lines: { ...list({ type: 'object' }), description: 'Customer prices, integer cents' },
	pay: { ...list({ type: 'object' }), description: 'Installer pay, integer cents' },
	totals: { type: 'object' },
	installerPayCents: integer,
	margin: { type: 'object' },
	schedule: { type: 'object' },
	cautions: list(object({ kind: text, text, roomIds: list(text), lineIds: list(text) })),
	warnings: list(object({ roomId: text, message: text }, ['message']))
};
const {
	pay: _pay,
	installerPayCents: _payTotal,
	margin: _margin,
	...sellProperties
} = estimateProperties;
const page = (row: string) =>
	object({ rows: list(ref(row)), total: integer, page: integer, pageSize: integer });

/** Response schemas, written from the query modules and checked against the routes in tests. */
function responseSchemas(): Record<string, Json> {
	const status = { type: 'string', enum: [...JOB_STATUSES] };
	return {
		Error: object(
			{
				message: text,
				code: { ...text, description: 'A reference to the server log line (unexpected errors)' }
			},
			['message']
		),
		ValidationError: object({
			message: text,
			issues: list(
				object({
					path: {
						...text,
						description:
							'Dotted path of the bad field (`job.rooms.0.shape.widthIn`); `(body)` for the whole body'
					},
					message: text
				})
			)
		}),
		Me: object({
			user: object({ id: text, name: text, email: text }),
			store: object({ id: text, name: text, slug: text, logo: nullableText }),
			role: { type: 'string', enum: [...ROLES] }
		}),
		Customer: object({
			id: text,
			organizationId: text,
			name: text,
			email: nullableText,
			phone: nullableText,
			notes: text,
			createdAt: time,
			updatedAt: time
		}),
		CustomerPage: page('Customer'),
		Job: {
			...object({
				id: text,
				organizationId: text,
				number: integer,
				customerId: text,
				siteId: nullableText,
				title: text,
				status,
				salespersonId: nullableText,
				installerId: nullableText,
				notes: text,
				statusChangedAt: time,
				createdAt: time,
				updatedAt: time
			}),
			description: 'A job as saved (after a create, a change or a move)'
		},
		JobView: {
			...object({
				id: text,
				number: integer,
				title: text,
				status,
				customerId: text,
				customerName: text,
				customerPhone: nullableText,
				installerId: nullableText,
				installerName: nullableText,
				salespersonId: nullableText,
				salespersonName: nullableText,
				notes: text,
				statusChangedAt: time,
				updatedAt: time,
				createdAt: time
			}),
			description: "A job with its customer's and people's names, as read and listed"
		},
		JobPage: object({
			rows: list(ref('JobView')),
			total: {
				...integer,
				description:
					"How many jobs match, counted up to 1,000 past the page's start; with a search whose matches fill the page among the list's first 2,000 rows, only up to the page's end"
			},
			totalCapped: {
				type: 'boolean',
				description: 'The count stopped at `total`: more jobs match (shown as "1,000+", or "50+")'
			},
			page: integer,
			pageSize: integer
		}),
		CalculatorResult: {
			...object(
				{
					ok: {
						type: 'boolean',
						description:
							'false when the body is well formed but cannot be worked out (an unreadable length, a self-crossing outline): `message` says why and `field`, where there is one, names it'
					},
					rule: { ...text, description: 'The rule applied, in words and symbols' },
					source: {
						...text,
						description: 'Where the rule comes from (published, secondary, common practice, memory)'
					},
					cautions: {
						...list(text),
						description: 'Cautions to show beside the answer'
					},
					message: text,
					field: text
				},
				['ok', 'rule', 'source', 'cautions']
			),
			description:
				"A calculator's answer: its own figures (see each calculator's example) with the rule, its source and the cautions"
		},
		EstimateResult: {
			...object(estimateProperties),
			description:
				'The whole estimate (who sees costs): takeoff by room, findings tied to lines, prices, pay, margin, schedule and cautions'
		},
		SellEstimate: {
			...object(sellProperties),
			not: {
				anyOf: [
					{ required: ['pay'] },
					{ required: ['installerPayCents'] },
					{ required: ['margin'] }
				]
			},
			description:
				'The estimate at sell prices (salespeople, unless the store shows them costs): no installer pay, pay total or margin'
		},
		InstallerEstimate: {
			...object({
				ok: { type: 'boolean' },
				errors: list(object({ path: text, roomId: text, message: text }, ['path', 'message'])),
				warnings: list(object({ roomId: text, message: text }, ['message'])),
				rooms: list({ type: 'object' }),
				findings: list({ type: 'object' }),
				work: list(
					object(
						{
							id: text,
							roomId: text,
							description: text,
							basis: text,
							qty: { type: 'number' },
							group: text
						},
						['id', 'description', 'basis', 'qty', 'group']
					)
				),
				pay: list({ type: 'object' }),
				installerPayCents: integer,
				schedule: { type: 'object' },
				cautions: list(text)
			}),
			not: { anyOf: [{ required: ['lines'] }, { required: ['totals'] }, { required: ['margin'] }] },
			description:
				'What an installer gets: quantities, prep, pay and schedule; never store prices or margins'
		}
	};
}

const json = (schema: unknown, extra: Json = {}) => ({
	content: { 'application/json': { schema, ...extra } }
});
const response = (description: string, schema?: unknown, extra: Json = {}) =>
	schema ? { description, ...json(schema, extra) } : { description };
const errors = {
	'400': { $ref: '#/components/responses/ValidationError' },
	'401': { $ref: '#/components/responses/Unauthorized' },
	'403': { $ref: '#/components/responses/Forbidden' }
};
const notFound = { '404': { $ref: '#/components/responses/NotFound' } };
const unsupported = { '415': { $ref: '#/components/responses/UnsupportedMediaType' } };
const idParameter = { name: 'id', in: 'path', required: true, schema: text };

/** JSON without undefined members, as the route sends it. */
const asSent = (v: unknown) => JSON.parse(JSON.stringify(v)) as unknown;

function calculatorPaths(): Record<string, Json> {
	return Object.fromEntries(
		CALCULATOR_ORDER.map((name) => {
			const c = calculators[name];
			const example = calculatorExamples[name];
			const run = c.run as (i: unknown, s: StoreSettings) => CalculatorResult;
			const answer = asSent(run(c.input.parse(example), defaultSettings));
			return [
				`/api/v1/calc/${name}`,
				{
					post: {
						operationId: `calc${pascal(name)}`,
						tags: ['Calculators'],
						summary: c.title,
						description: `${c.summary} Uses the store's saved settings. Any member may call it (installers too): no prices are involved.`,
						requestBody: { required: true, ...json(ref(calculatorInputId(name)), { example }) },
						responses: {
							'200': response(
								"The engine's answer (the example is with the engine's default settings)",
								ref('CalculatorResult'),
								{ example: answer }
							),
							...errors,
							...unsupported
						}
					}
				}
			];
		})
	);
}

/** The whole document; built from the schemas on each call (a few milliseconds). */
export function openApiDocument(): Json {
	const previewExample = { job: sampleJob(1), priceBook: samplePriceBook };
	return {
		openapi: '3.1.0',
		jsonSchemaDialect: 'https://json-schema.org/draft/2020-12/schema',
		info: {
			title: 'Flushline JSON API',
			version: '1',
			description:
				'The install desk of a flooring store. Every route needs a signed-in member of the active store (the session cookie). Lengths are inches, areas ft², money integer cents. A refused body is 400 with the path of each bad field.'
		},
		tags: [
			{ name: 'Me' },
			{ name: 'Customers' },
			{ name: 'Jobs' },
			{ name: 'Estimates' },
			{ name: 'Calculators' },
			{ name: 'Documents' }
		],
		security: [{ session: [] }],
		paths: {
			'/api/v1/me': {
				get: {
					operationId: 'me',
					tags: ['Me'],
					summary: 'The user, the active store and the role',
					responses: { '200': response('Who is calling', ref('Me')), ...errors }
				}
			},
			'/api/v1/customers': {
				get: {
					operationId: 'listCustomers',
					tags: ['Customers'],
					summary: "A page of the store's customers (owner, manager, sales)",
					parameters: queryParameters(customerListSchema),
					responses: { '200': response('A page of customers', ref('CustomerPage')), ...errors }
				},
				post: {
					operationId: 'createCustomer',
					tags: ['Customers'],
					summary: 'A new customer (owner, manager, sales)',
					requestBody: { required: true, ...json(ref('CustomerInput')) },
					responses: {
						'201': response('The customer', ref('Customer')),
						...errors,
						...unsupported
					}
				}
			},
			'/api/v1/customers/{id}': {
				parameters: [idParameter],
				get: {
					operationId: 'readCustomer',
					tags: ['Customers'],
					summary: 'One customer (owner, manager, sales)',
					responses: { '200': response('The customer', ref('Customer')), ...errors, ...notFound }
				},
				patch: {
					operationId: 'changeCustomer',
					tags: ['Customers'],
					summary: 'Change some fields (owner, manager, sales)',
					requestBody: { required: true, ...json(ref('CustomerPatch')) },
					responses: {
						'200': response('The customer', ref('Customer')),
						...errors,
						...notFound,
						...unsupported
					}
				},
				delete: {
					operationId: 'deleteCustomer',
					tags: ['Customers'],
					summary: 'Delete a customer without jobs (owner, manager)',
					responses: {
						'204': response('Deleted'),
						...errors,
						...notFound,
						'409': response('The customer has jobs and is kept', ref('Error'))
					}
				}
			},
			'/api/v1/jobs': {
				get: {
					operationId: 'listJobs',
					tags: ['Jobs'],
					summary: "A page of the store's jobs (staff; installers: their own)",
					parameters: queryParameters(jobListSchema),
					responses: { '200': response('A page of jobs', ref('JobPage')), ...errors }
				},
				post: {
					operationId: 'createJob',
					tags: ['Jobs'],
					summary: 'A draft job for a customer of the store (owner, manager, sales)',
					requestBody: { required: true, ...json(ref('JobCreate')) },
					responses: {
						'201': response('The job', ref('Job')),
						...errors,
						'404': response('No such customer in this store', ref('Error')),
						...unsupported
					}
				}
			},
			'/api/v1/jobs/{id}': {
				parameters: [idParameter],
				get: {
					operationId: 'readJob',
					tags: ['Jobs'],
					summary: 'One job (staff; installers: their own)',
					responses: { '200': response('The job', ref('JobView')), ...errors, ...notFound }
				},
				patch: {
					operationId: 'changeJob',
					tags: ['Jobs'],
					summary: 'Change the title and notes (owner, manager, sales)',
					requestBody: { required: true, ...json(ref('JobUpdate')) },
					responses: {
						'200': response('The job', ref('Job')),
						...errors,
						...notFound,
						...unsupported
					}
				},
				delete: {
					operationId: 'deleteJob',
					tags: ['Jobs'],
					summary: 'Delete a draft or cancelled job (owner, manager)',
					responses: {
						'204': response('Deleted'),
						...errors,
						...notFound,
						'409': response(
							'Only a draft or cancelled job with no quote and no payment can be deleted',
							ref('Error')
						)
					}
				}
			},
			'/api/v1/jobs/{id}/moves': {
				parameters: [idParameter],
				post: {
					operationId: 'moveJob',
					tags: ['Jobs'],
					summary: 'Move a job to another status (owner, manager)',
					requestBody: { required: true, ...json(ref('JobMove')) },
					responses: {
						'200': response('The job', ref('Job')),
						...errors,
						...notFound,
						'409': response('The move is not allowed from the current status', ref('Error')),
						...unsupported
					}
				}
			},
			'/api/v1/estimates/preview': {
				post: {
					operationId: 'previewEstimate',
					tags: ['Estimates'],
					summary: 'The whole estimate of a job, saved nowhere',
					description:
						"Settings and price book left out of the body are the store's own. Owners and managers get the whole result; salespeople get it at sell prices, without installer pay or margin, unless the store shows them costs; installers get the installer view (quantities, prep, their pay, schedule), never store prices or margins.",
					requestBody: {
						required: true,
						...json(ref('EstimatePreviewInput'), { example: previewExample })
					},
					responses: {
						'200': response('The estimate', {
							oneOf: [ref('EstimateResult'), ref('SellEstimate'), ref('InstallerEstimate')]
						}),
						...errors,
						...unsupported
					}
				}
			},
			...calculatorPaths(),
			'/api/v1/openapi.json': {
				get: {
					operationId: 'openApi',
					tags: ['Documents'],
					summary: 'This document',
					responses: { '200': response('OpenAPI 3.1', { type: 'object' }), ...errors }
				}
			}
		},
		components: {
			securitySchemes: {
				session: {
					type: 'apiKey',
					in: 'cookie',
					name: 'better-auth.session_token',
					description:
						'The session cookie set by signing in (the /sign-in form); over HTTPS its name carries the __Secure- prefix.'
				}
			},
			responses: {
				ValidationError: response(
					'A field is not valid: the path and message of each',
					ref('ValidationError')
				),
				Unauthorized: response('No session: sign in first', ref('Error')),
				Forbidden: response(
					'Not a member of an active store, or the role may not do this',
					ref('Error')
				),
				NotFound: response("Not found (another store's row is not found either)", ref('Error')),
				UnsupportedMediaType: response(
					'The body is not sent as application/json',
					ref('ValidationError')
				)
			},
			schemas: { ...requestSchemas(), ...responseSchemas() }
		}
	};
}
