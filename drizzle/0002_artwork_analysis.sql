ALTER TABLE "artworks" ADD COLUMN "is_vector" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "file_key" text;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "file_url" text;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "mime" text;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "bytes" integer;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "width_px" integer;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "height_px" integer;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "density_ppi" real;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "ink_left_px" integer;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "ink_top_px" integer;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "fill_ratio" real;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "shape" text;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "colour_count" integer;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "continuous_tone" boolean;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "preview" "bytea";--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "preview_width" integer;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "preview_height" integer;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "thumbnail" "bytea";--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "notes" jsonb;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "version" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "previous_id" text;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "replaced_by_id" text;--> statement-breakpoint
ALTER TABLE "artworks" ADD COLUMN "uploaded_by" text;--> statement-breakpoint
ALTER TABLE "artworks" ADD CONSTRAINT "artworks_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "artworks_client" ON "artworks" USING btree ("client_id");