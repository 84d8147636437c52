CREATE TABLE "thread_message" (
	"id" text PRIMARY KEY NOT NULL,
	"athlete_id" text NOT NULL,
	"planned_session_id" text,
	"log_id" text,
	"author_id" text NOT NULL,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "thread_message_one_subject" CHECK (("thread_message"."planned_session_id" is null) <> ("thread_message"."log_id" is null)),
	CONSTRAINT "thread_message_body" CHECK (char_length("thread_message"."body") between 1 and 1000)
);
--> statement-breakpoint
CREATE TABLE "thread_read" (
	"user_id" text NOT NULL,
	"thread_key" text NOT NULL,
	"last_read_at" timestamp with time zone NOT NULL,
	CONSTRAINT "thread_read_user_id_thread_key_pk" PRIMARY KEY("user_id","thread_key")
);
--> statement-breakpoint
ALTER TABLE "notification_setting" ADD COLUMN "message_emails" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "thread_message" ADD CONSTRAINT "thread_message_athlete_id_user_id_fk" FOREIGN KEY ("athlete_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "thread_message" ADD CONSTRAINT "thread_message_planned_session_id_planned_session_id_fk" FOREIGN KEY ("planned_session_id") REFERENCES "public"."planned_session"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "thread_message" ADD CONSTRAINT "thread_message_log_id_session_log_id_fk" FOREIGN KEY ("log_id") REFERENCES "public"."session_log"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "thread_message" ADD CONSTRAINT "thread_message_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "thread_read" ADD CONSTRAINT "thread_read_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "thread_message_session_idx" ON "thread_message" USING btree ("planned_session_id","created_at");--> statement-breakpoint
CREATE INDEX "thread_message_log_idx" ON "thread_message" USING btree ("log_id","created_at");--> statement-breakpoint
CREATE INDEX "thread_message_athlete_idx" ON "thread_message" USING btree ("athlete_id","created_at");