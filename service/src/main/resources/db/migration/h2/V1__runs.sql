-- Runs and their computed points (embedded H2 file database). Keep in step with ../postgresql.
create table runs (
  id varchar(36) primary key,
  kind varchar(32) not null,
  operation varchar(100) not null,
  owner_name varchar(64) not null,
  label varchar(200),
  status varchar(16) not null,
  definition character large object not null,
  provenance character large object,
  total_points integer not null,
  chunk_size integer not null,
  done_points integer not null,
  failed_points integer not null,
  created_at timestamp with time zone not null,
  started_at timestamp with time zone,
  finished_at timestamp with time zone,
  status_reason varchar(2000)
);
create index runs_created_idx on runs (created_at);
create index runs_status_idx on runs (status, owner_name);

create table run_points (
  run_id varchar(36) not null references runs (id) on delete cascade,
  idx integer not null,
  inputs varchar(1000000) not null,
  outputs varchar(1000000),
  problem varchar(1000000),
  computed_by varchar(200),
  primary key (run_id, idx)
);

-- the job queue of db-scheduler (one row per queued or executing chunk, and the recurring tasks)
create table scheduled_tasks (
  task_name varchar(100) not null,
  task_instance varchar(200) not null,
  task_data blob,
  execution_time timestamp with time zone not null,
  picked boolean not null,
  picked_by varchar(200),
  last_success timestamp with time zone,
  last_failure timestamp with time zone,
  consecutive_failures integer,
  last_heartbeat timestamp with time zone,
  version bigint not null,
  priority smallint,
  primary key (task_name, task_instance)
);
create index execution_time_idx on scheduled_tasks (execution_time);
create index last_heartbeat_idx on scheduled_tasks (last_heartbeat);
create index priority_execution_time_idx on scheduled_tasks (priority desc, execution_time asc);
