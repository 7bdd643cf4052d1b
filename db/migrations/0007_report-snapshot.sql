ALTER TABLE "reports" ADD COLUMN "snapshot" text;--> statement-breakpoint
ALTER TABLE "reports" ADD COLUMN "snapshot_sha256" text;