CREATE TYPE "public"."forecast_band_kind" AS ENUM('empirical', 'gaussian');--> statement-breakpoint
ALTER TABLE "forecast_versions" ADD COLUMN "band_kind" "forecast_band_kind" DEFAULT 'gaussian' NOT NULL;--> statement-breakpoint
ALTER TABLE "forecast_versions" ADD COLUMN "bands" jsonb;