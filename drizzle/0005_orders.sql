CREATE TYPE "public"."payment_kind" AS ENUM('deposit', 'full', 'balance');--> statement-breakpoint
CREATE TYPE "public"."payment_state" AS ENUM('awaiting', 'paid', 'lapsed');--> statement-breakpoint
CREATE TYPE "public"."quote_state" AS ENUM('sent', 'accepted', 'replaced');--> statement-breakpoint
CREATE TABLE "payment_events" (
	"event_id" text PRIMARY KEY NOT NULL,
	"type" text NOT NULL,
	"payment_id" text,
	"outcome" text NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "payments" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"job_id" text NOT NULL,
	"quote_id" text NOT NULL,
	"kind" "payment_kind" NOT NULL,
	"amount_cents" integer NOT NULL,
	"state" "payment_state" DEFAULT 'awaiting' NOT NULL,
	"checkout_session_id" text,
	"checkout_url" text,
	"payment_intent_id" text,
	"payer_email" text,
	"started_via" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"paid_at" timestamp with time zone,
	"receipt_sent_at" timestamp with time zone,
	CONSTRAINT "payments_checkout_session_id_unique" UNIQUE("checkout_session_id")
);
--> statement-breakpoint
CREATE TABLE "quotes" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"job_id" text NOT NULL,
	"number" integer NOT NULL,
	"state" "quote_state" DEFAULT 'sent' NOT NULL,
	"snapshot" jsonb NOT NULL,
	"total_cents" integer NOT NULL,
	"deposit_cents" integer NOT NULL,
	"deposit_percent" double precision NOT NULL,
	"sent_by" text,
	"sent_at" timestamp with time zone DEFAULT now() NOT NULL,
	"accepted_at" timestamp with time zone,
	"accepted_name" text,
	"accepted_by_user" text,
	"accepted_via" text,
	"accepted_ip" text,
	"accepted_user_agent" text
);
--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "price_matrix" jsonb;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "price_matrix_updated_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "clients" ADD COLUMN "tax_exempt" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "blank_id" text;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "garment_colour" text;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "print_locations" jsonb DEFAULT '[]'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "dtf_area_in2" double precision;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "rush" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_quote_id_quotes_id_fk" FOREIGN KEY ("quote_id") REFERENCES "public"."quotes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_sent_by_users_id_fk" FOREIGN KEY ("sent_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_accepted_by_user_users_id_fk" FOREIGN KEY ("accepted_by_user") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "payments_job" ON "payments" USING btree ("job_id");--> statement-breakpoint
CREATE INDEX "payments_quote" ON "payments" USING btree ("quote_id");--> statement-breakpoint
CREATE UNIQUE INDEX "quotes_job_number" ON "quotes" USING btree ("job_id","number");--> statement-breakpoint
CREATE INDEX "quotes_shop" ON "quotes" USING btree ("shop_id");--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_blank_id_blanks_id_fk" FOREIGN KEY ("blank_id") REFERENCES "public"."blanks"("id") ON DELETE set null ON UPDATE no action;