ALTER TABLE "store_settings" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "price_item" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "site" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "measure" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "quote" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
-- A sent quote is frozen: what it says (inputs, result, money, version) can never change again;
-- only its lifecycle columns (acceptance, change request, superseding) may.
CREATE FUNCTION quote_frozen_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF OLD.status <> 'draft' AND (
		NEW.input IS DISTINCT FROM OLD.input OR
		NEW.result IS DISTINCT FROM OLD.result OR
		NEW.version IS DISTINCT FROM OLD.version OR
		NEW.job_id IS DISTINCT FROM OLD.job_id OR
		NEW.currency IS DISTINCT FROM OLD.currency OR
		NEW.subtotal_cents IS DISTINCT FROM OLD.subtotal_cents OR
		NEW.tax_cents IS DISTINCT FROM OLD.tax_cents OR
		NEW.total_cents IS DISTINCT FROM OLD.total_cents OR
		NEW.deposit_cents IS DISTINCT FROM OLD.deposit_cents OR
		NEW.valid_until IS DISTINCT FROM OLD.valid_until
	) THEN
		RAISE EXCEPTION 'quote % version % was sent and is frozen; make a new version', OLD.job_id, OLD.version
			USING ERRCODE = 'check_violation';
	END IF;
	IF OLD.status <> 'draft' AND NEW.status = 'draft' THEN
		RAISE EXCEPTION 'a sent quote cannot return to draft' USING ERRCODE = 'check_violation';
	END IF;
	RETURN NEW;
END;
$$;--> statement-breakpoint
CREATE TRIGGER quote_frozen BEFORE UPDATE ON "quote" FOR EACH ROW EXECUTE FUNCTION quote_frozen_guard();--> statement-breakpoint
CREATE FUNCTION quote_no_delete_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF OLD.status <> 'draft' THEN
		RAISE EXCEPTION 'a sent quote is kept for good' USING ERRCODE = 'check_violation';
	END IF;
	RETURN OLD;
END;
$$;--> statement-breakpoint
CREATE TRIGGER quote_kept BEFORE DELETE ON "quote" FOR EACH ROW EXECUTE FUNCTION quote_no_delete_guard();
