CREATE TABLE "export_files" (
	"export_id" text NOT NULL,
	"position" integer NOT NULL,
	"file_name" text NOT NULL,
	"mime" text NOT NULL,
	"bytes" integer NOT NULL,
	"content" "bytea" NOT NULL,
	CONSTRAINT "export_files_export_id_position_pk" PRIMARY KEY("export_id","position")
);
--> statement-breakpoint
ALTER TABLE "export_jobs" ADD COLUMN "file_count" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "export_jobs" ADD COLUMN "summary" jsonb;--> statement-breakpoint
ALTER TABLE "export_files" ADD CONSTRAINT "export_files_export_id_export_jobs_id_fk" FOREIGN KEY ("export_id") REFERENCES "public"."export_jobs"("id") ON DELETE cascade ON UPDATE no action;