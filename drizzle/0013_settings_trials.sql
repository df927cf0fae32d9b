CREATE TABLE "settings_trials" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "settings_trials_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"series_id" integer NOT NULL,
	"state" text DEFAULT 'queued' NOT NULL,
	"current_settings" jsonb NOT NULL,
	"proposed_settings" jsonb NOT NULL,
	"fits_done" integer DEFAULT 0 NOT NULL,
	"fits_total" integer NOT NULL,
	"first_origin" timestamp with time zone,
	"last_origin" timestamp with time zone,
	"results" jsonb,
	"error" text,
	"requested_by_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	"applied_at" timestamp with time zone,
	"applied_by_id" integer,
	CONSTRAINT "settings_trials_state_check" CHECK ("settings_trials"."state" in ('queued', 'running', 'finished', 'failed')),
	CONSTRAINT "settings_trials_results_check" CHECK ("settings_trials"."state" <> 'finished' or "settings_trials"."results" is not null),
	CONSTRAINT "settings_trials_applied_check" CHECK ("settings_trials"."applied_at" is null or "settings_trials"."state" = 'finished')
);
--> statement-breakpoint
ALTER TABLE "settings_trials" ADD CONSTRAINT "settings_trials_series_id_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."series"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "settings_trials" ADD CONSTRAINT "settings_trials_requested_by_id_users_id_fk" FOREIGN KEY ("requested_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "settings_trials" ADD CONSTRAINT "settings_trials_applied_by_id_users_id_fk" FOREIGN KEY ("applied_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "settings_trials_series_idx" ON "settings_trials" USING btree ("series_id","created_at" DESC NULLS LAST);--> statement-breakpoint
CREATE UNIQUE INDEX "settings_trials_one_active_key" ON "settings_trials" USING btree ("series_id") WHERE "settings_trials"."state" in ('queued', 'running');