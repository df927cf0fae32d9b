ALTER TYPE "public"."validation_rule" ADD VALUE 'dst_resolved';--> statement-breakpoint
ALTER TYPE "public"."validation_rule" ADD VALUE 'partial_interval';