CREATE TABLE "export_jobs" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"job_id" text,
	"kind" text NOT NULL,
	"params" jsonb NOT NULL,
	"state" text DEFAULT 'queued' NOT NULL,
	"progress" real DEFAULT 0 NOT NULL,
	"message" text,
	"file_name" text,
	"mime" text,
	"result" "bytea",
	"attempts" integer DEFAULT 0 NOT NULL,
	"requested_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "job_gradings" (
	"job_id" text NOT NULL,
	"placement_id" text NOT NULL,
	"transfer_count" integer NOT NULL,
	"assignment" jsonb NOT NULL,
	"total_shortfall" real NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "job_gradings_job_id_placement_id_pk" PRIMARY KEY("job_id","placement_id")
);
--> statement-breakpoint
CREATE TABLE "job_sizes" (
	"job_id" text NOT NULL,
	"size" text NOT NULL,
	"quantity" integer DEFAULT 0 NOT NULL,
	"sort_order" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "job_sizes_job_id_size_pk" PRIMARY KEY("job_id","size")
);
--> statement-breakpoint
ALTER TABLE "export_jobs" ADD CONSTRAINT "export_jobs_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "export_jobs" ADD CONSTRAINT "export_jobs_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "export_jobs" ADD CONSTRAINT "export_jobs_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_gradings" ADD CONSTRAINT "job_gradings_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_sizes" ADD CONSTRAINT "job_sizes_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "export_jobs_job" ON "export_jobs" USING btree ("job_id","created_at");