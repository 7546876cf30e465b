CREATE TABLE "makers" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"country" text,
	CONSTRAINT "makers_code_unique" UNIQUE("code")
);
--> statement-breakpoint
CREATE TABLE "part_media" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"part_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"content_type" text NOT NULL,
	"file_name" text NOT NULL,
	"bytes" integer NOT NULL,
	"storage_key" text NOT NULL,
	"thumbnail_key" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "part_supplier_skus" (
	"part_id" uuid NOT NULL,
	"supplier_id" uuid NOT NULL,
	"supplier_sku" text NOT NULL,
	CONSTRAINT "part_supplier_skus_part_id_supplier_id_pk" PRIMARY KEY("part_id","supplier_id")
);
--> statement-breakpoint
CREATE TABLE "parts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"sku" text NOT NULL,
	"name" text NOT NULL,
	"category" text NOT NULL,
	"maker_id" uuid NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"gtin" text,
	"unit" text DEFAULT 'each' NOT NULL,
	"pack_size" integer DEFAULT 1 NOT NULL,
	"mass_kg" numeric(9, 3) DEFAULT 0 NOT NULL,
	"width_mm" integer,
	"height_mm" integer,
	"depth_mm" integer,
	"ip_rating" text,
	"lifecycle" text DEFAULT 'active' NOT NULL,
	"superseded_by_id" uuid,
	"un_number" text,
	"dg_class" text,
	"wh_rating" numeric(10, 2),
	"cost_cents" numeric(14, 2),
	"list_price_cents" bigint,
	"attributes" jsonb NOT NULL,
	"compliance" jsonb,
	"archived_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "parts_sku_unique" UNIQUE("sku"),
	CONSTRAINT "parts_gtin_unique" UNIQUE("gtin"),
	CONSTRAINT "parts_category_known" CHECK ("parts"."category" in ('module', 'controller', 'feet', 'wall-bracket', 'end-cap', 'cable-set', 'cable-cover', 'earth-lead', 'comms-terminator', 'inverter', 'accessory')),
	CONSTRAINT "parts_attributes_category" CHECK ("parts"."attributes"->>'category' = "parts"."category"),
	CONSTRAINT "parts_pack_size_positive" CHECK ("parts"."pack_size" >= 1),
	CONSTRAINT "parts_mass_nonnegative" CHECK ("parts"."mass_kg" >= 0),
	CONSTRAINT "parts_gtin_digits" CHECK ("parts"."gtin" ~ '^([0-9]{8}|[0-9]{12}|[0-9]{13}|[0-9]{14})$'),
	CONSTRAINT "parts_superseded_has_successor" CHECK ("parts"."lifecycle" <> 'superseded' or "parts"."superseded_by_id" is not null),
	CONSTRAINT "parts_money_nonnegative" CHECK (coalesce("parts"."cost_cents", 0) >= 0 and coalesce("parts"."list_price_cents", 0) >= 0)
);
--> statement-breakpoint
CREATE TABLE "range_inverters" (
	"range_id" uuid NOT NULL,
	"inverter_id" uuid NOT NULL,
	CONSTRAINT "range_inverters_range_id_inverter_id_pk" PRIMARY KEY("range_id","inverter_id")
);
--> statement-breakpoint
CREATE TABLE "ranges" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"maker_id" uuid NOT NULL,
	"connection" text NOT NULL,
	"controller_id" uuid NOT NULL,
	"module_id" uuid NOT NULL,
	"min_modules" integer NOT NULL,
	"max_modules" integer NOT NULL,
	"max_stacks" integer DEFAULT 1 NOT NULL,
	"base_height_mm" integer DEFAULT 0 NOT NULL,
	"default_dod_pct" numeric(5, 2),
	"rules" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "ranges_code_unique" UNIQUE("code"),
	CONSTRAINT "ranges_modules_order" CHECK ("ranges"."min_modules" >= 1 and "ranges"."max_modules" >= "ranges"."min_modules" and "ranges"."max_modules" <= 64),
	CONSTRAINT "ranges_stacks_positive" CHECK ("ranges"."max_stacks" >= 1)
);
--> statement-breakpoint
CREATE TABLE "suppliers" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	CONSTRAINT "suppliers_code_unique" UNIQUE("code")
);
--> statement-breakpoint
CREATE TABLE "stock_levels" (
	"part_id" uuid NOT NULL,
	"warehouse_id" uuid NOT NULL,
	"bin" text NOT NULL,
	"on_hand" integer DEFAULT 0 NOT NULL,
	"reserved" integer DEFAULT 0 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "stock_levels_part_id_warehouse_id_bin_pk" PRIMARY KEY("part_id","warehouse_id","bin"),
	CONSTRAINT "stock_on_hand_nonnegative" CHECK ("stock_levels"."on_hand" >= 0),
	CONSTRAINT "stock_reserved_within_on_hand" CHECK ("stock_levels"."reserved" >= 0 and "stock_levels"."reserved" <= "stock_levels"."on_hand")
);
--> statement-breakpoint
CREATE TABLE "stock_movements" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"part_id" uuid NOT NULL,
	"warehouse_id" uuid NOT NULL,
	"bin" text NOT NULL,
	"qty" integer NOT NULL,
	"kind" text NOT NULL,
	"reason" text,
	"user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "stock_movement_nonzero" CHECK ("stock_movements"."qty" <> 0)
);
--> statement-breakpoint
CREATE TABLE "warehouses" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"rank" integer DEFAULT 1 NOT NULL,
	CONSTRAINT "warehouses_code_unique" UNIQUE("code")
);
--> statement-breakpoint
ALTER TABLE "part_media" ADD CONSTRAINT "part_media_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD CONSTRAINT "part_supplier_skus_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_supplier_skus" ADD CONSTRAINT "part_supplier_skus_supplier_id_suppliers_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."suppliers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "parts" ADD CONSTRAINT "parts_maker_id_makers_id_fk" FOREIGN KEY ("maker_id") REFERENCES "public"."makers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "parts" ADD CONSTRAINT "parts_superseded_by_id_parts_id_fk" FOREIGN KEY ("superseded_by_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "range_inverters" ADD CONSTRAINT "range_inverters_range_id_ranges_id_fk" FOREIGN KEY ("range_id") REFERENCES "public"."ranges"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "range_inverters" ADD CONSTRAINT "range_inverters_inverter_id_parts_id_fk" FOREIGN KEY ("inverter_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ranges" ADD CONSTRAINT "ranges_maker_id_makers_id_fk" FOREIGN KEY ("maker_id") REFERENCES "public"."makers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ranges" ADD CONSTRAINT "ranges_controller_id_parts_id_fk" FOREIGN KEY ("controller_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ranges" ADD CONSTRAINT "ranges_module_id_parts_id_fk" FOREIGN KEY ("module_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_levels" ADD CONSTRAINT "stock_levels_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_levels" ADD CONSTRAINT "stock_levels_warehouse_id_warehouses_id_fk" FOREIGN KEY ("warehouse_id") REFERENCES "public"."warehouses"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_movements" ADD CONSTRAINT "stock_movements_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_movements" ADD CONSTRAINT "stock_movements_warehouse_id_warehouses_id_fk" FOREIGN KEY ("warehouse_id") REFERENCES "public"."warehouses"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_movements" ADD CONSTRAINT "stock_movements_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "part_media_part_id_index" ON "part_media" USING btree ("part_id");--> statement-breakpoint
CREATE UNIQUE INDEX "part_supplier_skus_supplier_id_supplier_sku_index" ON "part_supplier_skus" USING btree ("supplier_id","supplier_sku");--> statement-breakpoint
CREATE INDEX "parts_category_index" ON "parts" USING btree ("category");--> statement-breakpoint
CREATE INDEX "parts_maker_id_index" ON "parts" USING btree ("maker_id");--> statement-breakpoint
CREATE INDEX "stock_movements_part_id_warehouse_id_index" ON "stock_movements" USING btree ("part_id","warehouse_id");