CREATE TABLE "audit_checkpoints" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"event_id" bigint NOT NULL,
	"hash" text NOT NULL,
	"mode" text NOT NULL,
	"verified_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "recomputations" (
	"inputs_hash" text NOT NULL,
	"engine_version" text NOT NULL,
	"results_hash" text NOT NULL,
	"computed_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "recomputations_inputs_hash_engine_version_pk" PRIMARY KEY("inputs_hash","engine_version")
);
