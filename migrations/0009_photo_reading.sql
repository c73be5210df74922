CREATE TABLE "photo_reading" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"build_id" uuid NOT NULL,
	"upload_id" uuid NOT NULL,
	"aperture_id" text NOT NULL,
	"observation_id" uuid,
	"refusal" text,
	"result" jsonb,
	"prediction_engine" text NOT NULL,
	"read_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "photo_reading" ADD CONSTRAINT "photo_reading_build_id_build_record_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."build_record"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photo_reading" ADD CONSTRAINT "photo_reading_upload_id_upload_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."upload"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photo_reading" ADD CONSTRAINT "photo_reading_observation_id_build_observation_id_fk" FOREIGN KEY ("observation_id") REFERENCES "public"."build_observation"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photo_reading" ADD CONSTRAINT "photo_reading_read_by_user_id_fk" FOREIGN KEY ("read_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "photo_reading_build_idx" ON "photo_reading" USING btree ("build_id");--> statement-breakpoint
CREATE UNIQUE INDEX "photo_reading_upload_aperture_idx" ON "photo_reading" USING btree ("upload_id","aperture_id");