CREATE SEQUENCE "public"."sscc_serial_reference" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1;--> statement-breakpoint
CREATE TABLE "job_parcels" (
	"job_id" uuid NOT NULL,
	"n" integer NOT NULL,
	"of" integer NOT NULL,
	"sscc" text NOT NULL,
	"serial_reference" bigint NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "job_parcels_job_id_n_pk" PRIMARY KEY("job_id","n"),
	CONSTRAINT "job_parcels_sscc_unique" UNIQUE("sscc"),
	CONSTRAINT "job_parcels_sscc_digits" CHECK ("job_parcels"."sscc" ~ '^[0-9]{18}$')
);
--> statement-breakpoint
CREATE TABLE "part_serials" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"part_id" uuid NOT NULL,
	"serial" text NOT NULL,
	"state" text NOT NULL,
	"warehouse_id" uuid,
	"bin" text,
	"receipt_reference" text,
	"job_id" uuid,
	"job_line_id" uuid,
	"received_at" timestamp with time zone,
	"issued_at" timestamp with time zone,
	"issued_by" text,
	CONSTRAINT "part_serials_part_serial" UNIQUE("part_id","serial"),
	CONSTRAINT "part_serials_state_known" CHECK ("part_serials"."state" in ('in-stock', 'issued')),
	CONSTRAINT "part_serials_issued_to_line" CHECK ("part_serials"."state" <> 'issued' or "part_serials"."job_line_id" is not null)
);
--> statement-breakpoint
CREATE TABLE "pick_scans" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"job_id" uuid NOT NULL,
	"scan_id" text NOT NULL,
	"code" text NOT NULL,
	"job_line_id" uuid NOT NULL,
	"qty" integer NOT NULL,
	"serial" text,
	"message" text NOT NULL,
	"user_id" text,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "pick_scans_job_scan" UNIQUE("job_id","scan_id"),
	CONSTRAINT "pick_scans_job_line_serial" UNIQUE("job_line_id","serial"),
	CONSTRAINT "pick_scans_qty_positive" CHECK ("pick_scans"."qty" > 0)
);
--> statement-breakpoint
CREATE TABLE "pick_sessions" (
	"job_id" uuid PRIMARY KEY NOT NULL,
	"state" text DEFAULT 'active' NOT NULL,
	"picker_id" text,
	"current_line_id" uuid,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"paused_at" timestamp with time zone,
	"completed_at" timestamp with time zone,
	"completed_by" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "pick_sessions_state_known" CHECK ("pick_sessions"."state" in ('active', 'paused', 'done'))
);
--> statement-breakpoint
ALTER TABLE "job_parcels" ADD CONSTRAINT "job_parcels_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_serials" ADD CONSTRAINT "part_serials_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_serials" ADD CONSTRAINT "part_serials_warehouse_id_warehouses_id_fk" FOREIGN KEY ("warehouse_id") REFERENCES "public"."warehouses"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_serials" ADD CONSTRAINT "part_serials_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_serials" ADD CONSTRAINT "part_serials_job_line_id_job_lines_id_fk" FOREIGN KEY ("job_line_id") REFERENCES "public"."job_lines"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_serials" ADD CONSTRAINT "part_serials_issued_by_user_id_fk" FOREIGN KEY ("issued_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pick_scans" ADD CONSTRAINT "pick_scans_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pick_scans" ADD CONSTRAINT "pick_scans_job_line_id_job_lines_id_fk" FOREIGN KEY ("job_line_id") REFERENCES "public"."job_lines"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pick_scans" ADD CONSTRAINT "pick_scans_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pick_sessions" ADD CONSTRAINT "pick_sessions_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pick_sessions" ADD CONSTRAINT "pick_sessions_picker_id_user_id_fk" FOREIGN KEY ("picker_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pick_sessions" ADD CONSTRAINT "pick_sessions_current_line_id_job_lines_id_fk" FOREIGN KEY ("current_line_id") REFERENCES "public"."job_lines"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pick_sessions" ADD CONSTRAINT "pick_sessions_completed_by_user_id_fk" FOREIGN KEY ("completed_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "part_serials_job_id_index" ON "part_serials" USING btree ("job_id");--> statement-breakpoint
CREATE INDEX "pick_scans_job_id_id_index" ON "pick_scans" USING btree ("job_id","id");