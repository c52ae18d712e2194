ALTER TABLE "shops" ADD COLUMN "locale" text DEFAULT 'en-US' NOT NULL;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "time_zone" text DEFAULT 'UTC' NOT NULL;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "spare_percent" double precision DEFAULT 0 NOT NULL;