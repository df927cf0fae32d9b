CREATE TYPE "public"."profile_form" AS ENUM('additive', 'multiplicative');--> statement-breakpoint
ALTER TYPE "public"."seasonal_treatment" ADD VALUE 'hour_of_day_profile';--> statement-breakpoint
ALTER TABLE "model_specs" ADD COLUMN "profile_form" "profile_form" DEFAULT 'additive' NOT NULL;--> statement-breakpoint
ALTER TABLE "model_specs" ADD COLUMN "difference_lag" smallint DEFAULT 168 NOT NULL;--> statement-breakpoint
ALTER TABLE "model_specs" ADD COLUMN "log_transform" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "model_specs" ADD COLUMN "heating_base" double precision;--> statement-breakpoint
ALTER TABLE "model_specs" ADD COLUMN "cooling_base" double precision;--> statement-breakpoint
ALTER TABLE "model_specs" ADD CONSTRAINT "model_specs_difference_lag_check" CHECK ("model_specs"."difference_lag" in (24, 168));--> statement-breakpoint
ALTER TABLE "model_specs" ADD CONSTRAINT "model_specs_balance_points_check" CHECK ("model_specs"."heating_base" is null or "model_specs"."cooling_base" is null or "model_specs"."heating_base" <= "model_specs"."cooling_base");