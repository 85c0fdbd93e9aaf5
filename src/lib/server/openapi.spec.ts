import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';
import { calculatorExamples } from '$lib/calculators/examples';
import { defaultSettings, estimate, forInstaller } from '$lib/estimating';
import { sampleJob, samplePriceBook } from '$lib/estimating/sample';
import { calculators, type CalculatorName } from '$lib/calculators/registry';
import { estimateInputSchema } from '$lib/schemas/estimate';
import { estimatePreviewSchema } from '$lib/schemas/preview';
import { calculatorInputId, openApiDocument } from './openapi';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const doc = openApiDocument() as any;
const names = Object.keys(calculators) as CalculatorName[];

/** A validator for one component, with every `#/components/...` reference resolvable. */
function validator(id: string) {
	const ajv = new Ajv2020({ strict: false, allErrors: true, validateFormats: false });
	return ajv.compile({
		$id: 'https://flushline.invalid/openapi.json',
		components: doc.components,
		$ref: `#/components/schemas/${id}`
	});
}

function refs(node: unknown, out: string[] = []): string[] {
	if (Array.isArray(node)) node.forEach((n) => refs(n, out));
	else if (node && typeof node === 'object')
		for (const [k, v] of Object.entries(node)) {
			if (k === '$ref' && typeof v === 'string') out.push(v);
			else refs(v, out);
		}
	return out;
}

// ajv compiles a validator per calculator: past vitest's 5 s on a busy two-core machine.
describe('the OpenAPI document', { timeout: 60_000 }, () => {
	it('is OpenAPI 3.1 JSON, and every reference in it resolves', () => {
		expect(JSON.parse(JSON.stringify(doc))).toEqual(doc);
		expect(doc.openapi).toBe('3.1.0');
		const all = refs(doc);
		expect(all.length).toBeGreaterThan(50);
		for (const r of all) {
			const [, kind, name] = /^#\/components\/(schemas|responses)\/(.+)$/.exec(r) ?? [];
			expect(doc.components[kind]?.[name], r).toBeDefined();
		}
		// Component schemas carry no stray $schema/$id of their own.
		for (const s of Object.values(doc.components.schemas))
			expect(Object.keys(s as object)).not.toContain('$id');
	});

	it('lists every calculator with its own input schema, example and answer', () => {
		for (const name of names) {
			const op = doc.paths[`/api/v1/calc/${name}`]?.post;
			expect(op, name).toBeDefined();
			const body = op.requestBody.content['application/json'];
			expect(body.schema).toEqual({ $ref: `#/components/schemas/${calculatorInputId(name)}` });
			expect(validator(calculatorInputId(name))(body.example), name).toBe(true);
			const answer = op.responses['200'].content['application/json'].example;
			expect(validator('CalculatorResult')(answer), name).toBe(true);
			// eslint-disable-next-line @typescript-eslint/no-explicit-any
			const run = calculators[name].run as (i: any, s: typeof defaultSettings) => unknown;
			expect(answer).toEqual(
				JSON.parse(
					JSON.stringify(
						run(calculators[name].input.parse(calculatorExamples[name]), defaultSettings)
					)
				)
			);
		}
	});

	it('has the existing routes with their bodies, the session and the error answers', () => {
		for (const path of [
			'/api/v1/me',
			'/api/v1/customers',
			'/api/v1/customers/{id}',
			'/api/v1/jobs',
			'/api/v1/jobs/{id}',
			'/api/v1/jobs/{id}/moves',
			'/api/v1/estimates/preview',
			'/api/v1/openapi.json'
		])
			expect(doc.paths[path], path).toBeDefined();
		for (const [path, item] of Object.entries(doc.paths))
			for (const [method, op] of Object.entries(item as object)) {
				if (method === 'parameters') continue;
				const responses = (op as { responses: Record<string, unknown> }).responses;
				expect(responses['401'], `${method} ${path}`).toBeDefined();
				expect(responses['403'], `${method} ${path}`).toBeDefined();
				if ((op as { requestBody?: unknown }).requestBody)
					expect(responses['400'], `${method} ${path}`).toBeDefined();
			}
		expect(doc.security).toEqual([{ session: [] }]);
		expect(doc.components.securitySchemes.session).toMatchObject({ type: 'apiKey', in: 'cookie' });
		const query = doc.paths['/api/v1/customers'].get.parameters.map(
			(p: { name: string }) => p.name
		);
		expect(query).toEqual(['q', 'sort', 'dir', 'page', 'pageSize']);
		const create = validator('CustomerInput');
		expect(create({ name: 'Ada Brook', email: '' })).toBe(true);
		expect(create({ email: 'ada@example.com' })).toBe(false);
		expect(doc.components.schemas.CustomerInput.properties.email.description).toContain(
			'checked after trimming'
		);
		expect(validator('JobMove')({ to: 'quoted' })).toBe(true);
		expect(validator('JobMove')({ to: 'teleported' })).toBe(false);
	});

	it('accepts and refuses what zod accepts and refuses for a whole job', () => {
		const input = JSON.parse(
			JSON.stringify({ job: sampleJob(6), settings: defaultSettings, priceBook: samplePriceBook })
		);
		const asJsonSchema = validator('EstimateInput');
		expect(estimateInputSchema.safeParse(input).success).toBe(true);
		expect(asJsonSchema(input)).toBe(true);
		const preview = validator('EstimatePreviewInput');
		expect(preview({ job: input.job })).toBe(true);
		expect(estimatePreviewSchema.safeParse({ job: input.job }).success).toBe(true);
		expect(
			preview(
				doc.paths['/api/v1/estimates/preview'].post.requestBody.content['application/json'].example
			)
		).toBe(true);

		const bad = structuredClone(input);
		bad.job.rooms[0].shape = { kind: 'rect', widthIn: -3, lengthIn: 100 };
		bad.settings.wastePct.straight = 140;
		bad.priceBook.floors[0].labourCentsPerSqFt = 1.5;
		expect(estimateInputSchema.safeParse(bad).success).toBe(false);
		expect(asJsonSchema(bad)).toBe(false);
		const paths = (asJsonSchema.errors ?? []).map((e) => e.instancePath);
		expect(paths).toEqual(
			expect.arrayContaining([
				'/settings/wastePct/straight',
				'/priceBook/floors/0/labourCentsPerSqFt'
			])
		);
	});

	it('describes the staff estimate and the installer view apart', () => {
		const result = JSON.parse(
			JSON.stringify(
				estimate({ job: sampleJob(3), settings: defaultSettings, priceBook: samplePriceBook })
			)
		);
		const installer = JSON.parse(
			JSON.stringify({
				ok: result.ok,
				errors: result.errors,
				warnings: result.warnings,
				...forInstaller(result)
			})
		);
		const { pay: _p, installerPayCents: _i, margin: _m, ...sell } = result;
		expect(validator('EstimateResult')(result)).toBe(true);
		expect(validator('SellEstimate')(sell)).toBe(true);
		expect(validator('InstallerEstimate')(installer)).toBe(true);
		// Each answer fits one shape only: sell prices never carry pay or margin.
		expect(validator('SellEstimate')(result)).toBe(false);
		expect(validator('EstimateResult')(sell)).toBe(false);
		expect(validator('SellEstimate')({ ...sell, margin: result.margin })).toBe(false);
		// An answer with prices is never an installer view.
		expect(validator('InstallerEstimate')({ ...installer, lines: result.lines })).toBe(false);
		expect(validator('EstimateResult')(installer)).toBe(false);
	});
});
