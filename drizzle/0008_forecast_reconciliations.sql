CREATE TABLE "forecast_reconciliations" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "forecast_reconciliations_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"root_series_id" integer NOT NULL,
	"method" text NOT NULL,
	"shrinkage" double precision,
	"origin" timestamp with time zone NOT NULL,
	"horizon_hours" integer NOT NULL,
	"version_ids" bigint[] NOT NULL,
	"remainders" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"created_by_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "forecast_reconciliations_method_check" CHECK ("forecast_reconciliations"."method" in ('bottom-up', 'top-down', 'min-trace'))
);
--> statement-breakpoint
ALTER TABLE "forecast_reconciliations" ADD CONSTRAINT "forecast_reconciliations_root_series_id_series_id_fk" FOREIGN KEY ("root_series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "forecast_reconciliations" ADD CONSTRAINT "forecast_reconciliations_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "forecast_reconciliations_root_idx" ON "forecast_reconciliations" USING btree ("root_series_id","created_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "forecast_reconciliations_versions_idx" ON "forecast_reconciliations" USING gin ("version_ids");