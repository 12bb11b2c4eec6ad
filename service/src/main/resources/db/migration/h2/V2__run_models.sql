-- The published models behind a run's computed points (the union over its points), so any replica
-- answers a run's provenance. Keep in step with ../postgresql.
create table run_models (
  run_id varchar(36) not null references runs (id) on delete cascade,
  model_id varchar(200) not null,
  citation varchar(4000) not null,
  doi varchar(200) not null,
  first_point integer not null,
  list_order integer not null,
  primary key (run_id, model_id)
);
