-- after 0001-initial

CREATE TABLE `dampers` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `axle_index` INTEGER NOT NULL, `part_number` VARCHAR(60), `installed_at` DATE NOT NULL, `installed_odometer_km` DOUBLE PRECISION NOT NULL, `removed_at` DATE, `removed_odometer_km` DOUBLE PRECISION, `removal_reason` VARCHAR(40), `energy_j` DOUBLE PRECISION NOT NULL DEFAULT '0', `fatigue_damage` DOUBLE PRECISION NOT NULL DEFAULT '0', `life_used_fraction` DOUBLE PRECISION NOT NULL DEFAULT '0', `damping_ns_per_m` DOUBLE PRECISION, `removed_by_work_record_id` INTEGER REFERENCES `work_records` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `wear_updated_at` DATETIME, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `dampers_vehicle_id_removed_at` ON `dampers` (`vehicle_id`, `removed_at`);

CREATE TABLE `depots` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `name` VARCHAR(120) NOT NULL UNIQUE, `address` VARCHAR(240), `lat` DOUBLE PRECISION NOT NULL, `lon` DOUBLE PRECISION NOT NULL, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE TABLE `inspections` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `due_date` DATE NOT NULL, `status` VARCHAR(16) NOT NULL, `reason` TEXT NOT NULL, `assignee_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `completed_at` DATETIME, `odometer_km` DOUBLE PRECISION, `notes` TEXT, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `inspections_assignee_id` ON `inspections` (`assignee_id`);

CREATE INDEX `inspections_status_due_date` ON `inspections` (`status`, `due_date`);

CREATE INDEX `inspections_vehicle_id_status` ON `inspections` (`vehicle_id`, `status`);

CREATE TABLE `roughness_observations` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `segment_id` INTEGER NOT NULL REFERENCES `route_segments` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `iri` DOUBLE PRECISION, `gd_n0` DOUBLE PRECISION, `iso_class` VARCHAR(1), `source` VARCHAR(20) NOT NULL, `observed_on` DATE NOT NULL, `recorded_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `note` VARCHAR(240), `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `roughness_observations_segment_id_observed_on` ON `roughness_observations` (`segment_id`, `observed_on`);

CREATE TABLE `route_segments` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `route_id` INTEGER NOT NULL REFERENCES `routes` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `seq` INTEGER NOT NULL, `start_m` DOUBLE PRECISION NOT NULL, `end_m` DOUBLE PRECISION NOT NULL, `geometry` TEXT NOT NULL, `speed_kmh` DOUBLE PRECISION, `iri` DOUBLE PRECISION, `gd_n0` DOUBLE PRECISION, `iso_class` VARCHAR(1), `roughness_source` VARCHAR(20), `roughness_date` DATE, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `route_segments_iso_class` ON `route_segments` (`iso_class`);

CREATE UNIQUE INDEX `route_segments_route_id_seq` ON `route_segments` (`route_id`, `seq`);

CREATE TABLE `routes` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `name` VARCHAR(120) NOT NULL UNIQUE, `description` TEXT, `depot_id` INTEGER REFERENCES `depots` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `geometry` TEXT NOT NULL, `length_m` DOUBLE PRECISION NOT NULL, `default_speed_kmh` DOUBLE PRECISION NOT NULL DEFAULT '50', `segment_length_m` DOUBLE PRECISION NOT NULL DEFAULT '100', `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE TABLE `schema_migrations` (`name` VARCHAR(255) NOT NULL UNIQUE PRIMARY KEY);

CREATE TABLE `sessions` (`sid` VARCHAR(36) PRIMARY KEY, `expires` DATETIME, `data` TEXT, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `sessions_expires` ON `sessions` (`expires`);

CREATE TABLE `spec_axles` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `spec_id` INTEGER NOT NULL REFERENCES `suspension_specs` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `axle_index` INTEGER NOT NULL, `label` VARCHAR(40) NOT NULL, `sprung_mass_kg` DOUBLE PRECISION NOT NULL, `unsprung_mass_kg` DOUBLE PRECISION NOT NULL, `spring_rate_n_per_m` DOUBLE PRECISION NOT NULL, `damping_ns_per_m` DOUBLE PRECISION NOT NULL, `tire_rate_n_per_m` DOUBLE PRECISION NOT NULL, `rated_damper_life_km` DOUBLE PRECISION NOT NULL DEFAULT '90000', `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE UNIQUE INDEX `spec_axles_spec_id_axle_index` ON `spec_axles` (`spec_id`, `axle_index`);

-- sqlite_autoindex_depots_1 (made by SQLite)

-- sqlite_autoindex_routes_1 (made by SQLite)

-- sqlite_autoindex_schema_migrations_1 (made by SQLite)

-- sqlite_autoindex_sessions_1 (made by SQLite)

-- sqlite_autoindex_suspension_specs_1 (made by SQLite)

-- sqlite_autoindex_users_1 (made by SQLite)

-- sqlite_autoindex_vehicles_1 (made by SQLite)

-- sqlite_autoindex_vehicles_2 (made by SQLite)

CREATE TABLE sqlite_sequence(name,seq);

CREATE TABLE `suspension_specs` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `name` VARCHAR(120) NOT NULL UNIQUE, `vehicle_class` VARCHAR(40) NOT NULL, `description` TEXT, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE TABLE `trips` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE RESTRICT ON UPDATE CASCADE, `route_id` INTEGER NOT NULL REFERENCES `routes` (`id`) ON DELETE RESTRICT ON UPDATE CASCADE, `driver_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `started_at` DATETIME NOT NULL, `ended_at` DATETIME NOT NULL, `distance_km` DOUBLE PRECISION NOT NULL, `mean_speed_kmh` DOUBLE PRECISION NOT NULL, `payload_kg` DOUBLE PRECISION, `processed_at` DATETIME, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `trips_driver_id_started_at` ON `trips` (`driver_id`, `started_at`);

CREATE INDEX `trips_processed_at` ON `trips` (`processed_at`);

CREATE INDEX `trips_route_id` ON `trips` (`route_id`);

CREATE INDEX `trips_vehicle_id_started_at` ON `trips` (`vehicle_id`, `started_at`);

CREATE TABLE `users` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `name` VARCHAR(120) NOT NULL, `email` VARCHAR(254) NOT NULL UNIQUE, `role` VARCHAR(16) NOT NULL, `password_hash` VARCHAR(100) NOT NULL, `active` TINYINT(1) NOT NULL DEFAULT 1, `depot_id` INTEGER REFERENCES `depots` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `users_role` ON `users` (`role`);

CREATE TABLE `vehicles` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `fleet_number` VARCHAR(20) NOT NULL UNIQUE, `plate` VARCHAR(20) NOT NULL UNIQUE, `spec_id` INTEGER NOT NULL REFERENCES `suspension_specs` (`id`) ON DELETE RESTRICT ON UPDATE CASCADE, `depot_id` INTEGER NOT NULL REFERENCES `depots` (`id`) ON DELETE RESTRICT ON UPDATE CASCADE, `driver_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `odometer_km` DOUBLE PRECISION NOT NULL DEFAULT '0', `status` VARCHAR(16) NOT NULL DEFAULT 'in_service', `commissioned_at` DATE, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `vehicles_depot_id` ON `vehicles` (`depot_id`);

CREATE INDEX `vehicles_driver_id` ON `vehicles` (`driver_id`);

CREATE INDEX `vehicles_spec_id` ON `vehicles` (`spec_id`);

CREATE INDEX `vehicles_status` ON `vehicles` (`status`);

CREATE TABLE `work_records` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `inspection_id` INTEGER REFERENCES `inspections` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `mechanic_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `performed_at` DATETIME NOT NULL, `odometer_km` DOUBLE PRECISION NOT NULL, `summary` TEXT NOT NULL, `parts_cost` DOUBLE PRECISION, `labour_hours` DOUBLE PRECISION, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `work_records_vehicle_id_performed_at` ON `work_records` (`vehicle_id`, `performed_at`);


-- after 0002-roads-and-imports

CREATE TABLE `road_surveys` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `route_id` INTEGER NOT NULL REFERENCES `routes` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `file_path` VARCHAR(300) NOT NULL, `original_name` VARCHAR(255) NOT NULL, `dx_m` DOUBLE PRECISION NOT NULL, `start_m` DOUBLE PRECISION NOT NULL, `end_m` DOUBLE PRECISION NOT NULL, `point_count` INTEGER NOT NULL, `surveyed_on` DATE NOT NULL, `note` VARCHAR(240), `uploaded_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `uploaded_at` DATETIME NOT NULL, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `road_surveys_route_id_uploaded_at` ON `road_surveys` (`route_id`, `uploaded_at`);

CREATE TABLE `roughness_observations` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `segment_id` INTEGER NOT NULL REFERENCES `route_segments` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `iri` DOUBLE PRECISION, `gd_n0` DOUBLE PRECISION, `iso_class` VARCHAR(1), `source` VARCHAR(20) NOT NULL, `observed_on` DATE NOT NULL, `recorded_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `note` VARCHAR(240), `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `survey_id` INTEGER REFERENCES `road_surveys` (`id`) ON DELETE SET NULL ON UPDATE CASCADE);

CREATE INDEX `roughness_observations_survey_id` ON `roughness_observations` (`survey_id`);

CREATE TABLE `route_segments` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `route_id` INTEGER NOT NULL REFERENCES `routes` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `seq` INTEGER NOT NULL, `start_m` DOUBLE PRECISION NOT NULL, `end_m` DOUBLE PRECISION NOT NULL, `geometry` TEXT NOT NULL, `speed_kmh` DOUBLE PRECISION, `iri` DOUBLE PRECISION, `gd_n0` DOUBLE PRECISION, `iso_class` VARCHAR(1), `roughness_source` VARCHAR(20), `roughness_date` DATE, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `survey_id` INTEGER REFERENCES `road_surveys` (`id`) ON DELETE SET NULL ON UPDATE CASCADE);

CREATE TABLE `trip_imports` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `original_name` VARCHAR(255) NOT NULL, `row_count` INTEGER NOT NULL, `imported_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `imported_at` DATETIME NOT NULL, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE TABLE `trips` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE RESTRICT ON UPDATE CASCADE, `route_id` INTEGER NOT NULL REFERENCES `routes` (`id`) ON DELETE RESTRICT ON UPDATE CASCADE, `driver_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `started_at` DATETIME NOT NULL, `ended_at` DATETIME NOT NULL, `distance_km` DOUBLE PRECISION NOT NULL, `mean_speed_kmh` DOUBLE PRECISION NOT NULL, `payload_kg` DOUBLE PRECISION, `processed_at` DATETIME, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `import_id` INTEGER REFERENCES `trip_imports` (`id`) ON DELETE SET NULL ON UPDATE CASCADE);


-- after 0003-nightly-duty

CREATE TABLE `caught_mail` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `message_id` VARCHAR(250), `dedupe_key` VARCHAR(200), `mail_from` VARCHAR(254), `rcpt_to` TEXT NOT NULL, `subject` VARCHAR(250) NOT NULL, `text_body` TEXT, `html_body` TEXT, `size_bytes` INTEGER NOT NULL, `received_at` DATETIME NOT NULL, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `caught_mail_received_at` ON `caught_mail` (`received_at`);

CREATE TABLE `damper_predictions` (`damper_id` INTEGER PRIMARY KEY REFERENCES `dampers` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `as_of` DATE NOT NULL, `window_days` INTEGER NOT NULL, `window_energy_j` DOUBLE PRECISION NOT NULL, `window_km` DOUBLE PRECISION NOT NULL, `rate_j_per_day` DOUBLE PRECISION NOT NULL, `life_energy_j` DOUBLE PRECISION NOT NULL, `life_source` VARCHAR(20) NOT NULL, `energy_j` DOUBLE PRECISION NOT NULL, `life_used_fraction` DOUBLE PRECISION NOT NULL, `damping_ns_per_m` DOUBLE PRECISION NOT NULL, `threshold_fraction` DOUBLE PRECISION NOT NULL, `threshold_date` DATE, `end_of_life_date` DATE, `spring_damage` DOUBLE PRECISION NOT NULL, `spring_rate_per_day` DOUBLE PRECISION NOT NULL, `spring_threshold_date` DATE, `basis` TEXT NOT NULL);

CREATE INDEX `damper_predictions_threshold_date` ON `damper_predictions` (`threshold_date`);

CREATE INDEX `damper_predictions_vehicle_id` ON `damper_predictions` (`vehicle_id`);

CREATE TABLE `damper_wear_days` (`damper_id` INTEGER NOT NULL REFERENCES `dampers` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `day` DATE NOT NULL, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `distance_km` DOUBLE PRECISION NOT NULL, `energy_j` DOUBLE PRECISION NOT NULL, `spring_damage` DOUBLE PRECISION NOT NULL, `cum_energy_j` DOUBLE PRECISION NOT NULL, `cum_spring_damage` DOUBLE PRECISION NOT NULL, `life_energy_j` DOUBLE PRECISION NOT NULL, `life_used_fraction` DOUBLE PRECISION NOT NULL, `damping_ns_per_m` DOUBLE PRECISION NOT NULL, PRIMARY KEY (`damper_id`, `day`));

CREATE INDEX `damper_wear_days_vehicle_id_day` ON `damper_wear_days` (`vehicle_id`, `day`);

CREATE TABLE `dampers` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `axle_index` INTEGER NOT NULL, `part_number` VARCHAR(60), `installed_at` DATE NOT NULL, `installed_odometer_km` DOUBLE PRECISION NOT NULL, `removed_at` DATE, `removed_odometer_km` DOUBLE PRECISION, `removal_reason` VARCHAR(40), `energy_j` DOUBLE PRECISION NOT NULL DEFAULT '0', `fatigue_damage` DOUBLE PRECISION NOT NULL DEFAULT '0', `life_used_fraction` DOUBLE PRECISION NOT NULL DEFAULT '0', `damping_ns_per_m` DOUBLE PRECISION, `removed_by_work_record_id` INTEGER REFERENCES `work_records` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `wear_updated_at` DATETIME, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `wear_dirty_from` DATE);

CREATE TABLE `inspections` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `due_date` DATE NOT NULL, `status` VARCHAR(16) NOT NULL, `reason` TEXT NOT NULL, `assignee_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `completed_at` DATETIME, `odometer_km` DOUBLE PRECISION, `notes` TEXT, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `trigger` VARCHAR(20), `basis` TEXT, `notified_status` VARCHAR(16), `assignee_notified_id` INTEGER, `created_by_run_id` INTEGER);

CREATE UNIQUE INDEX inspections_one_open_per_vehicle ON inspections (vehicle_id) WHERE status IN ('scheduled', 'due', 'overdue');

CREATE TABLE `job_locks` (`name` VARCHAR(40) PRIMARY KEY, `run_id` INTEGER, `holder` VARCHAR(120) NOT NULL, `acquired_at` DATETIME NOT NULL, `heartbeat_at` DATETIME NOT NULL);

CREATE TABLE `job_runs` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `job` VARCHAR(40) NOT NULL, `status` VARCHAR(24) NOT NULL, `trigger` VARCHAR(16) NOT NULL, `as_of` DATE NOT NULL, `requested_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `started_at` DATETIME NOT NULL, `ended_at` DATETIME, `heartbeat_at` DATETIME, `phase` VARCHAR(40), `progress_done` INTEGER NOT NULL DEFAULT 0, `progress_total` INTEGER NOT NULL DEFAULT 0, `counts` TEXT NOT NULL DEFAULT '{}', `errors` TEXT NOT NULL DEFAULT '[]', `message` TEXT, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `job_runs_job_started_at` ON `job_runs` (`job`, `started_at`);

CREATE TABLE `mail_messages` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `dedupe_key` VARCHAR(200) NOT NULL UNIQUE, `kind` VARCHAR(24) NOT NULL, `user_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `to_address` VARCHAR(254) NOT NULL, `subject` VARCHAR(250) NOT NULL, `text_body` TEXT NOT NULL, `html_body` TEXT NOT NULL, `status` VARCHAR(12) NOT NULL, `message_id` VARCHAR(250), `error` TEXT, `attempts` INTEGER NOT NULL DEFAULT 0, `job_run_id` INTEGER, `sent_at` DATETIME, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `mail_messages_status` ON `mail_messages` (`status`);

CREATE INDEX `mail_messages_user_id_created_at` ON `mail_messages` (`user_id`, `created_at`);

-- sqlite_autoindex_damper_wear_days_1 (made by SQLite)

-- sqlite_autoindex_job_locks_1 (made by SQLite)

-- sqlite_autoindex_mail_messages_1 (made by SQLite)

CREATE TABLE `trip_duties` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `trip_id` INTEGER NOT NULL REFERENCES `trips` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `damper_id` INTEGER REFERENCES `dampers` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `route_id` INTEGER NOT NULL REFERENCES `routes` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `driver_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `axle_index` INTEGER NOT NULL, `trip_date` DATE NOT NULL, `distance_km` DOUBLE PRECISION NOT NULL, `duration_s` DOUBLE PRECISION NOT NULL, `sprung_mass_kg` DOUBLE PRECISION NOT NULL, `energy_j` DOUBLE PRECISION NOT NULL, `mean_power_w` DOUBLE PRECISION NOT NULL, `rms_relative_velocity` DOUBLE PRECISION NOT NULL, `rms_suspension_travel` DOUBLE PRECISION NOT NULL, `rms_tire_load_ratio` DOUBLE PRECISION NOT NULL, `rms_body_accel` DOUBLE PRECISION NOT NULL, `rms_weighted_accel` DOUBLE PRECISION NOT NULL, `spring_damage` DOUBLE PRECISION NOT NULL, `segments` INTEGER NOT NULL, `profiled_segments` INTEGER NOT NULL, `unrated_segments` INTEGER NOT NULL, `job_run_id` INTEGER, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `trip_duties_damper_id_trip_date` ON `trip_duties` (`damper_id`, `trip_date`);

CREATE INDEX `trip_duties_driver_id_trip_date_axle_index` ON `trip_duties` (`driver_id`, `trip_date`, `axle_index`);

CREATE INDEX `trip_duties_route_id` ON `trip_duties` (`route_id`);

CREATE UNIQUE INDEX `trip_duties_trip_id_position` ON `trip_duties` (`trip_id`, `position`);

CREATE INDEX `trip_duties_vehicle_id_trip_date` ON `trip_duties` (`vehicle_id`, `trip_date`);

CREATE TABLE `users` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `name` VARCHAR(120) NOT NULL, `email` VARCHAR(254) NOT NULL UNIQUE, `role` VARCHAR(16) NOT NULL, `password_hash` VARCHAR(100) NOT NULL, `active` TINYINT(1) NOT NULL DEFAULT 1, `depot_id` INTEGER REFERENCES `depots` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `notify_inspection_digest` TINYINT(1) NOT NULL DEFAULT 1, `notify_ride_reports` TINYINT(1) NOT NULL DEFAULT 1, `notify_assignments` TINYINT(1) NOT NULL DEFAULT 1);


-- after 0004-workshop

CREATE TABLE `inspection_attachments` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `inspection_id` INTEGER NOT NULL REFERENCES `inspections` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `kind` VARCHAR(12) NOT NULL, `mime_type` VARCHAR(40) NOT NULL, `size_bytes` INTEGER NOT NULL, `stored_name` VARCHAR(80) NOT NULL UNIQUE, `original_name` VARCHAR(200) NOT NULL, `uploaded_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `inspection_attachments_inspection_id` ON `inspection_attachments` (`inspection_id`);

CREATE TABLE `inspection_corners` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `inspection_id` INTEGER NOT NULL REFERENCES `inspections` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `damper_id` INTEGER REFERENCES `dampers` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `axle_index` INTEGER NOT NULL, `adhesion_pct` DOUBLE PRECISION, `findings` TEXT NOT NULL DEFAULT '[]', `verdict` VARCHAR(12) NOT NULL, `nominal_damping_ns_per_m` DOUBLE PRECISION NOT NULL, `predicted_damping_ns_per_m` DOUBLE PRECISION, `predicted_basis` VARCHAR(20), `measured_damping_ns_per_m` DOUBLE PRECISION, `estimate_note` TEXT, `energy_j_at_test` DOUBLE PRECISION, `life_used_at_test` DOUBLE PRECISION, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `inspection_corners_damper_id` ON `inspection_corners` (`damper_id`);

CREATE UNIQUE INDEX `inspection_corners_inspection_id_position` ON `inspection_corners` (`inspection_id`, `position`);

CREATE TABLE `inspections` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `due_date` DATE NOT NULL, `status` VARCHAR(16) NOT NULL, `reason` TEXT NOT NULL, `assignee_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `completed_at` DATETIME, `odometer_km` DOUBLE PRECISION, `notes` TEXT, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `trigger` VARCHAR(20), `basis` TEXT, `notified_status` VARCHAR(16), `assignee_notified_id` INTEGER, `created_by_run_id` INTEGER, `assigned_depot_id` INTEGER REFERENCES `depots` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `results_at` DATETIME, `results_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE);

CREATE INDEX `inspections_assigned_depot_id` ON `inspections` (`assigned_depot_id`);

-- sqlite_autoindex_inspection_attachments_1 (made by SQLite)

CREATE TABLE `work_record_items` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `work_record_id` INTEGER NOT NULL REFERENCES `work_records` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `axle_index` INTEGER NOT NULL, `component` VARCHAR(12) NOT NULL, `part_description` VARCHAR(160) NOT NULL, `part_number` VARCHAR(60), `cost` DOUBLE PRECISION, `removal_reason` VARCHAR(40) NOT NULL, `removed_damper_id` INTEGER REFERENCES `dampers` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `installed_damper_id` INTEGER REFERENCES `dampers` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `work_record_items_work_record_id` ON `work_record_items` (`work_record_id`);

CREATE TABLE `work_records` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `inspection_id` INTEGER REFERENCES `inspections` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `mechanic_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `performed_at` DATETIME NOT NULL, `odometer_km` DOUBLE PRECISION NOT NULL, `summary` TEXT NOT NULL, `parts_cost` DOUBLE PRECISION, `labour_hours` DOUBLE PRECISION, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `notes` TEXT);


-- after 0005-drivers

CREATE TABLE `driver_exposure_days` (`driver_id` INTEGER NOT NULL REFERENCES `users` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `day` DATE NOT NULL, `a8` DOUBLE PRECISION NOT NULL, `hours` DOUBLE PRECISION NOT NULL, `trips` INTEGER NOT NULL, `max_weighted_accel` DOUBLE PRECISION NOT NULL, `status` VARCHAR(24) NOT NULL, `parts` TEXT NOT NULL DEFAULT '[]', `computed_at` DATETIME NOT NULL, `notified_at` DATETIME, PRIMARY KEY (`driver_id`, `day`));

CREATE INDEX `driver_exposure_days_day_a8` ON `driver_exposure_days` (`day`, `a8`);

CREATE TABLE `ride_reports` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `driver_id` INTEGER NOT NULL REFERENCES `users` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `vehicle_id` INTEGER REFERENCES `vehicles` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `route_id` INTEGER NOT NULL REFERENCES `routes` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `segment_id` INTEGER NOT NULL REFERENCES `route_segments` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `lat` DOUBLE PRECISION NOT NULL, `lon` DOUBLE PRECISION NOT NULL, `position_source` VARCHAR(8) NOT NULL, `accuracy_m` DOUBLE PRECISION, `snapped_lat` DOUBLE PRECISION NOT NULL, `snapped_lon` DOUBLE PRECISION NOT NULL, `snap_distance_m` DOUBLE PRECISION NOT NULL, `severity` INTEGER NOT NULL, `felt` TEXT NOT NULL DEFAULT '[]', `note` VARCHAR(1000), `photo_path` VARCHAR(200), `photo_type` VARCHAR(40), `photo_bytes` INTEGER, `reported_at` DATETIME NOT NULL, `status` VARCHAR(12) NOT NULL DEFAULT 'new', `decided_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `decided_at` DATETIME, `dismiss_reason` VARCHAR(500), `class_before` VARCHAR(1), `estimated_class` VARCHAR(1), `estimated_gd_n0` DOUBLE PRECISION, `observation_id` INTEGER REFERENCES `roughness_observations` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `digest_notified_at` DATETIME, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL);

CREATE INDEX `ride_reports_driver_id_reported_at` ON `ride_reports` (`driver_id`, `reported_at`);

CREATE INDEX `ride_reports_segment_id` ON `ride_reports` (`segment_id`);

CREATE INDEX `ride_reports_status_segment_id` ON `ride_reports` (`status`, `segment_id`);

-- sqlite_autoindex_driver_exposure_days_1 (made by SQLite)


-- after 0006-opening-wear

CREATE TABLE `dampers` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `axle_index` INTEGER NOT NULL, `part_number` VARCHAR(60), `installed_at` DATE NOT NULL, `installed_odometer_km` DOUBLE PRECISION NOT NULL, `removed_at` DATE, `removed_odometer_km` DOUBLE PRECISION, `removal_reason` VARCHAR(40), `energy_j` DOUBLE PRECISION NOT NULL DEFAULT '0', `fatigue_damage` DOUBLE PRECISION NOT NULL DEFAULT '0', `life_used_fraction` DOUBLE PRECISION NOT NULL DEFAULT '0', `damping_ns_per_m` DOUBLE PRECISION, `removed_by_work_record_id` INTEGER REFERENCES `work_records` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `wear_updated_at` DATETIME, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `wear_dirty_from` DATE, `opening_km` DOUBLE PRECISION, `opening_energy_j` DOUBLE PRECISION, `opening_spring_damage` DOUBLE PRECISION, `opening_basis` TEXT);


-- after 0007-drop-unused-duty-indexes

-- dropped: damper_wear_days_vehicle_id_day

-- dropped: trip_duties_vehicle_id_trip_date


-- after 0008-damper-life-model

CREATE TABLE `damper_predictions` (`damper_id` INTEGER PRIMARY KEY REFERENCES `dampers` (`id`) ON DELETE CASCADE, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE, `as_of` DATE NOT NULL, `window_days` INTEGER NOT NULL, `window_km` DOUBLE PRECISION NOT NULL, `window_wear_km` DOUBLE PRECISION NOT NULL, `wear_km_per_day` DOUBLE PRECISION NOT NULL, `km_per_day` DOUBLE PRECISION NOT NULL, `life_wear_km` DOUBLE PRECISION NOT NULL, `life_p10_wear_km` DOUBLE PRECISION NOT NULL, `life_p90_wear_km` DOUBLE PRECISION NOT NULL, `road_sensitivity` DOUBLE PRECISION NOT NULL, `life_source` VARCHAR(20) NOT NULL, `wear_km` DOUBLE PRECISION NOT NULL, `life_used_fraction` DOUBLE PRECISION NOT NULL, `distance_life_used` DOUBLE PRECISION NOT NULL, `calendar_life_used` DOUBLE PRECISION NOT NULL, `opening_km` DOUBLE PRECISION NOT NULL, `opening_share` DOUBLE PRECISION NOT NULL, `opening_share_low` DOUBLE PRECISION NOT NULL, `opening_share_high` DOUBLE PRECISION NOT NULL, `damping_ns_per_m` DOUBLE PRECISION NOT NULL, `threshold_fraction` DOUBLE PRECISION NOT NULL, `schedule_quantile` DOUBLE PRECISION NOT NULL, `threshold_date` DATE, `end_of_life_date` DATE, `end_of_life_p10_date` DATE, `end_of_life_p90_date` DATE, `governed_by` VARCHAR(12) NOT NULL, `spring_damage` DOUBLE PRECISION NOT NULL, `spring_rate_per_day` DOUBLE PRECISION NOT NULL, `spring_threshold_date` DATE, `basis` TEXT NOT NULL);

CREATE TABLE `damper_wear_days` (`damper_id` INTEGER NOT NULL REFERENCES `dampers` (`id`) ON DELETE CASCADE, `day` DATE NOT NULL, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE, `distance_km` DOUBLE PRECISION NOT NULL, `energy_j` DOUBLE PRECISION NOT NULL, `spring_damage` DOUBLE PRECISION NOT NULL, `wear_km` DOUBLE PRECISION NOT NULL, `cum_km` DOUBLE PRECISION NOT NULL, `cum_energy_j` DOUBLE PRECISION NOT NULL, `cum_wear_km` DOUBLE PRECISION NOT NULL, `cum_spring_damage` DOUBLE PRECISION NOT NULL, PRIMARY KEY (`damper_id`, `day`));

CREATE TABLE `dampers` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `axle_index` INTEGER NOT NULL, `part_number` VARCHAR(60), `installed_at` DATE NOT NULL, `installed_odometer_km` DOUBLE PRECISION NOT NULL, `removed_at` DATE, `removed_odometer_km` DOUBLE PRECISION, `removal_reason` VARCHAR(40), `energy_j` DOUBLE PRECISION NOT NULL DEFAULT '0', `fatigue_damage` DOUBLE PRECISION NOT NULL DEFAULT '0', `life_used_fraction` DOUBLE PRECISION NOT NULL DEFAULT '0', `damping_ns_per_m` DOUBLE PRECISION, `removed_by_work_record_id` INTEGER REFERENCES `work_records` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `wear_updated_at` DATETIME, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `wear_dirty_from` DATE, `opening_km` DOUBLE PRECISION, `opening_energy_j` DOUBLE PRECISION, `opening_spring_damage` DOUBLE PRECISION, `opening_basis` TEXT, `wear_km` DOUBLE PRECISION, `wear_exponent` DOUBLE PRECISION);

CREATE TABLE `inspection_corners` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `inspection_id` INTEGER NOT NULL REFERENCES `inspections` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `damper_id` INTEGER REFERENCES `dampers` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `axle_index` INTEGER NOT NULL, `adhesion_pct` DOUBLE PRECISION, `findings` TEXT NOT NULL DEFAULT '[]', `verdict` VARCHAR(12) NOT NULL, `nominal_damping_ns_per_m` DOUBLE PRECISION NOT NULL, `predicted_damping_ns_per_m` DOUBLE PRECISION, `predicted_basis` VARCHAR(20), `measured_damping_ns_per_m` DOUBLE PRECISION, `estimate_note` TEXT, `energy_j_at_test` DOUBLE PRECISION, `life_used_at_test` DOUBLE PRECISION, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `wear_km_at_test` DOUBLE PRECISION);

CREATE TABLE `life_models` (`spec_id` INTEGER PRIMARY KEY REFERENCES `suspension_specs` (`id`) ON DELETE CASCADE, `model` TEXT NOT NULL, `failures` INTEGER NOT NULL, `suspensions` INTEGER NOT NULL, `fitted_at` DATETIME NOT NULL);

CREATE TABLE `trip_duties` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `trip_id` INTEGER NOT NULL REFERENCES `trips` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `damper_id` INTEGER REFERENCES `dampers` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `route_id` INTEGER NOT NULL REFERENCES `routes` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `driver_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `axle_index` INTEGER NOT NULL, `trip_date` DATE NOT NULL, `distance_km` DOUBLE PRECISION NOT NULL, `duration_s` DOUBLE PRECISION NOT NULL, `sprung_mass_kg` DOUBLE PRECISION NOT NULL, `energy_j` DOUBLE PRECISION NOT NULL, `mean_power_w` DOUBLE PRECISION NOT NULL, `rms_relative_velocity` DOUBLE PRECISION NOT NULL, `rms_suspension_travel` DOUBLE PRECISION NOT NULL, `rms_tire_load_ratio` DOUBLE PRECISION NOT NULL, `rms_body_accel` DOUBLE PRECISION NOT NULL, `rms_weighted_accel` DOUBLE PRECISION NOT NULL, `spring_damage` DOUBLE PRECISION NOT NULL, `segments` INTEGER NOT NULL, `profiled_segments` INTEGER NOT NULL, `unrated_segments` INTEGER NOT NULL, `job_run_id` INTEGER, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `sliding_m` DOUBLE PRECISION NOT NULL DEFAULT '0', `severity` DOUBLE PRECISION NOT NULL DEFAULT '1');


-- after 0009-inspection-follow-up

CREATE TABLE `inspections` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `due_date` DATE NOT NULL, `status` VARCHAR(16) NOT NULL, `reason` TEXT NOT NULL, `assignee_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `completed_at` DATETIME, `odometer_km` DOUBLE PRECISION, `notes` TEXT, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `trigger` VARCHAR(20), `basis` TEXT, `notified_status` VARCHAR(16), `assignee_notified_id` INTEGER, `created_by_run_id` INTEGER, `assigned_depot_id` INTEGER REFERENCES `depots` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `results_at` DATETIME, `results_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `follow_up_on` DATE);


-- after 0010-ride-report-class-after

CREATE TABLE `ride_reports` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `driver_id` INTEGER NOT NULL REFERENCES `users` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `vehicle_id` INTEGER REFERENCES `vehicles` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `route_id` INTEGER NOT NULL REFERENCES `routes` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `segment_id` INTEGER NOT NULL REFERENCES `route_segments` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `lat` DOUBLE PRECISION NOT NULL, `lon` DOUBLE PRECISION NOT NULL, `position_source` VARCHAR(8) NOT NULL, `accuracy_m` DOUBLE PRECISION, `snapped_lat` DOUBLE PRECISION NOT NULL, `snapped_lon` DOUBLE PRECISION NOT NULL, `snap_distance_m` DOUBLE PRECISION NOT NULL, `severity` INTEGER NOT NULL, `felt` TEXT NOT NULL DEFAULT '[]', `note` VARCHAR(1000), `photo_path` VARCHAR(200), `photo_type` VARCHAR(40), `photo_bytes` INTEGER, `reported_at` DATETIME NOT NULL, `status` VARCHAR(12) NOT NULL DEFAULT 'new', `decided_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `decided_at` DATETIME, `dismiss_reason` VARCHAR(500), `class_before` VARCHAR(1), `estimated_class` VARCHAR(1), `estimated_gd_n0` DOUBLE PRECISION, `observation_id` INTEGER REFERENCES `roughness_observations` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `digest_notified_at` DATETIME, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `class_after` VARCHAR(1), `gd_n0_after` DOUBLE PRECISION);


-- after 0012-lane-plate-amplitude

CREATE TABLE `inspections` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `due_date` DATE NOT NULL, `status` VARCHAR(16) NOT NULL, `reason` TEXT NOT NULL, `assignee_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `completed_at` DATETIME, `odometer_km` DOUBLE PRECISION, `notes` TEXT, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `trigger` VARCHAR(20), `basis` TEXT, `notified_status` VARCHAR(16), `assignee_notified_id` INTEGER, `created_by_run_id` INTEGER, `assigned_depot_id` INTEGER REFERENCES `depots` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `results_at` DATETIME, `results_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `follow_up_on` DATE, `plate_amplitude_mm` DOUBLE PRECISION);


-- after 0013-lane-phase-shift

CREATE TABLE `inspection_corners` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `inspection_id` INTEGER NOT NULL REFERENCES `inspections` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `damper_id` INTEGER REFERENCES `dampers` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `axle_index` INTEGER NOT NULL, `adhesion_pct` DOUBLE PRECISION, `findings` TEXT NOT NULL DEFAULT '[]', `verdict` VARCHAR(12) NOT NULL, `nominal_damping_ns_per_m` DOUBLE PRECISION NOT NULL, `predicted_damping_ns_per_m` DOUBLE PRECISION, `predicted_basis` VARCHAR(20), `measured_damping_ns_per_m` DOUBLE PRECISION, `estimate_note` TEXT, `energy_j_at_test` DOUBLE PRECISION, `life_used_at_test` DOUBLE PRECISION, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `wear_km_at_test` DOUBLE PRECISION, `phase_deg` DOUBLE PRECISION, `estimate_method` VARCHAR(10));


-- after 0014-seat-factors

CREATE TABLE `suspension_specs` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `name` VARCHAR(120) NOT NULL UNIQUE, `vehicle_class` VARCHAR(40) NOT NULL, `description` TEXT, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `seat_factor` DOUBLE PRECISION, `cab_factor` DOUBLE PRECISION);


-- after 0017-trip-import-file-hash

CREATE TABLE `trip_imports` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `original_name` VARCHAR(255) NOT NULL, `row_count` INTEGER NOT NULL, `imported_by_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `imported_at` DATETIME NOT NULL, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `file_sha256` VARCHAR(64));

CREATE UNIQUE INDEX `trip_imports_file_sha256` ON `trip_imports` (`file_sha256`);


-- after 0018-must-change-password

CREATE TABLE `users` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `name` VARCHAR(120) NOT NULL, `email` VARCHAR(254) NOT NULL UNIQUE, `role` VARCHAR(16) NOT NULL, `password_hash` VARCHAR(100) NOT NULL, `active` TINYINT(1) NOT NULL DEFAULT 1, `depot_id` INTEGER REFERENCES `depots` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `notify_inspection_digest` TINYINT(1) NOT NULL DEFAULT 1, `notify_ride_reports` TINYINT(1) NOT NULL DEFAULT 1, `notify_assignments` TINYINT(1) NOT NULL DEFAULT 1, `must_change_password` TINYINT(1) NOT NULL DEFAULT 0);


-- after 0019-duty-day-summary

CREATE TABLE `damper_route_totals` (`damper_id` INTEGER NOT NULL REFERENCES `dampers` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `route_id` INTEGER NOT NULL REFERENCES `routes` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `axle_index` INTEGER NOT NULL, `records` INTEGER NOT NULL, `distance_km` DOUBLE PRECISION NOT NULL, `km_severity` DOUBLE PRECISION NOT NULL, `energy_j` DOUBLE PRECISION NOT NULL, `spring_damage` DOUBLE PRECISION NOT NULL, `weighted_accel_sum` DOUBLE PRECISION NOT NULL, PRIMARY KEY (`damper_id`, `route_id`));

CREATE INDEX `damper_route_totals_route_id` ON `damper_route_totals` (`route_id`);

CREATE TABLE `damper_severity_bins` (`vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `damper_id` INTEGER NOT NULL, `severity_bin` INTEGER NOT NULL, `distance_km` DOUBLE PRECISION NOT NULL, `km_ln_severity` DOUBLE PRECISION NOT NULL, PRIMARY KEY (`vehicle_id`, `position`, `damper_id`, `severity_bin`));

CREATE INDEX `damper_severity_bins_damper_id` ON `damper_severity_bins` (`damper_id`);

-- sqlite_autoindex_damper_route_totals_1 (made by SQLite)

-- sqlite_autoindex_damper_severity_bins_1 (made by SQLite)

CREATE INDEX `trip_duties_trip_date_axle_index` ON `trip_duties` (`trip_date`, `axle_index`);

CREATE TABLE `trip_duty_days` (`damper_id` INTEGER REFERENCES `dampers` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `vehicle_id` INTEGER NOT NULL REFERENCES `vehicles` (`id`) ON DELETE CASCADE ON UPDATE CASCADE, `position` VARCHAR(4) NOT NULL, `axle_index` INTEGER NOT NULL, `day` DATE NOT NULL, `severity_bin` INTEGER, `records` INTEGER NOT NULL, `distance_km` DOUBLE PRECISION NOT NULL, `energy_j` DOUBLE PRECISION NOT NULL, `spring_damage` DOUBLE PRECISION NOT NULL, `km_dev1` DOUBLE PRECISION NOT NULL, `km_dev2` DOUBLE PRECISION NOT NULL, `km_dev3` DOUBLE PRECISION NOT NULL, `km_dev4` DOUBLE PRECISION NOT NULL, `km_dev5` DOUBLE PRECISION NOT NULL, `km_dev6` DOUBLE PRECISION NOT NULL, `km_dev7` DOUBLE PRECISION NOT NULL);

CREATE INDEX `trip_duty_days_damper_id_day` ON `trip_duty_days` (`damper_id`, `day`);

CREATE INDEX `trip_duty_days_vehicle_id` ON `trip_duty_days` (`vehicle_id`);

-- dropped: trip_duties_driver_id_trip_date_axle_index


-- after 0020-mail-claims

CREATE TABLE `mail_messages` (`id` INTEGER PRIMARY KEY AUTOINCREMENT, `dedupe_key` VARCHAR(200) NOT NULL UNIQUE, `kind` VARCHAR(24) NOT NULL, `user_id` INTEGER REFERENCES `users` (`id`) ON DELETE SET NULL ON UPDATE CASCADE, `to_address` VARCHAR(254) NOT NULL, `subject` VARCHAR(250) NOT NULL, `text_body` TEXT NOT NULL, `html_body` TEXT NOT NULL, `status` VARCHAR(12) NOT NULL, `message_id` VARCHAR(250), `error` TEXT, `attempts` INTEGER NOT NULL DEFAULT 0, `job_run_id` INTEGER, `sent_at` DATETIME, `created_at` DATETIME NOT NULL, `updated_at` DATETIME NOT NULL, `claimed_at` DATETIME, `claimed_by` VARCHAR(120));


-- after 0021-sign-in-counts

CREATE TABLE `sign_in_counts` (`limit_key` VARCHAR(400) PRIMARY KEY, `hits` INTEGER NOT NULL, `reset_at_ms` BIGINT NOT NULL);

CREATE INDEX `sign_in_counts_reset_at_ms` ON `sign_in_counts` (`reset_at_ms`);

-- sqlite_autoindex_sign_in_counts_1 (made by SQLite)


-- after 0022-sign-in-delays

CREATE TABLE `sign_in_delays` (`account_key` VARCHAR(400) PRIMARY KEY, `failures` INTEGER NOT NULL, `window_ends_ms` BIGINT NOT NULL, `next_slot_ms` BIGINT NOT NULL);

CREATE INDEX `sign_in_delays_window_ends_ms` ON `sign_in_delays` (`window_ends_ms`);

-- sqlite_autoindex_sign_in_delays_1 (made by SQLite)
