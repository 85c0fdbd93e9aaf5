/** Stripe's error types (https://docs.stripe.com/api/errors). */
export type StripeErrorType =
	'api_error' | 'card_error' | 'idempotency_error' | 'invalid_request_error';

export interface StripeErrorBody {
	type: StripeErrorType;
	message: string;
	code?: string;
	param?: string;
	decline_code?: string;
	doc_url?: string;
	charge?: string;
	payment_intent?: unknown;
	request_log_url?: string;
}

/**
 * A refusal in Stripe's shape: `{ error: { type, code, message, param, decline_code } }` with
 * Stripe's status code. Thrown anywhere inside the fake and turned into the response by the routes.
 */
export class StripeFakeError extends Error {
	constructor(
		readonly status: number,
		readonly body: StripeErrorBody
	) {
		super(body.message);
	}

	toJSON() {
		const doc = this.body.code
			? { doc_url: `https://docs.stripe.com/error-codes/${this.body.code}` }
			: {};
		return { error: { ...doc, ...this.body } };
	}
}

/** 400 invalid_request_error naming the parameter. */
export function invalid(message: string, param?: string, code?: string) {
	return new StripeFakeError(400, { type: 'invalid_request_error', message, param, code });
}

/** 404 resource_missing, as Stripe answers for an id it does not have. */
export function missing(kind: string, id: string, param = 'id') {
	return new StripeFakeError(404, {
		type: 'invalid_request_error',
		code: 'resource_missing',
		message: `No such ${kind}: '${id}'`,
		param
	});
}

/** A missing object named in a create call's parameters: Stripe answers 400 for those. */
export function missingParam(kind: string, id: string, param: string) {
	return new StripeFakeError(400, {
		type: 'invalid_request_error',
		code: 'resource_missing',
		message: `No such ${kind}: '${id}'`,
		param
	});
}
