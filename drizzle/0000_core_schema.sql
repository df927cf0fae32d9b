CREATE TYPE "public"."api_token_scope" AS ENUM('read', 'read-write');--> statement-breakpoint
CREATE TYPE "public"."adjustment_kind" AS ENUM('shift', 'scale');--> statement-breakpoint
CREATE TYPE "public"."forecast_state" AS ENUM('draft', 'approved', 'superseded');--> statement-breakpoint
CREATE TYPE "public"."holiday_kind" AS ENUM('public', 'bank', 'school', 'optional', 'observance', 'company');--> statement-breakpoint
CREATE TYPE "public"."holiday_source" AS ENUM('package', 'manual');--> statement-breakpoint
CREATE TYPE "public"."user_role" AS ENUM('admin', 'steward', 'planner', 'viewer');--> statement-breakpoint
CREATE TYPE "public"."login_throttle_subject" AS ENUM('account', 'address');--> statement-breakpoint
CREATE TYPE "public"."one_time_token_purpose" AS ENUM('invite', 'password_reset');--> statement-breakpoint
CREATE TYPE "public"."series_kind" AS ENUM('load', 'temperature');--> statement-breakpoint
CREATE TYPE "public"."series_level" AS ENUM('system', 'zone', 'substation', 'feeder');--> statement-breakpoint
CREATE TYPE "public"."series_unit" AS ENUM('W', 'kW', 'MW', 'degC', 'degF');--> statement-breakpoint
CREATE TYPE "public"."timestamps_mark" AS ENUM('start', 'end');--> statement-breakpoint
CREATE TYPE "public"."upload_source" AS ENUM('csv', 'api', 'green_button');--> statement-breakpoint
CREATE TYPE "public"."upload_status" AS ENUM('received', 'queued', 'importing', 'done', 'failed');--> statement-breakpoint
CREATE TYPE "public"."validation_rule" AS ENUM('gap', 'spike', 'flat_line', 'negative', 'impossible', 'duplicate_equal', 'duplicate_conflict', 'off_grid', 'future', 'dst_repeated_hour', 'dst_missing_hour', 'unparseable', 'unknown_series', 'estimated');--> statement-breakpoint
CREATE TYPE "public"."model_method" AS ENUM('auto', 'yule_walker', 'conditional_mle', 'nls_arma', 'ridge_ar', 'lasso_ar', 'seasonal_naive');--> statement-breakpoint
CREATE TYPE "public"."seasonal_treatment" AS ENUM('none', 'hour_of_week_profile', 'seasonal_difference');--> statement-breakpoint
CREATE TYPE "public"."refit_status" AS ENUM('queued', 'running', 'done', 'failed');--> statement-breakpoint
CREATE TYPE "public"."refit_trigger" AS ENUM('schedule', 'manual');--> statement-breakpoint
CREATE TYPE "public"."miss_rule_kind" AS ENUM('outside_band', 'error_over_threshold', 'daily_peak_missed');--> statement-breakpoint
CREATE TYPE "public"."miss_rule_scope" AS ENUM('all', 'level', 'series');--> statement-breakpoint
CREATE TYPE "public"."miss_state" AS ENUM('open', 'acknowledged', 'resolved');--> statement-breakpoint
CREATE TABLE "api_tokens" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "api_tokens_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"name" text NOT NULL,
	"secret_hash" text NOT NULL,
	"prefix" text NOT NULL,
	"scope" "api_token_scope" DEFAULT 'read' NOT NULL,
	"expires_at" timestamp with time zone,
	"last_used_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	"created_by_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "api_tokens_secret_hash_key" UNIQUE("secret_hash")
);
--> statement-breakpoint
CREATE TABLE "audit_log" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "audit_log_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"actor_user_id" integer,
	"actor_token_id" integer,
	"action" text NOT NULL,
	"target_type" text,
	"target_id" text,
	"detail" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"ip" text
);
--> statement-breakpoint
CREATE TABLE "forecast_adjustments" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "forecast_adjustments_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"version_id" bigint NOT NULL,
	"period_start" timestamp with time zone NOT NULL,
	"period_end" timestamp with time zone NOT NULL,
	"kind" "adjustment_kind" NOT NULL,
	"amount" double precision NOT NULL,
	"reason" text NOT NULL,
	"created_by_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "forecast_adjustments_period_check" CHECK ("forecast_adjustments"."period_end" > "forecast_adjustments"."period_start"),
	CONSTRAINT "forecast_adjustments_scale_check" CHECK ("forecast_adjustments"."kind" <> 'scale' or "forecast_adjustments"."amount" > 0),
	CONSTRAINT "forecast_adjustments_reason_check" CHECK (length(btrim("forecast_adjustments"."reason")) > 0)
);
--> statement-breakpoint
CREATE TABLE "forecast_points" (
	"version_id" bigint NOT NULL,
	"ts" timestamp with time zone NOT NULL,
	"mean" double precision NOT NULL,
	"std_error" double precision NOT NULL,
	"lower_80" double precision NOT NULL,
	"upper_80" double precision NOT NULL,
	"lower_95" double precision NOT NULL,
	"upper_95" double precision NOT NULL,
	CONSTRAINT "forecast_points_pkey" PRIMARY KEY("version_id","ts"),
	CONSTRAINT "forecast_points_bounds_check" CHECK ("forecast_points"."lower_95" <= "forecast_points"."lower_80" and "forecast_points"."lower_80" <= "forecast_points"."upper_80" and "forecast_points"."upper_80" <= "forecast_points"."upper_95")
);
--> statement-breakpoint
CREATE TABLE "forecast_versions" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "forecast_versions_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
	"series_id" integer NOT NULL,
	"fit_id" bigint NOT NULL,
	"refit_run_id" integer,
	"state" "forecast_state" DEFAULT 'draft' NOT NULL,
	"issued_at" timestamp with time zone DEFAULT now() NOT NULL,
	"origin" timestamp with time zone NOT NULL,
	"horizon_hours" integer NOT NULL,
	"levels" integer[] DEFAULT '{80,95}'::integer[] NOT NULL,
	"warnings" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"approved_by_id" integer,
	"approved_at" timestamp with time zone,
	"superseded_at" timestamp with time zone,
	CONSTRAINT "forecast_versions_approval_check" CHECK ("forecast_versions"."state" <> 'approved' or "forecast_versions"."approved_at" is not null),
	CONSTRAINT "forecast_versions_superseded_check" CHECK (("forecast_versions"."state" = 'superseded') = ("forecast_versions"."superseded_at" is not null)),
	CONSTRAINT "forecast_versions_horizon_check" CHECK ("forecast_versions"."horizon_hours" > 0)
);
--> statement-breakpoint
CREATE TABLE "holidays" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "holidays_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"day" date NOT NULL,
	"name" text NOT NULL,
	"kind" "holiday_kind" DEFAULT 'public' NOT NULL,
	"source" "holiday_source" DEFAULT 'manual' NOT NULL,
	"updated_by_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "holidays_day_name_key" UNIQUE("day","name")
);
--> statement-breakpoint
CREATE TABLE "organisation" (
	"singleton" boolean PRIMARY KEY DEFAULT true NOT NULL,
	"name" text NOT NULL,
	"time_zone" text DEFAULT 'UTC' NOT NULL,
	"refit_hour" smallint DEFAULT 2 NOT NULL,
	"holiday_country" text,
	"holiday_region" text,
	"alert_defaults" jsonb DEFAULT '{"recipients":[],"bandLevel":95,"errorThresholdPercent":10,"repeatAfterMinutes":240}'::jsonb NOT NULL,
	"mail_from" text DEFAULT 'Loadwright <loadwright@localhost>' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "organisation_singleton_check" CHECK ("organisation"."singleton"),
	CONSTRAINT "organisation_refit_hour_check" CHECK ("organisation"."refit_hour" between 0 and 23)
);
--> statement-breakpoint
CREATE TABLE "users" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "users_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"email" text NOT NULL,
	"display_name" text NOT NULL,
	"role" "user_role" DEFAULT 'viewer' NOT NULL,
	"password_hash" text,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_sign_in_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "login_throttles" (
	"subject_kind" "login_throttle_subject" NOT NULL,
	"subject" text NOT NULL,
	"failures" integer DEFAULT 0 NOT NULL,
	"window_started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"locked_until" timestamp with time zone,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "login_throttles_pkey" PRIMARY KEY("subject_kind","subject"),
	CONSTRAINT "login_throttles_failures_check" CHECK ("login_throttles"."failures" >= 0)
);
--> statement-breakpoint
CREATE TABLE "one_time_tokens" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" integer NOT NULL,
	"purpose" "one_time_token_purpose" NOT NULL,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	"created_by_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "one_time_tokens_token_hash_key" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "sessions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"last_seen_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	"ip" text,
	"user_agent" text
);
--> statement-breakpoint
CREATE TABLE "series" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "series_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"key" text NOT NULL,
	"name" text NOT NULL,
	"kind" "series_kind" NOT NULL,
	"level" "series_level",
	"parent_id" integer,
	"unit" "series_unit" NOT NULL,
	"interval_minutes" smallint DEFAULT 60 NOT NULL,
	"time_zone" text NOT NULL,
	"timestamps_mark" timestamps_mark DEFAULT 'start' NOT NULL,
	"temperature_series_id" integer,
	"peer_group" text,
	"description" text,
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "series_key_key" UNIQUE("key"),
	CONSTRAINT "series_interval_minutes_check" CHECK ("series"."interval_minutes" in (5, 15, 30, 60, 1440)),
	CONSTRAINT "series_level_matches_kind_check" CHECK (("series"."kind" = 'load' and "series"."level" is not null) or ("series"."kind" = 'temperature' and "series"."level" is null and "series"."temperature_series_id" is null)),
	CONSTRAINT "series_unit_matches_kind_check" CHECK (("series"."kind" = 'load') = ("series"."unit" in ('W', 'kW', 'MW'))),
	CONSTRAINT "series_parent_not_self_check" CHECK ("series"."parent_id" <> "series"."id")
);
--> statement-breakpoint
CREATE TABLE "upload_findings" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "upload_findings_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
	"upload_id" integer NOT NULL,
	"series_id" integer,
	"rule" "validation_rule" NOT NULL,
	"ts" timestamp with time zone,
	"value" double precision,
	"source_row" integer,
	"detail" jsonb DEFAULT '{}'::jsonb NOT NULL
);
--> statement-breakpoint
CREATE TABLE "uploads" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "uploads_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"source" "upload_source" DEFAULT 'csv' NOT NULL,
	"file_name" text NOT NULL,
	"content_sha256" text NOT NULL,
	"byte_size" bigint NOT NULL,
	"uploaded_by_id" integer,
	"uploaded_by_token_id" integer,
	"status" "upload_status" DEFAULT 'received' NOT NULL,
	"mapping" jsonb,
	"settings" jsonb,
	"storage_path" text,
	"rows_total" integer,
	"rows_processed" integer DEFAULT 0 NOT NULL,
	"rows_imported" integer DEFAULT 0 NOT NULL,
	"rows_rejected" integer DEFAULT 0 NOT NULL,
	"rows_unchanged" integer DEFAULT 0 NOT NULL,
	"rows_revised" integer DEFAULT 0 NOT NULL,
	"progress" double precision DEFAULT 0 NOT NULL,
	"error" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	CONSTRAINT "uploads_progress_check" CHECK ("uploads"."progress" between 0 and 1)
);
--> statement-breakpoint
CREATE TABLE "observation_revisions" (
	"ts" timestamp with time zone NOT NULL,
	"value" double precision,
	"superseded_at" timestamp with time zone DEFAULT now() NOT NULL,
	"series_id" integer NOT NULL,
	"upload_id" integer,
	"superseded_by_upload_id" integer,
	"quality" smallint NOT NULL,
	"revision" smallint NOT NULL,
	"estimated" double precision,
	CONSTRAINT "observation_revisions_pkey" PRIMARY KEY("series_id","ts","revision")
);
--> statement-breakpoint
CREATE TABLE "observations" (
	"ts" timestamp with time zone NOT NULL,
	"value" double precision,
	"series_id" integer NOT NULL,
	"upload_id" integer,
	"quality" smallint DEFAULT 0 NOT NULL,
	"revision" smallint DEFAULT 1 NOT NULL,
	"estimated" double precision,
	CONSTRAINT "observations_pkey" PRIMARY KEY("series_id","ts"),
	CONSTRAINT "observations_has_value_check" CHECK ("observations"."value" is not null or "observations"."estimated" is not null),
	CONSTRAINT "observations_revision_check" CHECK ("observations"."revision" >= 1)
);
--> statement-breakpoint
CREATE TABLE "fits" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "fits_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
	"series_id" integer NOT NULL,
	"spec_snapshot" jsonb NOT NULL,
	"method" "model_method" NOT NULL,
	"ar_order" smallint DEFAULT 0 NOT NULL,
	"ma_order" smallint DEFAULT 0 NOT NULL,
	"parameters" jsonb NOT NULL,
	"standard_errors" jsonb,
	"sigma2" double precision,
	"log_likelihood" double precision,
	"aic" double precision,
	"aicc" double precision,
	"bic" double precision,
	"diagnostics" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"selection" jsonb,
	"data_start" timestamp with time zone NOT NULL,
	"data_end" timestamp with time zone NOT NULL,
	"observation_count" integer NOT NULL,
	"data_hash" text NOT NULL,
	"duration_ms" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "fits_window_check" CHECK ("fits"."data_end" >= "fits"."data_start")
);
--> statement-breakpoint
CREATE TABLE "model_specs" (
	"series_id" integer PRIMARY KEY NOT NULL,
	"method" "model_method" DEFAULT 'auto' NOT NULL,
	"ar_order" smallint,
	"ma_order" smallint,
	"max_ar_order" smallint DEFAULT 48 NOT NULL,
	"max_ma_order" smallint DEFAULT 2 NOT NULL,
	"extra_lags" integer[] DEFAULT '{}'::integer[] NOT NULL,
	"seasonal_treatment" "seasonal_treatment" DEFAULT 'hour_of_week_profile' NOT NULL,
	"use_temperature" boolean DEFAULT true NOT NULL,
	"use_day_type" boolean DEFAULT true NOT NULL,
	"training_window_days" integer DEFAULT 365 NOT NULL,
	"horizon_hours" integer DEFAULT 168 NOT NULL,
	"levels" integer[] DEFAULT '{80,95}'::integer[] NOT NULL,
	"updated_by_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "model_specs_orders_check" CHECK (coalesce("model_specs"."ar_order", 0) >= 0 and coalesce("model_specs"."ma_order", 0) >= 0 and "model_specs"."max_ar_order" >= 0 and "model_specs"."max_ma_order" >= 0),
	CONSTRAINT "model_specs_horizon_check" CHECK ("model_specs"."horizon_hours" between 1 and 8784),
	CONSTRAINT "model_specs_training_window_check" CHECK ("model_specs"."training_window_days" between 7 and 3660),
	CONSTRAINT "model_specs_levels_check" CHECK (cardinality("model_specs"."levels") >= 1 and 0 < all("model_specs"."levels") and 100 > all("model_specs"."levels"))
);
--> statement-breakpoint
CREATE TABLE "refit_run_series" (
	"run_id" integer NOT NULL,
	"series_id" integer NOT NULL,
	"status" "refit_status" DEFAULT 'queued' NOT NULL,
	"attempts" smallint DEFAULT 0 NOT NULL,
	"error" text,
	"fit_id" bigint,
	"phase_ms" jsonb,
	"queued_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	"duration_ms" integer,
	CONSTRAINT "refit_run_series_pkey" PRIMARY KEY("run_id","series_id")
);
--> statement-breakpoint
CREATE TABLE "refit_runs" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "refit_runs_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"trigger" "refit_trigger" NOT NULL,
	"requested_by_id" integer,
	"scope" jsonb DEFAULT '{"kind":"all"}'::jsonb NOT NULL,
	"scheduled_for" timestamp with time zone,
	"series_total" integer DEFAULT 0 NOT NULL,
	"series_done" integer DEFAULT 0 NOT NULL,
	"series_failed" integer DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	CONSTRAINT "refit_runs_schedule_has_time_check" CHECK ("refit_runs"."trigger" <> 'schedule' or "refit_runs"."scheduled_for" is not null)
);
--> statement-breakpoint
CREATE TABLE "miss_comments" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "miss_comments_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"event_id" bigint NOT NULL,
	"author_id" integer,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "miss_comments_body_check" CHECK (length(btrim("miss_comments"."body")) > 0)
);
--> statement-breakpoint
CREATE TABLE "miss_events" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "miss_events_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
	"rule_id" integer NOT NULL,
	"series_id" integer NOT NULL,
	"version_id" bigint NOT NULL,
	"period_start" timestamp with time zone NOT NULL,
	"period_end" timestamp with time zone NOT NULL,
	"detected_at" timestamp with time zone DEFAULT now() NOT NULL,
	"state" "miss_state" DEFAULT 'open' NOT NULL,
	"detail" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"notified_at" timestamp with time zone,
	"acknowledged_by_id" integer,
	"acknowledged_at" timestamp with time zone,
	"resolved_by_id" integer,
	"resolved_at" timestamp with time zone,
	CONSTRAINT "miss_events_rule_series_version_period_key" UNIQUE("rule_id","series_id","version_id","period_start"),
	CONSTRAINT "miss_events_period_check" CHECK ("miss_events"."period_end" > "miss_events"."period_start"),
	CONSTRAINT "miss_events_acknowledged_check" CHECK ("miss_events"."state" = 'open' or "miss_events"."acknowledged_at" is not null or "miss_events"."resolved_at" is not null)
);
--> statement-breakpoint
CREATE TABLE "miss_rules" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "miss_rules_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"name" text NOT NULL,
	"scope" "miss_rule_scope" DEFAULT 'all' NOT NULL,
	"scope_level" "series_level",
	"scope_series_id" integer,
	"kind" "miss_rule_kind" NOT NULL,
	"band_level" smallint,
	"threshold" double precision,
	"recipients" text[] DEFAULT '{}'::text[] NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_by_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "miss_rules_scope_check" CHECK (("miss_rules"."scope" = 'all' and "miss_rules"."scope_level" is null and "miss_rules"."scope_series_id" is null)
       or ("miss_rules"."scope" = 'level' and "miss_rules"."scope_level" is not null and "miss_rules"."scope_series_id" is null)
       or ("miss_rules"."scope" = 'series' and "miss_rules"."scope_series_id" is not null and "miss_rules"."scope_level" is null)),
	CONSTRAINT "miss_rules_parameters_check" CHECK (("miss_rules"."kind" = 'outside_band' and "miss_rules"."band_level" between 1 and 99)
       or ("miss_rules"."kind" <> 'outside_band' and "miss_rules"."threshold" > 0))
);
--> statement-breakpoint
ALTER TABLE "api_tokens" ADD CONSTRAINT "api_tokens_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_log" ADD CONSTRAINT "audit_log_actor_user_id_users_id_fk" FOREIGN KEY ("actor_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_log" ADD CONSTRAINT "audit_log_actor_token_id_api_tokens_id_fk" FOREIGN KEY ("actor_token_id") REFERENCES "public"."api_tokens"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "forecast_adjustments" ADD CONSTRAINT "forecast_adjustments_version_id_forecast_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."forecast_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "forecast_adjustments" ADD CONSTRAINT "forecast_adjustments_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "forecast_points" ADD CONSTRAINT "forecast_points_version_id_forecast_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."forecast_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "forecast_versions" ADD CONSTRAINT "forecast_versions_series_id_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "forecast_versions" ADD CONSTRAINT "forecast_versions_fit_id_fits_id_fk" FOREIGN KEY ("fit_id") REFERENCES "public"."fits"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "forecast_versions" ADD CONSTRAINT "forecast_versions_refit_run_id_refit_runs_id_fk" FOREIGN KEY ("refit_run_id") REFERENCES "public"."refit_runs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "forecast_versions" ADD CONSTRAINT "forecast_versions_approved_by_id_users_id_fk" FOREIGN KEY ("approved_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "holidays" ADD CONSTRAINT "holidays_updated_by_id_users_id_fk" FOREIGN KEY ("updated_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "one_time_tokens" ADD CONSTRAINT "one_time_tokens_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "one_time_tokens" ADD CONSTRAINT "one_time_tokens_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sessions" ADD CONSTRAINT "sessions_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "series" ADD CONSTRAINT "series_parent_id_series_id_fk" FOREIGN KEY ("parent_id") REFERENCES "public"."series"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "series" ADD CONSTRAINT "series_temperature_series_id_series_id_fk" FOREIGN KEY ("temperature_series_id") REFERENCES "public"."series"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "upload_findings" ADD CONSTRAINT "upload_findings_upload_id_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."uploads"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "upload_findings" ADD CONSTRAINT "upload_findings_series_id_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_uploaded_by_id_users_id_fk" FOREIGN KEY ("uploaded_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_uploaded_by_token_id_api_tokens_id_fk" FOREIGN KEY ("uploaded_by_token_id") REFERENCES "public"."api_tokens"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observation_revisions" ADD CONSTRAINT "observation_revisions_series_id_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observation_revisions" ADD CONSTRAINT "observation_revisions_upload_id_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."uploads"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observation_revisions" ADD CONSTRAINT "observation_revisions_superseded_by_upload_id_uploads_id_fk" FOREIGN KEY ("superseded_by_upload_id") REFERENCES "public"."uploads"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observations" ADD CONSTRAINT "observations_series_id_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observations" ADD CONSTRAINT "observations_upload_id_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."uploads"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fits" ADD CONSTRAINT "fits_series_id_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "model_specs" ADD CONSTRAINT "model_specs_series_id_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "model_specs" ADD CONSTRAINT "model_specs_updated_by_id_users_id_fk" FOREIGN KEY ("updated_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "refit_run_series" ADD CONSTRAINT "refit_run_series_run_id_refit_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."refit_runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "refit_run_series" ADD CONSTRAINT "refit_run_series_series_id_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "refit_run_series" ADD CONSTRAINT "refit_run_series_fit_id_fits_id_fk" FOREIGN KEY ("fit_id") REFERENCES "public"."fits"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "refit_runs" ADD CONSTRAINT "refit_runs_requested_by_id_users_id_fk" FOREIGN KEY ("requested_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "miss_comments" ADD CONSTRAINT "miss_comments_event_id_miss_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."miss_events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "miss_comments" ADD CONSTRAINT "miss_comments_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "miss_events" ADD CONSTRAINT "miss_events_rule_id_miss_rules_id_fk" FOREIGN KEY ("rule_id") REFERENCES "public"."miss_rules"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "miss_events" ADD CONSTRAINT "miss_events_series_id_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "miss_events" ADD CONSTRAINT "miss_events_version_id_forecast_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."forecast_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "miss_events" ADD CONSTRAINT "miss_events_acknowledged_by_id_users_id_fk" FOREIGN KEY ("acknowledged_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "miss_events" ADD CONSTRAINT "miss_events_resolved_by_id_users_id_fk" FOREIGN KEY ("resolved_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "miss_rules" ADD CONSTRAINT "miss_rules_scope_series_id_series_id_fk" FOREIGN KEY ("scope_series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "miss_rules" ADD CONSTRAINT "miss_rules_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "api_tokens_created_by_id_idx" ON "api_tokens" USING btree ("created_by_id");--> statement-breakpoint
CREATE INDEX "audit_log_at_idx" ON "audit_log" USING btree ("at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "audit_log_actor_user_idx" ON "audit_log" USING btree ("actor_user_id","at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "audit_log_actor_token_idx" ON "audit_log" USING btree ("actor_token_id","at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "audit_log_action_idx" ON "audit_log" USING btree ("action","at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "forecast_adjustments_version_idx" ON "forecast_adjustments" USING btree ("version_id","period_start");--> statement-breakpoint
CREATE UNIQUE INDEX "forecast_versions_one_draft_key" ON "forecast_versions" USING btree ("series_id") WHERE "forecast_versions"."state" = 'draft';--> statement-breakpoint
CREATE UNIQUE INDEX "forecast_versions_one_approved_key" ON "forecast_versions" USING btree ("series_id") WHERE "forecast_versions"."state" = 'approved';--> statement-breakpoint
CREATE UNIQUE INDEX "forecast_versions_run_series_key" ON "forecast_versions" USING btree ("refit_run_id","series_id") WHERE "forecast_versions"."refit_run_id" is not null;--> statement-breakpoint
CREATE INDEX "forecast_versions_series_issued_idx" ON "forecast_versions" USING btree ("series_id","issued_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "holidays_day_idx" ON "holidays" USING btree ("day");--> statement-breakpoint
CREATE UNIQUE INDEX "users_email_lower_key" ON "users" USING btree (lower("email"));--> statement-breakpoint
CREATE INDEX "one_time_tokens_user_id_idx" ON "one_time_tokens" USING btree ("user_id","purpose");--> statement-breakpoint
CREATE INDEX "sessions_user_id_idx" ON "sessions" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "sessions_expires_at_idx" ON "sessions" USING btree ("expires_at");--> statement-breakpoint
CREATE INDEX "series_parent_id_idx" ON "series" USING btree ("parent_id");--> statement-breakpoint
CREATE INDEX "series_temperature_series_id_idx" ON "series" USING btree ("temperature_series_id");--> statement-breakpoint
CREATE INDEX "series_peer_group_idx" ON "series" USING btree ("peer_group");--> statement-breakpoint
CREATE INDEX "upload_findings_upload_rule_idx" ON "upload_findings" USING btree ("upload_id","rule");--> statement-breakpoint
CREATE INDEX "upload_findings_series_ts_idx" ON "upload_findings" USING btree ("series_id","ts");--> statement-breakpoint
CREATE UNIQUE INDEX "uploads_content_sha256_key" ON "uploads" USING btree ("content_sha256") WHERE "uploads"."status" <> 'failed';--> statement-breakpoint
CREATE INDEX "uploads_created_at_idx" ON "uploads" USING btree ("created_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "uploads_status_idx" ON "uploads" USING btree ("status");--> statement-breakpoint
CREATE INDEX "fits_series_created_idx" ON "fits" USING btree ("series_id","created_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "refit_run_series_run_status_idx" ON "refit_run_series" USING btree ("run_id","status");--> statement-breakpoint
CREATE INDEX "refit_run_series_series_idx" ON "refit_run_series" USING btree ("series_id","run_id" DESC NULLS LAST);--> statement-breakpoint
CREATE UNIQUE INDEX "refit_runs_scheduled_for_key" ON "refit_runs" USING btree ("scheduled_for") WHERE "refit_runs"."trigger" = 'schedule';--> statement-breakpoint
CREATE INDEX "refit_runs_created_at_idx" ON "refit_runs" USING btree ("created_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "miss_comments_event_idx" ON "miss_comments" USING btree ("event_id","created_at");--> statement-breakpoint
CREATE INDEX "miss_events_state_detected_idx" ON "miss_events" USING btree ("state","detected_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "miss_events_series_detected_idx" ON "miss_events" USING btree ("series_id","detected_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "miss_events_version_idx" ON "miss_events" USING btree ("version_id");--> statement-breakpoint
CREATE INDEX "miss_rules_scope_series_idx" ON "miss_rules" USING btree ("scope_series_id");