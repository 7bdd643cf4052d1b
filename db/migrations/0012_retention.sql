CREATE TABLE "maintenance_runs" (
	"name" text PRIMARY KEY NOT NULL,
	"last_run_at" timestamp with time zone NOT NULL,
	"detail" jsonb
);
--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "done_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "retention_days" integer;--> statement-breakpoint
UPDATE "jobs" SET "done_at" = "updated_at" WHERE "status" = 'done';
