-- The installer's half (issue 10): row security forced on its tables, as on every store table.
ALTER TABLE "installer_profile" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "installer_time_off" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "booking" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "field_report" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "field_item" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "field_photo" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "change_order" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "job_completion" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "installer_statement" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "installer_statement_line" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
-- A change order starts as submitted and moves only as $lib/jobs/change-order-status.ts says
-- (submitted → reviewed → approved | declined; submitted → declined). Once sent to the customer (reviewed) its figures are
-- what the customer saw; once decided, the decision is kept as it is, so it cannot be approved twice.
CREATE FUNCTION change_order_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF TG_OP = 'INSERT' THEN
		IF NEW.status <> 'submitted' THEN
			RAISE EXCEPTION 'a change order starts as submitted' USING ERRCODE = 'check_violation';
		END IF;
		RETURN NEW;
	END IF;
	IF NEW.status IS DISTINCT FROM OLD.status AND NOT (
		(OLD.status = 'submitted' AND NEW.status IN ('reviewed', 'declined')) OR
		(OLD.status = 'reviewed' AND NEW.status IN ('approved', 'declined'))
	) THEN
		RAISE EXCEPTION 'change order % of job % cannot move from % to %', OLD.number, OLD.job_id, OLD.status, NEW.status
			USING ERRCODE = 'check_violation';
	END IF;
	IF OLD.status <> 'submitted' AND (
		NEW.job_id IS DISTINCT FROM OLD.job_id OR
		NEW.report_id IS DISTINCT FROM OLD.report_id OR
		NEW.number IS DISTINCT FROM OLD.number OR
		NEW.input IS DISTINCT FROM OLD.input OR
		NEW.result IS DISTINCT FROM OLD.result OR
		NEW.adjustments IS DISTINCT FROM OLD.adjustments OR
		NEW.currency IS DISTINCT FROM OLD.currency OR
		NEW.subtotal_cents IS DISTINCT FROM OLD.subtotal_cents OR
		NEW.tax_cents IS DISTINCT FROM OLD.tax_cents OR
		NEW.total_cents IS DISTINCT FROM OLD.total_cents OR
		NEW.pay_delta_cents IS DISTINCT FROM OLD.pay_delta_cents
	) THEN
		RAISE EXCEPTION 'change order % of job % was sent to the customer; its figures are frozen', OLD.number, OLD.job_id
			USING ERRCODE = 'check_violation';
	END IF;
	IF OLD.status IN ('approved', 'declined') AND (
		NEW.decided_at IS DISTINCT FROM OLD.decided_at OR
		NEW.decided_name IS DISTINCT FROM OLD.decided_name OR
		NEW.decided_ip IS DISTINCT FROM OLD.decided_ip OR
		NEW.decided_user_agent IS DISTINCT FROM OLD.decided_user_agent OR
		NEW.decline_reason IS DISTINCT FROM OLD.decline_reason OR
		NEW.declined_by IS DISTINCT FROM OLD.declined_by OR
		NEW.reviewed_at IS DISTINCT FROM OLD.reviewed_at OR
		NEW.reviewed_by IS DISTINCT FROM OLD.reviewed_by OR
		NEW.sent_at IS DISTINCT FROM OLD.sent_at OR
		NEW.sent_to IS DISTINCT FROM OLD.sent_to
	) THEN
		RAISE EXCEPTION 'change order % of job % was % and is kept as it is', OLD.number, OLD.job_id, OLD.status
			USING ERRCODE = 'check_violation';
	END IF;
	RETURN NEW;
END;
$$;--> statement-breakpoint
CREATE TRIGGER change_order_moves BEFORE INSERT OR UPDATE ON "change_order" FOR EACH ROW EXECUTE FUNCTION change_order_guard();--> statement-breakpoint
CREATE FUNCTION change_order_kept_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF OLD.status <> 'submitted' THEN
		RAISE EXCEPTION 'a change order sent to the customer is kept for good' USING ERRCODE = 'check_violation';
	END IF;
	RETURN OLD;
END;
$$;--> statement-breakpoint
CREATE TRIGGER change_order_kept BEFORE DELETE ON "change_order" FOR EACH ROW EXECUTE FUNCTION change_order_kept_guard();--> statement-breakpoint
-- A change order is paid only once approved, and for exactly its amount and currency. (One live
-- payment per change order is the unique index payment_change_order_once_uq.)
CREATE FUNCTION payment_change_order_guard() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
	co record;
BEGIN
	IF NEW.change_order_id IS NULL THEN
		RETURN NEW;
	END IF;
	SELECT status, total_cents, currency INTO co FROM "change_order"
		WHERE id = NEW.change_order_id AND organization_id = NEW.organization_id;
	IF NOT FOUND THEN
		-- The same-job foreign key refuses it, with its own name.
		RETURN NEW;
	END IF;
	IF co.status <> 'approved' THEN
		RAISE EXCEPTION 'a change order is paid only after the customer approved it (it is %)', co.status
			USING ERRCODE = 'check_violation';
	END IF;
	IF NEW.amount_cents <> co.total_cents OR NEW.currency <> co.currency THEN
		RAISE EXCEPTION 'a change order payment must be its amount, % %', co.total_cents, co.currency
			USING ERRCODE = 'check_violation';
	END IF;
	RETURN NEW;
END;
$$;--> statement-breakpoint
CREATE TRIGGER payment_change_order BEFORE INSERT OR UPDATE OF change_order_id, amount_cents, currency ON "payment" FOR EACH ROW EXECUTE FUNCTION payment_change_order_guard();--> statement-breakpoint
-- An installer statement is opened empty, its total is always the sum of its lines, and once paid
-- neither it nor its lines change or go: a correction is a line of a later statement.
CREATE FUNCTION installer_statement_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF TG_OP = 'INSERT' THEN
		IF NEW.status <> 'open' THEN
			RAISE EXCEPTION 'an installer statement is opened, then paid' USING ERRCODE = 'check_violation';
		END IF;
		NEW.total_cents := 0;
		RETURN NEW;
	END IF;
	IF OLD.status = 'paid' THEN
		RAISE EXCEPTION 'installer statement % was paid and is kept as it is; add a line to a later statement', OLD.id
			USING ERRCODE = 'check_violation';
	END IF;
	IF TG_OP = 'DELETE' THEN
		RETURN OLD;
	END IF;
	NEW.total_cents := (
		SELECT coalesce(sum(amount_cents), 0)::integer FROM "installer_statement_line"
		WHERE statement_id = NEW.id AND organization_id = NEW.organization_id
	);
	RETURN NEW;
END;
$$;--> statement-breakpoint
CREATE TRIGGER installer_statement_kept BEFORE INSERT OR UPDATE OR DELETE ON "installer_statement" FOR EACH ROW EXECUTE FUNCTION installer_statement_guard();--> statement-breakpoint
CREATE FUNCTION installer_statement_line_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF TG_OP <> 'INSERT' AND EXISTS (
		SELECT 1 FROM "installer_statement"
		WHERE id = OLD.statement_id AND organization_id = OLD.organization_id AND status = 'paid'
	) THEN
		RAISE EXCEPTION 'installer statement % was paid; its lines are kept as they are', OLD.statement_id
			USING ERRCODE = 'check_violation';
	END IF;
	IF TG_OP <> 'DELETE' AND EXISTS (
		SELECT 1 FROM "installer_statement"
		WHERE id = NEW.statement_id AND organization_id = NEW.organization_id AND status = 'paid'
	) THEN
		RAISE EXCEPTION 'installer statement % was paid; add the line to a later statement', NEW.statement_id
			USING ERRCODE = 'check_violation';
	END IF;
	IF TG_OP = 'DELETE' THEN
		RETURN OLD;
	END IF;
	RETURN NEW;
END;
$$;--> statement-breakpoint
CREATE TRIGGER installer_statement_line_kept BEFORE INSERT OR UPDATE OR DELETE ON "installer_statement_line" FOR EACH ROW EXECUTE FUNCTION installer_statement_line_guard();--> statement-breakpoint
-- Touching the statement makes installer_statement_guard sum its lines again.
CREATE FUNCTION installer_statement_line_total() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF TG_OP <> 'INSERT' THEN
		UPDATE "installer_statement" SET updated_at = now()
		WHERE id = OLD.statement_id AND organization_id = OLD.organization_id;
	END IF;
	IF TG_OP <> 'DELETE' AND (TG_OP = 'INSERT' OR NEW.statement_id IS DISTINCT FROM OLD.statement_id) THEN
		UPDATE "installer_statement" SET updated_at = now()
		WHERE id = NEW.statement_id AND organization_id = NEW.organization_id;
	END IF;
	RETURN NULL;
END;
$$;--> statement-breakpoint
CREATE TRIGGER installer_statement_line_total AFTER INSERT OR UPDATE OR DELETE ON "installer_statement_line" FOR EACH ROW EXECUTE FUNCTION installer_statement_line_total();--> statement-breakpoint
-- The customer's sign-off of a completed job is kept as it was given.
CREATE FUNCTION job_completion_signed_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF OLD.signed_at IS NOT NULL THEN
		RAISE EXCEPTION 'the completion of job % was signed off by the customer and is kept as it is', OLD.job_id
			USING ERRCODE = 'check_violation';
	END IF;
	IF TG_OP = 'DELETE' THEN
		RETURN OLD;
	END IF;
	RETURN NEW;
END;
$$;--> statement-breakpoint
CREATE TRIGGER job_completion_signed BEFORE UPDATE OR DELETE ON "job_completion" FOR EACH ROW EXECUTE FUNCTION job_completion_signed_guard();
