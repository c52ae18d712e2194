CREATE EXTENSION IF NOT EXISTS pg_trgm;--> statement-breakpoint
DROP INDEX "clients_shop";--> statement-breakpoint
DROP INDEX "jobs_shop_status";--> statement-breakpoint
DROP INDEX "jobs_client";--> statement-breakpoint
CREATE INDEX "clients_shop_name" ON "clients" USING btree ("shop_id","name");--> statement-breakpoint
CREATE INDEX "jobs_shop_status_updated" ON "jobs" USING btree ("shop_id","status","updated_at" DESC NULLS FIRST,"id");--> statement-breakpoint
CREATE INDEX "jobs_shop_updated" ON "jobs" USING btree ("shop_id","updated_at" DESC NULLS FIRST,"id");--> statement-breakpoint
CREATE INDEX "jobs_shop_due" ON "jobs" USING btree ("shop_id","due_date","id");--> statement-breakpoint
CREATE INDEX "jobs_shop_title" ON "jobs" USING btree ("shop_id","title","id");--> statement-breakpoint
CREATE INDEX "jobs_shop_method" ON "jobs" USING btree ("shop_id","method","id");--> statement-breakpoint
CREATE INDEX "jobs_client_updated" ON "jobs" USING btree ("client_id","updated_at" DESC NULLS FIRST,"id");--> statement-breakpoint
CREATE INDEX "jobs_blank" ON "jobs" USING btree ("blank_id");--> statement-breakpoint
CREATE INDEX "jobs_title_trgm" ON "jobs" USING gin ("title" gin_trgm_ops);