CREATE TYPE "public"."garment_category" AS ENUM('unisex-tee', 'youth-tee', 'fitted-tee', 'long-sleeve-tee', 'crewneck', 'hoodie', 'tank', 'tote', 'infant-bodysuit');--> statement-breakpoint
CREATE TABLE "blanks" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text,
	"source_blank_id" text,
	"name" text NOT NULL,
	"category" "garment_category" NOT NULL,
	"description" text,
	"colours" jsonb NOT NULL,
	"size_chart" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "artworks" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"client_id" text,
	"name" text NOT NULL,
	"kind" text NOT NULL,
	"svg" text,
	"ink_width_px" integer NOT NULL,
	"ink_height_px" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "calibrations" (
	"user_id" text NOT NULL,
	"device_key" text NOT NULL,
	"device_label" text,
	"px_per_inch" double precision NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calibrations_user_id_device_key_pk" PRIMARY KEY("user_id","device_key")
);
--> statement-breakpoint
CREATE TABLE "placements" (
	"id" text PRIMARY KEY NOT NULL,
	"proof_id" text NOT NULL,
	"location" text NOT NULL,
	"artwork_id" text,
	"width_in" double precision NOT NULL,
	"height_in" double precision NOT NULL,
	"offset_from_center_in" double precision NOT NULL,
	"below_collar_in" double precision NOT NULL,
	"rotation_deg" double precision DEFAULT 0 NOT NULL,
	"sort_order" integer DEFAULT 0 NOT NULL
);
--> statement-breakpoint
CREATE TABLE "proofs" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"job_id" text NOT NULL,
	"revision" text DEFAULT 'A' NOT NULL,
	"name" text NOT NULL,
	"blank_id" text NOT NULL,
	"colour_name" text NOT NULL,
	"colour_hex" text NOT NULL,
	"size" text NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "blanks" ADD CONSTRAINT "blanks_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "artworks" ADD CONSTRAINT "artworks_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calibrations" ADD CONSTRAINT "calibrations_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "placements" ADD CONSTRAINT "placements_proof_id_proofs_id_fk" FOREIGN KEY ("proof_id") REFERENCES "public"."proofs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "placements" ADD CONSTRAINT "placements_artwork_id_artworks_id_fk" FOREIGN KEY ("artwork_id") REFERENCES "public"."artworks"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proofs" ADD CONSTRAINT "proofs_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proofs" ADD CONSTRAINT "proofs_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proofs" ADD CONSTRAINT "proofs_blank_id_blanks_id_fk" FOREIGN KEY ("blank_id") REFERENCES "public"."blanks"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proofs" ADD CONSTRAINT "proofs_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "blanks_shop" ON "blanks" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "artworks_shop" ON "artworks" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "placements_proof" ON "placements" USING btree ("proof_id");--> statement-breakpoint
CREATE INDEX "proofs_job" ON "proofs" USING btree ("job_id");--> statement-breakpoint
CREATE UNIQUE INDEX "proofs_job_revision_name" ON "proofs" USING btree ("job_id","name","revision");