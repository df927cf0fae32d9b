ALTER TYPE "public"."upload_status" ADD VALUE 'cancelled';--> statement-breakpoint
ALTER TYPE "public"."upload_status" ADD VALUE 'awaiting_choice';--> statement-breakpoint
ALTER TYPE "public"."validation_rule" ADD VALUE 'mixed_interval';--> statement-breakpoint
DROP INDEX "uploads_content_sha256_key";--> statement-breakpoint
ALTER TABLE "uploads" ADD COLUMN "repeated_hour_questions" jsonb;--> statement-breakpoint
CREATE UNIQUE INDEX "uploads_content_sha256_key" ON "uploads" USING btree ("content_sha256") WHERE "uploads"."status" in ('received', 'queued', 'importing', 'done');