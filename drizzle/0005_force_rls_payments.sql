ALTER TABLE "payment" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "refund" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "stripe_event" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
-- Money in the ledger is kept for good: a payment or refund is never deleted, only refunded or failed.
CREATE FUNCTION ledger_kept_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	RAISE EXCEPTION 'payments and refunds are kept for good' USING ERRCODE = 'check_violation';
END;
$$;--> statement-breakpoint
CREATE TRIGGER payment_kept BEFORE DELETE ON "payment" FOR EACH ROW EXECUTE FUNCTION ledger_kept_guard();--> statement-breakpoint
CREATE TRIGGER refund_kept BEFORE DELETE ON "refund" FOR EACH ROW EXECUTE FUNCTION ledger_kept_guard();
