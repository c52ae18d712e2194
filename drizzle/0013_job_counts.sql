CREATE TABLE "shop_job_counts" (
	"shop_id" text NOT NULL,
	"status" "job_status" NOT NULL,
	"n" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "shop_job_counts_shop_id_status_pk" PRIMARY KEY("shop_id","status")
);
--> statement-breakpoint
INSERT INTO "shop_job_counts" ("shop_id", "status", "n")
  SELECT "shop_id", "status", count(*)::int FROM "jobs" GROUP BY "shop_id", "status";
--> statement-breakpoint
CREATE FUNCTION "shop_job_counts_follow"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  -- One statement's changes at once (transition tables): a bulk insert updates each count once.
  IF TG_OP IN ('UPDATE', 'DELETE') THEN
    INSERT INTO "shop_job_counts" ("shop_id", "status", "n")
      SELECT "shop_id", "status", -count(*)::int FROM "gone" GROUP BY "shop_id", "status" ORDER BY 1, 2
      ON CONFLICT ("shop_id", "status") DO UPDATE SET "n" = "shop_job_counts"."n" + EXCLUDED."n";
  END IF;
  IF TG_OP IN ('INSERT', 'UPDATE') THEN
    INSERT INTO "shop_job_counts" ("shop_id", "status", "n")
      SELECT "shop_id", "status", count(*)::int FROM "came" GROUP BY "shop_id", "status" ORDER BY 1, 2
      ON CONFLICT ("shop_id", "status") DO UPDATE SET "n" = "shop_job_counts"."n" + EXCLUDED."n";
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER "jobs_counts_insert" AFTER INSERT ON "jobs" REFERENCING NEW TABLE AS "came" FOR EACH STATEMENT EXECUTE FUNCTION "shop_job_counts_follow"();
--> statement-breakpoint
CREATE TRIGGER "jobs_counts_update" AFTER UPDATE ON "jobs" REFERENCING OLD TABLE AS "gone" NEW TABLE AS "came" FOR EACH STATEMENT EXECUTE FUNCTION "shop_job_counts_follow"();
--> statement-breakpoint
CREATE TRIGGER "jobs_counts_delete" AFTER DELETE ON "jobs" REFERENCING OLD TABLE AS "gone" FOR EACH STATEMENT EXECUTE FUNCTION "shop_job_counts_follow"();
