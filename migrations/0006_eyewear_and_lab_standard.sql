CREATE TABLE "eyewear_band" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"item_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"from_nm" double precision NOT NULL,
	"to_nm" double precision NOT NULL,
	"optical_density" double precision NOT NULL,
	"en207_scale_number" integer
);
--> statement-breakpoint
CREATE TABLE "eyewear_item" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"name" text NOT NULL,
	"quantity" integer DEFAULT 1 NOT NULL,
	"note" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "lab" ADD COLUMN "safety_standard" text DEFAULT 'ANSI Z136.1-2014' NOT NULL;--> statement-breakpoint
ALTER TABLE "laser_register" ADD COLUMN "lines" jsonb;--> statement-breakpoint
ALTER TABLE "eyewear_band" ADD CONSTRAINT "eyewear_band_item_id_eyewear_item_id_fk" FOREIGN KEY ("item_id") REFERENCES "public"."eyewear_item"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "eyewear_item" ADD CONSTRAINT "eyewear_item_lab_id_lab_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."lab"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "eyewear_band_item_position_idx" ON "eyewear_band" USING btree ("item_id","position");--> statement-breakpoint
CREATE INDEX "eyewear_item_lab_idx" ON "eyewear_item" USING btree ("lab_id");