CREATE TABLE "auth_attempt" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"scope" text NOT NULL,
	"subject" text NOT NULL,
	"attempted_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE INDEX "auth_attempt_subject_idx" ON "auth_attempt" USING btree ("scope","subject","attempted_at");--> statement-breakpoint
CREATE UNIQUE INDEX "build_record_one_open_idx" ON "build_record" USING btree ("revision_id","technician_id") WHERE "build_record"."state" = 'in-progress';