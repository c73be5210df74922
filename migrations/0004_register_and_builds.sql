CREATE TABLE "build_check" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"build_id" uuid NOT NULL,
	"item_key" text NOT NULL,
	"done" boolean DEFAULT false NOT NULL,
	"measured_position_mm" double precision,
	"within_tolerance" boolean,
	"note" text,
	"recorded_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "build_observation" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"build_id" uuid NOT NULL,
	"aperture_id" text,
	"centre_seen" text,
	"centre_predicted" text,
	"spot_diameter_mm" double precision,
	"screen_power_mw" double precision,
	"predicted_screen_power_mw" double precision,
	"mismatch" boolean DEFAULT false NOT NULL,
	"note" text,
	"recorded_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "build_record" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"bench_id" uuid NOT NULL,
	"content_hash" text NOT NULL,
	"technician_id" text NOT NULL,
	"state" text DEFAULT 'in-progress' NOT NULL,
	"signed_off_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "build_sheet" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"content_hash" text NOT NULL,
	"paper" text DEFAULT 'A4' NOT NULL,
	"state" text DEFAULT 'queued' NOT NULL,
	"progress_percent" integer DEFAULT 0 NOT NULL,
	"storage_key" text,
	"size_bytes" integer,
	"error" text,
	"requested_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "laser_register" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"label_class" text NOT NULL,
	"wavelengths_nm" jsonb NOT NULL,
	"max_power_mw" double precision NOT NULL,
	"pulse_energy_mj" double precision,
	"pulse_duration_s" double precision,
	"pulse_repetition_rate_hz" double precision,
	"beam_diameter_mm" double precision NOT NULL,
	"divergence_mrad" double precision NOT NULL,
	"model" text NOT NULL,
	"serial_number" text,
	"location" text,
	"status" text DEFAULT 'in-service' NOT NULL,
	"responsible_user_id" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "upload" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"build_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"file_name" text NOT NULL,
	"content_type" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"sha256" text NOT NULL,
	"storage_key" text NOT NULL,
	"uploaded_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "build_check" ADD CONSTRAINT "build_check_build_id_build_record_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."build_record"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_check" ADD CONSTRAINT "build_check_recorded_by_user_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_observation" ADD CONSTRAINT "build_observation_build_id_build_record_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."build_record"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_observation" ADD CONSTRAINT "build_observation_recorded_by_user_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_record" ADD CONSTRAINT "build_record_revision_id_bench_revision_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."bench_revision"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_record" ADD CONSTRAINT "build_record_bench_id_bench_id_fk" FOREIGN KEY ("bench_id") REFERENCES "public"."bench"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_record" ADD CONSTRAINT "build_record_technician_id_user_id_fk" FOREIGN KEY ("technician_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_sheet" ADD CONSTRAINT "build_sheet_revision_id_bench_revision_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."bench_revision"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "build_sheet" ADD CONSTRAINT "build_sheet_requested_by_user_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "laser_register" ADD CONSTRAINT "laser_register_lab_id_lab_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."lab"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "laser_register" ADD CONSTRAINT "laser_register_responsible_user_id_user_id_fk" FOREIGN KEY ("responsible_user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "upload" ADD CONSTRAINT "upload_build_id_build_record_id_fk" FOREIGN KEY ("build_id") REFERENCES "public"."build_record"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "upload" ADD CONSTRAINT "upload_uploaded_by_user_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "build_check_item_idx" ON "build_check" USING btree ("build_id","item_key");--> statement-breakpoint
CREATE INDEX "build_observation_build_idx" ON "build_observation" USING btree ("build_id");--> statement-breakpoint
CREATE INDEX "build_record_revision_idx" ON "build_record" USING btree ("revision_id");--> statement-breakpoint
CREATE UNIQUE INDEX "build_sheet_revision_paper_idx" ON "build_sheet" USING btree ("revision_id","paper");--> statement-breakpoint
CREATE INDEX "build_sheet_state_idx" ON "build_sheet" USING btree ("state");--> statement-breakpoint
CREATE INDEX "laser_register_lab_idx" ON "laser_register" USING btree ("lab_id");--> statement-breakpoint
CREATE INDEX "laser_register_status_idx" ON "laser_register" USING btree ("status");--> statement-breakpoint
CREATE INDEX "upload_build_idx" ON "upload" USING btree ("build_id");