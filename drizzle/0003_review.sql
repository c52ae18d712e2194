CREATE TABLE "approvals" (
	"id" text PRIMARY KEY NOT NULL,
	"proof_id" text NOT NULL,
	"revision_id" text NOT NULL,
	"revision_letter" text NOT NULL,
	"decision" text NOT NULL,
	"full_name" text NOT NULL,
	"statement" text NOT NULL,
	"comment_id" text,
	"ip" text,
	"user_agent" text,
	"share_link_id" text,
	"user_id" text,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "proof_comments" (
	"id" text PRIMARY KEY NOT NULL,
	"proof_id" text NOT NULL,
	"revision_letter" text NOT NULL,
	"parent_id" text,
	"side" text,
	"x_in" double precision,
	"y_in" double precision,
	"body" text NOT NULL,
	"author_user_id" text,
	"author_name" text NOT NULL,
	"author_role" text NOT NULL,
	"share_link_id" text,
	"resolved_at" timestamp with time zone,
	"resolved_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "proof_revisions" (
	"id" text PRIMARY KEY NOT NULL,
	"proof_id" text NOT NULL,
	"letter" text NOT NULL,
	"snapshot" jsonb NOT NULL,
	"state" text DEFAULT 'open' NOT NULL,
	"sent_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_by" text
);
--> statement-breakpoint
CREATE TABLE "share_links" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"proof_id" text NOT NULL,
	"token_hash" text NOT NULL,
	"permission" text NOT NULL,
	"recipient_email" text,
	"recipient_name" text,
	"expires_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_seen_letter" text,
	"last_seen_at" timestamp with time zone,
	CONSTRAINT "share_links_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
ALTER TABLE "approvals" ADD CONSTRAINT "approvals_proof_id_proofs_id_fk" FOREIGN KEY ("proof_id") REFERENCES "public"."proofs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "approvals" ADD CONSTRAINT "approvals_revision_id_proof_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."proof_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "approvals" ADD CONSTRAINT "approvals_share_link_id_share_links_id_fk" FOREIGN KEY ("share_link_id") REFERENCES "public"."share_links"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "approvals" ADD CONSTRAINT "approvals_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proof_comments" ADD CONSTRAINT "proof_comments_proof_id_proofs_id_fk" FOREIGN KEY ("proof_id") REFERENCES "public"."proofs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proof_comments" ADD CONSTRAINT "proof_comments_author_user_id_users_id_fk" FOREIGN KEY ("author_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proof_comments" ADD CONSTRAINT "proof_comments_share_link_id_share_links_id_fk" FOREIGN KEY ("share_link_id") REFERENCES "public"."share_links"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proof_revisions" ADD CONSTRAINT "proof_revisions_proof_id_proofs_id_fk" FOREIGN KEY ("proof_id") REFERENCES "public"."proofs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "proof_revisions" ADD CONSTRAINT "proof_revisions_sent_by_users_id_fk" FOREIGN KEY ("sent_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_proof_id_proofs_id_fk" FOREIGN KEY ("proof_id") REFERENCES "public"."proofs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "approvals_proof" ON "approvals" USING btree ("proof_id");--> statement-breakpoint
CREATE INDEX "proof_comments_proof" ON "proof_comments" USING btree ("proof_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "proof_revisions_letter" ON "proof_revisions" USING btree ("proof_id","letter");--> statement-breakpoint
CREATE INDEX "share_links_proof" ON "share_links" USING btree ("proof_id");