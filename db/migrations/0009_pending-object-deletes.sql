CREATE TABLE "pending_object_deletes" (
	"url" text PRIMARY KEY NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"tried_at" timestamp with time zone
);
