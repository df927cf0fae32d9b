CREATE TYPE "public"."miss_mail_choice" AS ENUM('by_severity', 'immediate', 'digest', 'none');--> statement-breakpoint
CREATE TYPE "public"."miss_severity" AS ENUM('low', 'medium', 'high');--> statement-breakpoint
CREATE TYPE "public"."mail_kind" AS ENUM('invite', 'password_reset', 'miss_alert', 'miss_digest');--> statement-breakpoint
CREATE TYPE "public"."mail_status" AS ENUM('queued', 'sent', 'failed');--> statement-breakpoint
ALTER TYPE "public"."miss_rule_kind" ADD VALUE 'creeping_bias';--> statement-breakpoint
ALTER TYPE "public"."miss_rule_kind" ADD VALUE 'actuals_late';--> statement-breakpoint
ALTER TYPE "public"."miss_rule_kind" ADD VALUE 'forecast_late';--> statement-breakpoint
ALTER TYPE "public"."miss_rule_kind" ADD VALUE 'estimated_hours';--> statement-breakpoint
CREATE TABLE "mail_messages" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "mail_messages_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
	"kind" "mail_kind" NOT NULL,
	"recipient" text NOT NULL,
	"user_id" integer,
	"subject" text NOT NULL,
	"text" text NOT NULL,
	"html" text NOT NULL,
	"status" "mail_status" DEFAULT 'queued' NOT NULL,
	"attempts" smallint DEFAULT 0 NOT NULL,
	"last_error" text,
	"queued_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_attempt_at" timestamp with time zone,
	"sent_at" timestamp with time zone,
	CONSTRAINT "mail_messages_sent_check" CHECK (("mail_messages"."status" = 'sent') = ("mail_messages"."sent_at" is not null))
);
--> statement-breakpoint
ALTER TABLE "miss_rules" DROP CONSTRAINT "miss_rules_parameters_check";--> statement-breakpoint
ALTER TABLE "miss_events" ALTER COLUMN "version_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "organisation" ADD COLUMN "forecast_deadline_minute" smallint DEFAULT 420 NOT NULL;--> statement-breakpoint
ALTER TABLE "organisation" ADD COLUMN "digest_hour" smallint DEFAULT 7 NOT NULL;--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "miss_mail" "miss_mail_choice" DEFAULT 'by_severity' NOT NULL;--> statement-breakpoint
ALTER TABLE "miss_events" ADD COLUMN "severity" "miss_severity" DEFAULT 'medium' NOT NULL;--> statement-breakpoint
ALTER TABLE "miss_events" ADD COLUMN "cause" jsonb;--> statement-breakpoint
ALTER TABLE "miss_rules" ADD COLUMN "hours" smallint DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "miss_rules" ADD COLUMN "floor_kw" double precision;--> statement-breakpoint
ALTER TABLE "miss_rules" ADD COLUMN "peak_hour_tolerance" smallint;--> statement-breakpoint
ALTER TABLE "miss_rules" ADD COLUMN "severity" "miss_severity" DEFAULT 'medium' NOT NULL;--> statement-breakpoint
ALTER TABLE "mail_messages" ADD CONSTRAINT "mail_messages_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "mail_messages_queued_idx" ON "mail_messages" USING btree ("queued_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "mail_messages_status_idx" ON "mail_messages" USING btree ("status","queued_at") WHERE "mail_messages"."status" <> 'sent';--> statement-breakpoint
CREATE UNIQUE INDEX "miss_events_one_open_key" ON "miss_events" USING btree ("rule_id","series_id") WHERE "miss_events"."state" = 'open';--> statement-breakpoint
ALTER TABLE "organisation" ADD CONSTRAINT "organisation_forecast_deadline_check" CHECK ("organisation"."forecast_deadline_minute" between 0 and 1439);--> statement-breakpoint
ALTER TABLE "organisation" ADD CONSTRAINT "organisation_digest_hour_check" CHECK ("organisation"."digest_hour" between 0 and 23);--> statement-breakpoint
ALTER TABLE "miss_rules" ADD CONSTRAINT "miss_rules_parameters_check" CHECK (("miss_rules"."band_level" is null or "miss_rules"."band_level" between 1 and 99) and ("miss_rules"."threshold" is null or "miss_rules"."threshold" > 0)
       and "miss_rules"."hours" between 1 and 168 and ("miss_rules"."floor_kw" is null or "miss_rules"."floor_kw" >= 0)
       and ("miss_rules"."peak_hour_tolerance" is null or "miss_rules"."peak_hour_tolerance" between 0 and 23));