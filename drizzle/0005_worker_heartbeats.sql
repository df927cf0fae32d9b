CREATE TABLE "worker_heartbeats" (
	"id" uuid PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"host" text NOT NULL,
	"pid" integer NOT NULL,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"beat_at" timestamp with time zone DEFAULT now() NOT NULL,
	"beat_seconds" integer NOT NULL,
	"jobs" uuid[] DEFAULT '{}'::uuid[] NOT NULL,
	CONSTRAINT "worker_heartbeats_beat_positive" CHECK ("worker_heartbeats"."beat_seconds" > 0)
);
--> statement-breakpoint
CREATE INDEX "worker_heartbeats_beat_at_idx" ON "worker_heartbeats" USING btree ("beat_at");