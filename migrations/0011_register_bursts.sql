ALTER TABLE "laser_register" ADD COLUMN "pulses_per_burst" integer;--> statement-breakpoint
ALTER TABLE "laser_register" ADD COLUMN "burst_pulse_rate_hz" double precision;