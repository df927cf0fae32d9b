CREATE TYPE "public"."upload_content" AS ENUM('actuals', 'temperature_forecast');--> statement-breakpoint
CREATE TABLE "temperature_forecasts" (
	"issued_at" timestamp with time zone NOT NULL,
	"ts" timestamp with time zone NOT NULL,
	"value" double precision NOT NULL,
	"series_id" integer NOT NULL,
	"upload_id" integer,
	CONSTRAINT "temperature_forecasts_pkey" PRIMARY KEY("series_id","issued_at","ts")
);
--> statement-breakpoint
ALTER TABLE "upload_findings" ADD COLUMN "resolved_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "upload_findings" ADD COLUMN "resolved_by_id" integer;--> statement-breakpoint
ALTER TABLE "upload_findings" ADD COLUMN "resolution" text;--> statement-breakpoint
ALTER TABLE "uploads" ADD COLUMN "content" "upload_content" DEFAULT 'actuals' NOT NULL;--> statement-breakpoint
ALTER TABLE "temperature_forecasts" ADD CONSTRAINT "temperature_forecasts_series_id_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "temperature_forecasts" ADD CONSTRAINT "temperature_forecasts_upload_id_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."uploads"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "temperature_forecasts_series_ts_idx" ON "temperature_forecasts" USING btree ("series_id","ts");--> statement-breakpoint
ALTER TABLE "upload_findings" ADD CONSTRAINT "upload_findings_resolved_by_id_users_id_fk" FOREIGN KEY ("resolved_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;