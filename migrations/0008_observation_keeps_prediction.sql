ALTER TABLE "build_observation" ADD COLUMN "predicted_spot_diameter_mm" double precision;--> statement-breakpoint
ALTER TABLE "build_observation" ADD COLUMN "prediction_engine" text;--> statement-breakpoint
ALTER TABLE "build_observation" ADD COLUMN "reasons" jsonb DEFAULT '[]'::jsonb NOT NULL;--> statement-breakpoint
-- Records kept before this change: their sentences come back from the audit row written with them.
UPDATE "build_observation" o SET "reasons" = a."detail"->'reasons'
FROM "audit_event" a
WHERE a."action" = 'build-observation-recorded' AND a."detail"->>'observationId' = o."id"::text AND jsonb_typeof(a."detail"->'reasons') = 'array';
