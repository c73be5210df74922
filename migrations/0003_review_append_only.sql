-- Review decisions, review comments and sent expiry reminders are append-only like the audit
-- trail: the database refuses UPDATE, DELETE and TRUNCATE on them, whoever asks.
CREATE OR REPLACE FUNCTION review_record_refuse_change() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION '% is append-only: % is not allowed', TG_TABLE_NAME, TG_OP USING ERRCODE = 'insufficient_privilege';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER review_decision_no_update_delete BEFORE UPDATE OR DELETE ON review_decision
  FOR EACH ROW EXECUTE FUNCTION review_record_refuse_change();
--> statement-breakpoint
CREATE TRIGGER review_decision_no_truncate BEFORE TRUNCATE ON review_decision
  FOR EACH STATEMENT EXECUTE FUNCTION review_record_refuse_change();
--> statement-breakpoint
CREATE TRIGGER review_comment_no_update_delete BEFORE UPDATE OR DELETE ON review_comment
  FOR EACH ROW EXECUTE FUNCTION review_record_refuse_change();
--> statement-breakpoint
CREATE TRIGGER review_comment_no_truncate BEFORE TRUNCATE ON review_comment
  FOR EACH STATEMENT EXECUTE FUNCTION review_record_refuse_change();
--> statement-breakpoint
CREATE TRIGGER review_reminder_no_update_delete BEFORE UPDATE OR DELETE ON review_reminder
  FOR EACH ROW EXECUTE FUNCTION review_record_refuse_change();
--> statement-breakpoint
CREATE TRIGGER review_reminder_no_truncate BEFORE TRUNCATE ON review_reminder
  FOR EACH STATEMENT EXECUTE FUNCTION review_record_refuse_change();
