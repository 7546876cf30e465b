CREATE TABLE "customer_tiers" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"discount_pct" numeric(5, 2) DEFAULT '0' NOT NULL,
	CONSTRAINT "customer_tiers_code_unique" UNIQUE("code"),
	CONSTRAINT "customer_tiers_discount_range" CHECK ("customer_tiers"."discount_pct" >= 0 and "customer_tiers"."discount_pct" < 100)
);
--> statement-breakpoint
CREATE TABLE "part_pricing" (
	"part_id" uuid PRIMARY KEY NOT NULL,
	"basis" text NOT NULL,
	"markup_pct" numeric(7, 2),
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "part_pricing_markup_range" CHECK ("part_pricing"."markup_pct" is null or ("part_pricing"."markup_pct" >= 0 and "part_pricing"."markup_pct" <= 1000)),
	CONSTRAINT "part_pricing_basis_known" CHECK ("part_pricing"."basis" in ('markup', 'supplier-list'))
);
--> statement-breakpoint
CREATE TABLE "price_list_imports" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"supplier_id" uuid NOT NULL,
	"file_name" text NOT NULL,
	"file_hash" text NOT NULL,
	"file_kind" text NOT NULL,
	"file" "bytea" NOT NULL,
	"sheets" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"sheet" text,
	"columns" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"mapping" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"status" text DEFAULT 'uploaded' NOT NULL,
	"counts" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"progress_done" integer DEFAULT 0 NOT NULL,
	"progress_total" integer DEFAULT 0 NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"applied_by" text,
	"applied_at" timestamp with time zone,
	CONSTRAINT "price_list_imports_status_known" CHECK ("price_list_imports"."status" in ('uploaded', 'staging', 'ready', 'applying', 'applied', 'failed'))
);
--> statement-breakpoint
CREATE TABLE "price_list_rows" (
	"import_id" uuid NOT NULL,
	"row_no" integer NOT NULL,
	"supplier_sku" text,
	"gtin" text,
	"description" text,
	"cost_cents" numeric(14, 2),
	"list_price_cents" bigint,
	"pack_size" integer,
	"moq" integer,
	"lead_time_days" integer,
	"price_breaks" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"problems" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"part_id" uuid,
	"matched_by" text,
	"create_as" jsonb,
	"old_cost_cents" numeric(14, 2),
	"kind" text NOT NULL,
	"flagged" boolean DEFAULT false NOT NULL,
	CONSTRAINT "price_list_rows_import_id_row_no_pk" PRIMARY KEY("import_id","row_no")
);
--> statement-breakpoint
CREATE TABLE "price_moves" (
	"recompute_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"old_cents" bigint,
	"new_cents" bigint NOT NULL,
	CONSTRAINT "price_moves_recompute_id_part_id_pk" PRIMARY KEY("recompute_id","part_id")
);
--> statement-breakpoint
CREATE TABLE "price_recomputes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"reason" text NOT NULL,
	"import_id" uuid,
	"user_id" text,
	"moved" integer DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "pricing_rules" (
	"category" text PRIMARY KEY NOT NULL,
	"basis" text DEFAULT 'markup' NOT NULL,
	"markup_pct" numeric(7, 2) DEFAULT '30' NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "pricing_rules_markup_range" CHECK ("pricing_rules"."markup_pct" >= 0 and "pricing_rules"."markup_pct" <= 1000),
	CONSTRAINT "pricing_rules_basis_known" CHECK ("pricing_rules"."basis" in ('markup', 'supplier-list'))
);
--> statement-breakpoint
CREATE TABLE "purchase_order_lines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"purchase_order_id" uuid NOT NULL,
	"line_no" integer NOT NULL,
	"part_id" uuid NOT NULL,
	"supplier_sku" text NOT NULL,
	"qty" integer NOT NULL,
	"received" integer DEFAULT 0 NOT NULL,
	"unit_cost_cents" numeric(14, 2) NOT NULL,
	CONSTRAINT "purchase_order_lines_no" UNIQUE("purchase_order_id","line_no"),
	CONSTRAINT "purchase_order_lines_qty_positive" CHECK ("purchase_order_lines"."qty" > 0),
	CONSTRAINT "purchase_order_lines_received_range" CHECK ("purchase_order_lines"."received" >= 0 and "purchase_order_lines"."received" <= "purchase_order_lines"."qty")
);
--> statement-breakpoint
CREATE TABLE "purchase_orders" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" text NOT NULL,
	"supplier_id" uuid NOT NULL,
	"warehouse_id" uuid NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"note" text,
	"expected_at" timestamp with time zone,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone,
	"closed_at" timestamp with time zone,
	CONSTRAINT "purchase_orders_number_unique" UNIQUE("number"),
	CONSTRAINT "purchase_orders_status_known" CHECK ("purchase_orders"."status" in ('draft', 'sent', 'part-received', 'received', 'closed'))
);
--> statement-breakpoint
CREATE TABLE "supplier_import_mappings" (
	"supplier_id" uuid PRIMARY KEY NOT NULL,
	"headers" jsonb NOT NULL,
	"mapping" jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "supplier_part_prices" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"part_id" uuid NOT NULL,
	"supplier_id" uuid NOT NULL,
	"cost_cents" numeric(14, 2) NOT NULL,
	"price_breaks" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"import_id" uuid,
	"user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "companies" ADD COLUMN "tier_id" uuid;--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD COLUMN "description" text;--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD COLUMN "pack_size" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD COLUMN "moq" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD COLUMN "cost_cents" numeric(14, 2);--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD COLUMN "price_breaks" jsonb DEFAULT '[]'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD COLUMN "list_price_cents" bigint;--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD COLUMN "lead_time_days" integer;--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD COLUMN "updated_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "suppliers" ADD COLUMN "currency" text DEFAULT 'AUD' NOT NULL;--> statement-breakpoint
ALTER TABLE "suppliers" ADD COLUMN "aud_per_unit" numeric(12, 6) DEFAULT '1' NOT NULL;--> statement-breakpoint
ALTER TABLE "suppliers" ADD COLUMN "number_locale" text DEFAULT 'en-AU' NOT NULL;--> statement-breakpoint
ALTER TABLE "suppliers" ADD COLUMN "lead_time_days" integer DEFAULT 7 NOT NULL;--> statement-breakpoint
ALTER TABLE "suppliers" ADD COLUMN "contact_name" text;--> statement-breakpoint
ALTER TABLE "suppliers" ADD COLUMN "contact_email" text;--> statement-breakpoint
ALTER TABLE "suppliers" ADD COLUMN "contact_phone" text;--> statement-breakpoint
ALTER TABLE "suppliers" ADD COLUMN "flag_change_pct" numeric(6, 2) DEFAULT '10' NOT NULL;--> statement-breakpoint
ALTER TABLE "suppliers" ADD COLUMN "created_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "part_pricing" ADD CONSTRAINT "part_pricing_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_list_imports" ADD CONSTRAINT "price_list_imports_supplier_id_suppliers_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."suppliers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_list_imports" ADD CONSTRAINT "price_list_imports_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_list_imports" ADD CONSTRAINT "price_list_imports_applied_by_user_id_fk" FOREIGN KEY ("applied_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_list_rows" ADD CONSTRAINT "price_list_rows_import_id_price_list_imports_id_fk" FOREIGN KEY ("import_id") REFERENCES "public"."price_list_imports"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_list_rows" ADD CONSTRAINT "price_list_rows_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_moves" ADD CONSTRAINT "price_moves_recompute_id_price_recomputes_id_fk" FOREIGN KEY ("recompute_id") REFERENCES "public"."price_recomputes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_moves" ADD CONSTRAINT "price_moves_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_recomputes" ADD CONSTRAINT "price_recomputes_import_id_price_list_imports_id_fk" FOREIGN KEY ("import_id") REFERENCES "public"."price_list_imports"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_recomputes" ADD CONSTRAINT "price_recomputes_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "purchase_order_lines" ADD CONSTRAINT "purchase_order_lines_purchase_order_id_purchase_orders_id_fk" FOREIGN KEY ("purchase_order_id") REFERENCES "public"."purchase_orders"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "purchase_order_lines" ADD CONSTRAINT "purchase_order_lines_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "purchase_orders" ADD CONSTRAINT "purchase_orders_supplier_id_suppliers_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."suppliers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "purchase_orders" ADD CONSTRAINT "purchase_orders_warehouse_id_warehouses_id_fk" FOREIGN KEY ("warehouse_id") REFERENCES "public"."warehouses"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "purchase_orders" ADD CONSTRAINT "purchase_orders_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supplier_import_mappings" ADD CONSTRAINT "supplier_import_mappings_supplier_id_suppliers_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."suppliers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supplier_part_prices" ADD CONSTRAINT "supplier_part_prices_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supplier_part_prices" ADD CONSTRAINT "supplier_part_prices_supplier_id_suppliers_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."suppliers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supplier_part_prices" ADD CONSTRAINT "supplier_part_prices_import_id_price_list_imports_id_fk" FOREIGN KEY ("import_id") REFERENCES "public"."price_list_imports"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "supplier_part_prices" ADD CONSTRAINT "supplier_part_prices_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "price_list_imports_supplier_id_created_at_index" ON "price_list_imports" USING btree ("supplier_id","created_at");--> statement-breakpoint
CREATE INDEX "price_list_imports_file_hash_index" ON "price_list_imports" USING btree ("file_hash");--> statement-breakpoint
CREATE INDEX "price_list_rows_import_id_kind_index" ON "price_list_rows" USING btree ("import_id","kind");--> statement-breakpoint
CREATE INDEX "purchase_order_lines_part_id_index" ON "purchase_order_lines" USING btree ("part_id");--> statement-breakpoint
CREATE INDEX "purchase_orders_status_created_at_index" ON "purchase_orders" USING btree ("status","created_at");--> statement-breakpoint
CREATE INDEX "supplier_part_prices_part_id_supplier_id_created_at_index" ON "supplier_part_prices" USING btree ("part_id","supplier_id","created_at");--> statement-breakpoint
ALTER TABLE "companies" ADD CONSTRAINT "companies_tier_id_customer_tiers_id_fk" FOREIGN KEY ("tier_id") REFERENCES "public"."customer_tiers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD CONSTRAINT "part_supplier_skus_pack_positive" CHECK ("part_supplier_skus"."pack_size" >= 1 and "part_supplier_skus"."moq" >= 1);--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD CONSTRAINT "part_supplier_skus_money_nonnegative" CHECK (coalesce("part_supplier_skus"."cost_cents", 0) >= 0 and coalesce("part_supplier_skus"."list_price_cents", 0) >= 0);--> statement-breakpoint
ALTER TABLE "suppliers" ADD CONSTRAINT "suppliers_rate_positive" CHECK ("suppliers"."aud_per_unit" > 0);--> statement-breakpoint
ALTER TABLE "suppliers" ADD CONSTRAINT "suppliers_lead_time_range" CHECK ("suppliers"."lead_time_days" >= 0 and "suppliers"."lead_time_days" <= 365);--> statement-breakpoint
ALTER TABLE "suppliers" ADD CONSTRAINT "suppliers_flag_range" CHECK ("suppliers"."flag_change_pct" >= 0 and "suppliers"."flag_change_pct" <= 1000);