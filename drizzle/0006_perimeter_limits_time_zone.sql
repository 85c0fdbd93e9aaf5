CREATE TABLE "auth_limit" (
	"key" varchar(255) PRIMARY KEY NOT NULL,
	"points" integer DEFAULT 0 NOT NULL,
	"expire" bigint
);
--> statement-breakpoint
ALTER TABLE "organization" ADD COLUMN "time_zone" text DEFAULT 'UTC';