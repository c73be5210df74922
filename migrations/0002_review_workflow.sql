CREATE TABLE "review_comment" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"bench_id" uuid NOT NULL,
	"thread_id" uuid NOT NULL,
	"parent_id" uuid,
	"element_id" text,
	"author_id" text NOT NULL,
	"author_name" text NOT NULL,
	"author_role" text NOT NULL,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT clock_timestamp() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_decision" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"bench_id" uuid NOT NULL,
	"outcome" text NOT NULL,
	"signer_id" text NOT NULL,
	"signer_name" text NOT NULL,
	"signer_role" text NOT NULL,
	"meaning" text NOT NULL,
	"conditions" text,
	"reason" text,
	"valid_until" timestamp with time zone,
	"content_hash" text NOT NULL,
	"hazard_summary" jsonb,
	"step_up_verified" boolean DEFAULT false NOT NULL,
	"decided_at" timestamp with time zone DEFAULT clock_timestamp() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_reminder" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"decision_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT clock_timestamp() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "review_comment" ADD CONSTRAINT "review_comment_revision_id_bench_revision_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."bench_revision"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_comment" ADD CONSTRAINT "review_comment_bench_id_bench_id_fk" FOREIGN KEY ("bench_id") REFERENCES "public"."bench"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_comment" ADD CONSTRAINT "review_comment_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decision" ADD CONSTRAINT "review_decision_revision_id_bench_revision_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."bench_revision"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decision" ADD CONSTRAINT "review_decision_bench_id_bench_id_fk" FOREIGN KEY ("bench_id") REFERENCES "public"."bench"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decision" ADD CONSTRAINT "review_decision_signer_id_user_id_fk" FOREIGN KEY ("signer_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_reminder" ADD CONSTRAINT "review_reminder_decision_id_review_decision_id_fk" FOREIGN KEY ("decision_id") REFERENCES "public"."review_decision"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "review_comment_revision_idx" ON "review_comment" USING btree ("revision_id","created_at");--> statement-breakpoint
CREATE INDEX "review_comment_thread_idx" ON "review_comment" USING btree ("thread_id");--> statement-breakpoint
CREATE UNIQUE INDEX "review_decision_revision_idx" ON "review_decision" USING btree ("revision_id");--> statement-breakpoint
CREATE INDEX "review_decision_bench_idx" ON "review_decision" USING btree ("bench_id","decided_at");--> statement-breakpoint
CREATE UNIQUE INDEX "review_reminder_once_idx" ON "review_reminder" USING btree ("decision_id","kind");