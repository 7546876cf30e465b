CREATE TABLE "bins" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"warehouse_id" uuid NOT NULL,
	"code" text NOT NULL,
	"pick_order" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "bins_warehouse_code" UNIQUE("warehouse_id","code"),
	CONSTRAINT "bins_pick_order_nonnegative" CHECK ("bins"."pick_order" >= 0)
);
--> statement-breakpoint
CREATE TABLE "default_bins" (
	"part_id" uuid NOT NULL,
	"warehouse_id" uuid NOT NULL,
	"bin" text NOT NULL,
	CONSTRAINT "default_bins_part_id_warehouse_id_pk" PRIMARY KEY("part_id","warehouse_id")
);
--> statement-breakpoint
CREATE TABLE "stock_limits" (
	"part_id" uuid PRIMARY KEY NOT NULL,
	"min_qty" integer NOT NULL,
	"max_qty" integer NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "stock_limits_order" CHECK ("stock_limits"."min_qty" >= 0 and "stock_limits"."max_qty" >= "stock_limits"."min_qty")
);
--> statement-breakpoint
CREATE TABLE "backorders" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"job_line_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"qty" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "backorders_jobLineId_unique" UNIQUE("job_line_id"),
	CONSTRAINT "backorders_qty_positive" CHECK ("backorders"."qty" > 0)
);
--> statement-breakpoint
CREATE TABLE "job_lines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_id" uuid NOT NULL,
	"line_no" integer NOT NULL,
	"part_id" uuid NOT NULL,
	"qty" integer NOT NULL,
	"plan_id" uuid,
	"reason" text,
	"unit_price_cents" bigint,
	CONSTRAINT "job_lines_job_line_no" UNIQUE("job_id","line_no"),
	CONSTRAINT "job_lines_qty_positive" CHECK ("job_lines"."qty" > 0)
);
--> statement-breakpoint
CREATE TABLE "job_plans" (
	"job_id" uuid NOT NULL,
	"plan_id" uuid NOT NULL,
	CONSTRAINT "job_plans_job_id_plan_id_pk" PRIMARY KEY("job_id","plan_id")
);
--> statement-breakpoint
CREATE TABLE "job_status_history" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"job_id" uuid NOT NULL,
	"status" text NOT NULL,
	"note" text,
	"user_id" text,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "jobs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"company_id" uuid NOT NULL,
	"reference" text NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"site_suburb" text,
	"site_postcode" text,
	"contact" text,
	"notes" text,
	"preferred_warehouse_id" uuid,
	"lines_copied_at" timestamp with time zone,
	"ordered_at" timestamp with time zone,
	"created_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "jobs_company_reference" UNIQUE("company_id","reference"),
	CONSTRAINT "jobs_status_known" CHECK ("jobs"."status" in ('draft', 'ordered', 'reserved', 'part-reserved', 'picking', 'ready', 'dispatched', 'collected', 'closed', 'cancelled'))
);
--> statement-breakpoint
CREATE TABLE "reservations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"job_line_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"warehouse_id" uuid NOT NULL,
	"bin" text NOT NULL,
	"qty" integer NOT NULL,
	"needs_transfer" boolean DEFAULT false NOT NULL,
	"expires_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "reservations_line_place" UNIQUE("job_line_id","warehouse_id","bin"),
	CONSTRAINT "reservations_qty_positive" CHECK ("reservations"."qty" > 0)
);
--> statement-breakpoint
ALTER TABLE "stock_movements" ADD COLUMN "reference" text;--> statement-breakpoint
ALTER TABLE "stock_movements" ADD COLUMN "job_id" uuid;--> statement-breakpoint
ALTER TABLE "bins" ADD CONSTRAINT "bins_warehouse_id_warehouses_id_fk" FOREIGN KEY ("warehouse_id") REFERENCES "public"."warehouses"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "default_bins" ADD CONSTRAINT "default_bins_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "default_bins" ADD CONSTRAINT "default_bins_warehouse_id_warehouses_id_fk" FOREIGN KEY ("warehouse_id") REFERENCES "public"."warehouses"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_limits" ADD CONSTRAINT "stock_limits_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "backorders" ADD CONSTRAINT "backorders_job_line_id_job_lines_id_fk" FOREIGN KEY ("job_line_id") REFERENCES "public"."job_lines"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "backorders" ADD CONSTRAINT "backorders_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_lines" ADD CONSTRAINT "job_lines_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_lines" ADD CONSTRAINT "job_lines_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_lines" ADD CONSTRAINT "job_lines_plan_id_stack_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."stack_plans"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_plans" ADD CONSTRAINT "job_plans_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_plans" ADD CONSTRAINT "job_plans_plan_id_stack_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."stack_plans"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_status_history" ADD CONSTRAINT "job_status_history_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_status_history" ADD CONSTRAINT "job_status_history_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_company_id_companies_id_fk" FOREIGN KEY ("company_id") REFERENCES "public"."companies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_preferred_warehouse_id_warehouses_id_fk" FOREIGN KEY ("preferred_warehouse_id") REFERENCES "public"."warehouses"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reservations" ADD CONSTRAINT "reservations_job_line_id_job_lines_id_fk" FOREIGN KEY ("job_line_id") REFERENCES "public"."job_lines"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reservations" ADD CONSTRAINT "reservations_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reservations" ADD CONSTRAINT "reservations_warehouse_id_warehouses_id_fk" FOREIGN KEY ("warehouse_id") REFERENCES "public"."warehouses"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "backorders_part_id_created_at_id_index" ON "backorders" USING btree ("part_id","created_at","id");--> statement-breakpoint
CREATE INDEX "job_lines_part_id_index" ON "job_lines" USING btree ("part_id");--> statement-breakpoint
CREATE INDEX "job_status_history_job_id_at_index" ON "job_status_history" USING btree ("job_id","at");--> statement-breakpoint
CREATE INDEX "jobs_status_created_at_index" ON "jobs" USING btree ("status","created_at");--> statement-breakpoint
CREATE INDEX "jobs_created_at_index" ON "jobs" USING btree ("created_at");--> statement-breakpoint
CREATE INDEX "reservations_part_id_warehouse_id_bin_index" ON "reservations" USING btree ("part_id","warehouse_id","bin");--> statement-breakpoint
CREATE INDEX "reservations_expires_at_index" ON "reservations" USING btree ("expires_at");--> statement-breakpoint
ALTER TABLE "stock_movements" ADD CONSTRAINT "stock_movements_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "stock_movements_created_at_index" ON "stock_movements" USING btree ("created_at");--> statement-breakpoint
CREATE INDEX "stock_movements_job_id_index" ON "stock_movements" USING btree ("job_id");--> statement-breakpoint
ALTER TABLE "stock_movements" ADD CONSTRAINT "stock_movement_kind_known" CHECK ("stock_movements"."kind" in ('receive', 'adjust', 'transfer-out', 'transfer-in', 'pick-issue', 'return', 'count-correction'));