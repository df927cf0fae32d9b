CREATE TYPE "public"."day_type" AS ENUM('weekday', 'weekend', 'holiday');--> statement-breakpoint
CREATE TABLE "forecast_hour_scores" (
	"version_id" bigint NOT NULL,
	"series_id" integer NOT NULL,
	"ts" timestamp with time zone NOT NULL,
	"horizon" smallint NOT NULL,
	"local_date" date NOT NULL,
	"local_hour" smallint NOT NULL,
	"day_type" "day_type" NOT NULL,
	"actual" double precision NOT NULL,
	"forecast" double precision NOT NULL,
	"naive" double precision,
	"scale" double precision,
	"lower_80" double precision NOT NULL,
	"upper_80" double precision NOT NULL,
	"lower_95" double precision NOT NULL,
	"upper_95" double precision NOT NULL,
	CONSTRAINT "forecast_hour_scores_pkey" PRIMARY KEY("version_id","ts"),
	CONSTRAINT "forecast_hour_scores_horizon_check" CHECK ("forecast_hour_scores"."horizon" >= 1),
	CONSTRAINT "forecast_hour_scores_local_hour_check" CHECK ("forecast_hour_scores"."local_hour" between 0 and 23)
);
--> statement-breakpoint
ALTER TABLE "forecast_hour_scores" ADD CONSTRAINT "forecast_hour_scores_version_id_forecast_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."forecast_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "forecast_hour_scores" ADD CONSTRAINT "forecast_hour_scores_series_id_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "forecast_hour_scores_series_ts_idx" ON "forecast_hour_scores" USING btree ("series_id","ts");