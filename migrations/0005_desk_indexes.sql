-- pg_trgm is a trusted extension (PostgreSQL 13+): the database owner may create it. It backs the title search on the auditor's desk.
CREATE EXTENSION IF NOT EXISTS pg_trgm;--> statement-breakpoint
CREATE INDEX "bench_title_idx" ON "bench" USING btree ("title");--> statement-breakpoint
CREATE INDEX "bench_title_trgm_idx" ON "bench" USING gin ("title" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "review_comment_bench_idx" ON "review_comment" USING btree ("bench_id","created_at");--> statement-breakpoint
CREATE INDEX "review_decision_outcome_decided_idx" ON "review_decision" USING btree ("outcome","decided_at","id");--> statement-breakpoint
CREATE INDEX "review_decision_signer_idx" ON "review_decision" USING btree ("signer_id","decided_at");--> statement-breakpoint
CREATE INDEX "review_decision_class_idx" ON "review_decision" USING btree (("hazard_summary" -> 'hazardClass' ->> 'value'),"decided_at");--> statement-breakpoint
CREATE INDEX "review_decision_valid_until_idx" ON "review_decision" USING btree ("valid_until") WHERE "review_decision"."outcome" = 'approved';--> statement-breakpoint
CREATE INDEX "review_decision_approved_keys_idx" ON "review_decision" USING btree ("bench_id","revision_id") WHERE "review_decision"."outcome" = 'approved';