CREATE TABLE "mail_outbox" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"event" text NOT NULL,
	"to" text NOT NULL,
	"subject" text NOT NULL,
	"text" text NOT NULL,
	"html" text NOT NULL,
	"status" text DEFAULT 'queued' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"refs" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"message_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone,
	CONSTRAINT "mail_outbox_event_known" CHECK ("mail_outbox"."event" in ('invitation', 'password-reset', 'order-received', 'backorders', 'ready-for-collection', 'dispatched', 'payment-received', 'refund', 'purchase-order', 'price-list-applied', 'low-stock-digest')),
	CONSTRAINT "mail_outbox_status_known" CHECK ("mail_outbox"."status" in ('queued', 'sending', 'sent', 'retrying', 'failed'))
);
--> statement-breakpoint
CREATE TABLE "standin_mailbox" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"envelope_from" text,
	"envelope_to" text[] NOT NULL,
	"message_id" text,
	"subject" text,
	"text" text,
	"html" text,
	"raw" text NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "invoices" (
	"number" bigserial PRIMARY KEY NOT NULL,
	"job_id" uuid NOT NULL,
	"issued_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "invoices_jobId_unique" UNIQUE("job_id")
);
--> statement-breakpoint
CREATE TABLE "payment_events" (
	"event_id" text PRIMARY KEY NOT NULL,
	"type" text NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "payments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"session_id" text NOT NULL,
	"payment_intent_id" text,
	"amount_cents" bigint NOT NULL,
	"currency" text DEFAULT 'aud' NOT NULL,
	"status" text DEFAULT 'pending' NOT NULL,
	"checkout_url" text NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"paid_at" timestamp with time zone,
	"refund_id" text,
	"refunded_at" timestamp with time zone,
	"refund_error" text,
	CONSTRAINT "payments_sessionId_unique" UNIQUE("session_id"),
	CONSTRAINT "payments_status_known" CHECK ("payments"."status" in ('pending', 'paid', 'refunded', 'expired')),
	CONSTRAINT "payments_amount_positive" CHECK ("payments"."amount_cents" > 0)
);
--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "mail_outbox_created_at_index" ON "mail_outbox" USING btree ("created_at");--> statement-breakpoint
CREATE INDEX "mail_outbox_to_created_at_index" ON "mail_outbox" USING btree ("to","created_at");--> statement-breakpoint
CREATE INDEX "mail_outbox_status_created_at_index" ON "mail_outbox" USING btree ("status","created_at");--> statement-breakpoint
CREATE INDEX "standin_mailbox_received_at_index" ON "standin_mailbox" USING btree ("received_at");--> statement-breakpoint
CREATE INDEX "payments_job_id_index" ON "payments" USING btree ("job_id");--> statement-breakpoint
CREATE UNIQUE INDEX "payments_one_paid_per_job" ON "payments" USING btree ("job_id") WHERE "payments"."status" in ('paid', 'refunded');