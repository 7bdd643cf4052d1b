ALTER TABLE "shop_settings" ADD COLUMN "pressure_unit" text DEFAULT 'kPa' NOT NULL;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD COLUMN "starting_limits" jsonb;