// Every exported load, form action and request handler under src/routes calls a guard before
// anything else runs. The routes are read with the TypeScript compiler (not patterns), so a guard
// is recognised by what the called name resolves to, through imports and helpers.
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import ts from 'typescript';
import { afterAll, describe, expect, it } from 'vitest';

const root = process.cwd();
const rel = (file: string) => path.relative(root, file).split(path.sep).join('/');

/** Every export of this module is a guard. */
const GUARDS_MODULE = 'src/lib/server/guards.ts';

/** Guards kept elsewhere, each for callers who are not members of a store. */
const OTHER_GUARDS: Record<string, string> = {
	'src/lib/server/customer-page.ts#openLink': "a customer's signed, unexpired link",
	'src/routes/dev/stripe/fake.server.ts#requireStripeFake': '404 unless the Stripe fake is on',
	'src/lib/server/stripe.ts#verifiedEvent': "Stripe's signature on a webhook event"
};

/** Handlers that need no guard call, and why; each entry must still exist. */
const OPEN: Record<string, string> = {
	'src/routes/+layout.server.ts#load': 'who is signed in, for the header; it decides nothing',
	'src/routes/(auth)/sign-in/+page.server.ts#load': 'the sign-in page is for people signed out',
	'src/routes/(auth)/sign-in/+page.server.ts#actions.default': 'signing in',
	'src/routes/(auth)/sign-up/+page.server.ts#load': 'the sign-up page is for people signed out',
	'src/routes/(auth)/sign-up/+page.server.ts#actions.default': 'creating a login',
	'src/routes/(auth)/forgot-password/+page.server.ts#actions.default':
		'asking for a reset link (the same answer for any address)',
	'src/routes/(auth)/reset-password/+page.server.ts#load': 'the reset page, from its e-mail link',
	'src/routes/(auth)/reset-password/+page.server.ts#actions.default':
		'setting a new password with the token from the e-mail',
	'src/routes/sign-out/+page.server.ts#load': 'a GET only goes home',
	'src/routes/health/+server.ts#GET':
		"the load balancer's health check: answers ok, reads and writes nothing",
	'src/routes/sign-out/+page.server.ts#actions.default':
		'signing out ends whatever session there is',
	'src/routes/invite/[id]/+page.server.ts#load':
		"anyone with the link sees the store's name; the rest only the invitee, signed in",
	'src/routes/dev/outbox/+page.server.ts#load':
		'the e-mail fake: its first line answers 404 unless the fake is on'
};

/** Calls that may come before the guard: they read nothing and write nothing of a store. */
const HARMLESS_FIRST = new Set(['setHeaders']);

const HANDLERS = {
	'+server.ts': ['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS', 'HEAD', 'fallback'],
	'+page.server.ts': ['load', 'actions'],
	'+layout.server.ts': ['load']
} as const;

type Kind = keyof typeof HANDLERS;

function kindOf(file: string): Kind | undefined {
	const base = path.basename(file);
	return (Object.keys(HANDLERS) as Kind[]).find((k) => base === k);
}

function routeFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
		const full = path.join(dir, e.name);
		if (e.isDirectory()) return routeFiles(full);
		return kindOf(full) ? [full] : [];
	});
}

/**
 * The routes and the project's own modules they import, nothing else: guards and helpers are
 * project code, and leaving out packages and type declarations keeps this fast.
 */
function program(files: string[]) {
	const config = ts.getParsedCommandLineOfConfigFile(
		path.join(root, 'tsconfig.json'),
		{ noEmit: true },
		{ ...ts.sys, onUnRecoverableConfigFileDiagnostic: (d) => console.error(d.messageText) }
	);
	if (!config) throw new Error('tsconfig.json could not be read (run `svelte-kit sync` first)');
	const options = { ...config.options, types: [], noLib: true };
	const host = ts.createCompilerHost(options);
	host.resolveModuleNameLiterals = (literals, containingFile, _redirect, opts) =>
		literals.map((literal) => {
			const found = ts.resolveModuleName(literal.text, containingFile, opts, host);
			const file = found.resolvedModule?.resolvedFileName ?? '';
			const ours = file && !file.includes('/node_modules/') && !file.endsWith('.d.ts');
			return ours ? found : { resolvedModule: undefined };
		});
	return ts.createProgram(files, options, host);
}

interface Finding {
	handler: string;
	problem: string;
}

function unwrap(node: ts.Expression): ts.Expression {
	let n = node;
	while (
		ts.isParenthesizedExpression(n) ||
		ts.isAsExpression(n) ||
		ts.isSatisfiesExpression(n) ||
		ts.isTypeAssertionExpression(n)
	) {
		n = n.expression;
	}
	return n;
}

type FunctionNode =
	ts.ArrowFunction | ts.FunctionExpression | ts.FunctionDeclaration | ts.MethodDeclaration;

const isFunctionNode = (n: ts.Node): n is FunctionNode =>
	ts.isArrowFunction(n) ||
	ts.isFunctionExpression(n) ||
	ts.isFunctionDeclaration(n) ||
	ts.isMethodDeclaration(n);

/** Checks route files; returns what is wrong, one finding per unguarded handler. */
export function unguardedHandlers(files: string[]): { findings: Finding[]; handlers: string[] } {
	const prog = program(files);
	const checker = prog.getTypeChecker();
	const findings: Finding[] = [];
	const handlers: string[] = [];

	function declarationOf(node: ts.Node): ts.Declaration | undefined {
		let symbol = checker.getSymbolAtLocation(node);
		if (symbol && symbol.flags & ts.SymbolFlags.Alias) symbol = checker.getAliasedSymbol(symbol);
		return symbol?.valueDeclaration ?? symbol?.declarations?.[0];
	}

	function nameOf(decl: ts.Declaration): string {
		const name = ts.getNameOfDeclaration(decl);
		return name && ts.isIdentifier(name) ? name.text : '';
	}

	/** The first call that runs in a function: arguments before the call they are passed to. */
	function firstCall(fn: FunctionNode): ts.CallExpression | ts.NewExpression | undefined {
		let found: ts.CallExpression | ts.NewExpression | undefined;
		const visit = (n: ts.Node): void => {
			if (found || ts.isTypeNode(n) || (n !== fn && isFunctionNode(n))) return;
			ts.forEachChild(n, visit);
			if (found) return;
			if (ts.isCallExpression(n) || ts.isNewExpression(n)) {
				const callee = unwrap(n.expression);
				if (ts.isIdentifier(callee) && HARMLESS_FIRST.has(callee.text)) {
					const decl = declarationOf(callee);
					if (decl && (ts.isBindingElement(decl) || ts.isParameter(decl))) return;
				}
				found = n;
			}
		};
		visit(fn);
		return found;
	}

	/** Whether a call inside a function runs every time the function does (not behind a branch). */
	function always(call: ts.Node, fn: FunctionNode): boolean {
		for (
			let child = call, node = call.parent;
			node && node !== fn;
			child = node, node = node.parent
		) {
			if (ts.isIfStatement(node) && child !== node.expression) return false;
			if (ts.isConditionalExpression(node) && child !== node.condition) return false;
			if (ts.isCaseClause(node) || ts.isDefaultClause(node) || ts.isCatchClause(node)) return false;
			if (ts.isIterationStatement(node, false)) return false;
			if (ts.isBinaryExpression(node) && child === node.right) {
				const op = node.operatorToken.kind;
				if (
					op === ts.SyntaxKind.AmpersandAmpersandToken ||
					op === ts.SyntaxKind.BarBarToken ||
					op === ts.SyntaxKind.QuestionQuestionToken ||
					op === ts.SyntaxKind.AmpersandAmpersandEqualsToken ||
					op === ts.SyntaxKind.BarBarEqualsToken ||
					op === ts.SyntaxKind.QuestionQuestionEqualsToken
				)
					return false;
			}
			if (ts.isCallExpression(node) && node.questionDotToken) return false;
		}
		return true;
	}

	/** Why a function does not begin with a guard, or null when it does. */
	function guardProblem(fn: FunctionNode, depth: number): string | null {
		const call = firstCall(fn);
		if (!call) return 'calls no guard';
		const callee = unwrap(call.expression);
		if (!always(call, fn)) return `begins with ${callee.getText()}() behind a condition`;
		const target = ts.isPropertyAccessExpression(callee) ? callee.name : callee;
		const decl = declarationOf(target);
		const shown = callee.getText();
		if (!decl) return `begins with ${shown}(), which is not a guard`;
		const file = rel(decl.getSourceFile().fileName);
		if (file === GUARDS_MODULE) return null;
		if (`${file}#${nameOf(decl)}` in OTHER_GUARDS) return null;
		// A helper of the project that itself begins with a guard (a shared load or action).
		const helper = asFunction(decl);
		if (helper && !file.startsWith('node_modules/') && depth < 4) {
			const inner = guardProblem(helper, depth + 1);
			return inner && `begins with ${shown}(), which ${inner}`;
		}
		return `begins with ${shown}(), which is not a guard`;
	}

	function asFunction(decl: ts.Node): FunctionNode | undefined {
		if (isFunctionNode(decl)) return decl;
		if (ts.isVariableDeclaration(decl) && decl.initializer) {
			const init = unwrap(decl.initializer);
			if (isFunctionNode(init)) return init;
		}
		return undefined;
	}

	/** A handler value: a function, a wrapper call around one, or a name for either. */
	function checkHandler(handler: string, value: ts.Node, depth = 0): void {
		handlers.push(handler);
		const node = ts.isExpression(value) ? unwrap(value) : value;
		if (isFunctionNode(node)) {
			const problem = guardProblem(node, 0);
			if (problem) findings.push({ handler, problem });
			return;
		}
		if (ts.isCallExpression(node)) {
			// A wrapper such as endpoint(async (event) => …): the function passed is the handler.
			const inner = node.arguments.map(unwrap).find(isFunctionNode);
			if (inner) {
				handlers.pop();
				return checkHandler(handler, inner, depth);
			}
		}
		if (ts.isIdentifier(node) && depth < 4) {
			const decl = declarationOf(node);
			const target = decl && (asFunction(decl) ?? initializerOf(decl));
			if (target) {
				handlers.pop();
				return checkHandler(handler, target, depth + 1);
			}
		}
		findings.push({ handler, problem: `is written in a form this check cannot follow` });
	}

	function initializerOf(decl: ts.Declaration): ts.Expression | undefined {
		return ts.isVariableDeclaration(decl) && decl.initializer ? decl.initializer : undefined;
	}

	/** The form actions of an `actions` object, by name. */
	function checkActions(prefix: string, value: ts.Expression, depth = 0): void {
		const node = unwrap(value);
		if (ts.isIdentifier(node) && depth < 4) {
			const decl = declarationOf(node);
			const init = decl && initializerOf(decl);
			if (init) return checkActions(prefix, init, depth + 1);
		}
		if (!ts.isObjectLiteralExpression(node)) {
			findings.push({
				handler: prefix,
				problem: 'is not an object of actions this check can read'
			});
			return;
		}
		for (const prop of node.properties) {
			const name = prop.name && ts.isIdentifier(prop.name) ? prop.name.text : prop.name?.getText();
			const handler = `${prefix}.${name}`;
			if (ts.isPropertyAssignment(prop)) checkHandler(handler, prop.initializer);
			else if (ts.isMethodDeclaration(prop)) checkHandler(handler, prop);
			else if (ts.isShorthandPropertyAssignment(prop)) {
				let symbol = checker.getShorthandAssignmentValueSymbol(prop);
				if (symbol && symbol.flags & ts.SymbolFlags.Alias)
					symbol = checker.getAliasedSymbol(symbol);
				const decl = symbol?.valueDeclaration ?? symbol?.declarations?.[0];
				const target = decl && (asFunction(decl) ?? initializerOf(decl));
				if (target) checkHandler(handler, target);
				else findings.push({ handler, problem: 'names something this check cannot follow' });
			} else if (ts.isSpreadAssignment(prop)) checkActions(prefix, prop.expression, depth + 1);
			else findings.push({ handler, problem: 'is written in a form this check cannot follow' });
		}
	}

	for (const file of files) {
		const source = prog.getSourceFile(file);
		if (!source) throw new Error(`${file} was not read`);
		const names: readonly string[] = HANDLERS[kindOf(file)!];
		const at = (name: string) => `${rel(file)}#${name}`;
		for (const statement of source.statements) {
			const exported = ts.canHaveModifiers(statement)
				? ts.getModifiers(statement)?.some((m) => m.kind === ts.SyntaxKind.ExportKeyword)
				: false;
			if (ts.isExportDeclaration(statement) || ts.isExportAssignment(statement)) {
				findings.push({
					handler: at('export'),
					problem: 'exports in a form this check cannot follow: export each handler directly'
				});
			} else if (exported && ts.isFunctionDeclaration(statement) && statement.name) {
				if (names.includes(statement.name.text)) checkHandler(at(statement.name.text), statement);
			} else if (exported && ts.isVariableStatement(statement)) {
				for (const decl of statement.declarationList.declarations) {
					if (!ts.isIdentifier(decl.name) || !names.includes(decl.name.text)) continue;
					if (!decl.initializer) {
						findings.push({ handler: at(decl.name.text), problem: 'has no value' });
					} else if (decl.name.text === 'actions') {
						checkActions(at('actions'), decl.initializer);
					} else {
						checkHandler(at(decl.name.text), decl.initializer);
					}
				}
			}
		}
	}
	return { findings, handlers };
}

describe('route guards', () => {
	const files = routeFiles(path.join(root, 'src/routes'));
	const { findings, handlers } = unguardedHandlers(files);

	it('finds the routes and their handlers', () => {
		expect(files.length).toBeGreaterThan(40);
		expect(handlers).toContain('src/routes/app/jobs/[id]/+page.server.ts#actions.delete');
		expect(handlers).toContain('src/routes/api/v1/jobs/[id]/+server.ts#PATCH');
		expect(handlers).toContain('src/routes/field/calculators/+page.server.ts#actions.default');
	});

	it('has every exported load, action and handler call a guard first', () => {
		const unguarded = findings
			.filter((f) => !(f.handler in OPEN))
			.map((f) => `${f.handler} ${f.problem}`);
		expect(unguarded).toEqual([]);
	});

	it('keeps the list of open handlers true: each exists and really has no guard', () => {
		const flagged = new Set(findings.map((f) => f.handler));
		for (const handler of Object.keys(OPEN)) {
			expect(handlers, handler).toContain(handler);
			expect(flagged.has(handler), `${handler} has a guard now: take it off the list`).toBe(true);
		}
	});
});

describe('the guard check itself', () => {
	const dir = mkdtempSync(path.join(tmpdir(), 'flushline-guards-'));
	afterAll(() => rmSync(dir, { recursive: true, force: true }));
	const write = (name: string, text: string) => {
		const file = path.join(dir, name);
		writeFileSync(file, text);
		return file;
	};
	const problems = (file: string) =>
		unguardedHandlers([file]).findings.map((f) => `${f.handler.split('#')[1]} ${f.problem}`);

	it('accepts a guard first, directly, through a wrapper, a helper or a named action', () => {
		const helper = write(
			'helper.ts',
			`import { requireMember } from '$lib/server/guards';
			export async function shared() { const { store } = requireMember(); return store.id; }
			export const named = async () => { requireMember(); return {}; };`
		);
		const file = path.join(dir, '+page.server.ts');
		writeFileSync(
			file,
			`import { requirePermission } from '$lib/server/guards';
			import { shared, named } from '${helper.replace(/\.ts$/, '')}';
			export const load = async ({ setHeaders }: { setHeaders: (h: object) => void }) => {
				setHeaders({});
				const { store } = requirePermission({ job: ['read'] });
				return { id: store.id };
			};
			export const actions = {
				a: async () => { await Promise.resolve(requirePermission({ job: ['update'] })); },
				b: () => shared(),
				named,
				async c() { requirePermission({ job: ['update'] }); }
			};`
		);
		expect(problems(file)).toEqual([]);
	});

	it('refuses work before the guard, no guard, and a guard taken by an argument', () => {
		const server = write(
			'+server.ts',
			`import { requireMember } from '$lib/server/guards';
			const read = async (id: string) => id;
			export const GET = async ({ params }: { params: { id: string } }) => {
				const row = await read(params.id);
				requireMember();
				return new Response(row);
			};
			export const POST = async () => new Response('open');
			export async function PUT() { return new Response(String(requireMember())); }
			export const DELETE = async () => { const m = requireMember(String(Date.now()) as never); return new Response(String(m)); };
			export const PATCH = async ({ url }: { url: URL }) => { if (url.search) requireMember(); return new Response(''); };`
		);
		expect(problems(server)).toEqual([
			'GET begins with read(), which calls no guard',
			'POST begins with Response(), which is not a guard',
			'DELETE begins with Date.now(), which is not a guard',
			'PATCH begins with requireMember() behind a condition'
		]);
	});
});
