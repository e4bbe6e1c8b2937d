/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-presentation.c: the presentation mode's window: replay clock on the
 * frame clock, readouts, transport bar, what-if panel and baseline.
 */
#include "config.h"

#include "pl-presentation.h"

#include <glib/gi18n.h>
#include <math.h>

#include "pl-label-text.h"
#include "pl-results-series.h"

struct _PlPresentation
{
  GtkWindow parent_instance;

  /* template */
  GtkLabel *title_label;
  GtkPopover *readout_popover;
  PlStage *stage;
  GtkWidget *play_button;
  GtkDropDown *speed_dropdown;
  GtkRange *scrubber;
  GtkLabel *time_label;
  GtkToggleButton *cycle_toggle, *shutdown_toggle;
  GtkLabel *phase_label;
  GtkRevealer *baseline_revealer;
  PlBaselineTable *baseline_table;
  PlReadouts *readouts;
  PlWhatIf *what_if;

  PlDocument *doc;
  PlUndoStack *undo;
  PlSolveScheduler *scheduler;
  PlUnitPrefs units;
  gulong changed_id;

  PlReplay replay;
  guint tick_id;
  gboolean scrubbing;          /* setting the scrubber from the clock */
  PlBaseline *baseline;

  /* frame statistics while playing */
  gint64 last_frame, max_interval, sum_interval;
  guint n_intervals;
};

G_DEFINE_FINAL_TYPE (PlPresentation, pl_presentation, GTK_TYPE_WINDOW)

/* The newest snapshots of the present revision (borrowed, may be NULL). */
static PlResults *
current_full (PlPresentation *self)
{
  PlResults *full = pl_solve_scheduler_get_full_results (self->scheduler);

  return full != NULL && pl_results_get_revision (full) == pl_document_get_revision (self->doc)
         ? full : NULL;
}

static PlResults *
current_any (PlPresentation *self)
{
  PlResults *fast = pl_solve_scheduler_get_fast_results (self->scheduler);

  if (current_full (self) != NULL)
    return current_full (self);
  return fast != NULL && pl_results_get_revision (fast) == pl_document_get_revision (self->doc)
         ? fast : NULL;
}

static void
update_readouts (PlPresentation *self)
{
  pl_readouts_update (self->readouts, current_full (self), current_any (self),
                      self->replay.run, pl_replay_get_position (&self->replay), &self->units);
}

/* --- the clock --- */

static void
update_time_label (PlPresentation *self)
{
  double t = pl_replay_get_position (&self->replay), len = pl_replay_get_duration (&self->replay);
  const PlPart *scenario = pl_document_get_scenario (self->doc);
  g_autofree char *text = NULL;

  if (!(len > 0.0))
    text = g_strdup (_("waiting for the solve"));
  else if (self->replay.run == PL_RUN_CYCLE || len < 1.0)
    /* Translators: replay time within the firing cycle (or a shutdown
     * shorter than a second), in milliseconds. */
    text = g_strdup_printf (_("%.1f ms of %.0f ms"), 1e3 * t, 1e3 * len);
  else
    /* Translators: replay time since the air went off, in seconds. */
    text = g_strdup_printf (_("%.2f s of %.2f s"), t, len);
  pl_label_set_text_if_changed (GTK_WIDGET (self->time_label), text);
  if (self->replay.run == PL_RUN_CYCLE && len > 0.0)
    {
      /* The applicators are open during the on-time plus the closing ramp
       * (firing delays shift single applicators; the readouts show it). */
      double open = pl_part_get_number (scenario, "on-time")
                    + pl_part_get_number (scenario, "close-ramp");

      pl_label_set_text_if_changed (GTK_WIDGET (self->phase_label),
                                    t < open ? _("Applicators open: the shot")
                                             : _("Applicators shut: recovery"));
    }
  else if (len > 0.0)
    pl_label_set_text_if_changed (GTK_WIDGET (self->phase_label),
                                  _("Air off: the dump valve drains the line"));
  else
    pl_label_set_text_if_changed (GTK_WIDGET (self->phase_label), "");
}

/* Shows the clock's position everywhere. */
static void
show_position (PlPresentation *self)
{
  double t = pl_replay_get_position (&self->replay);

  pl_stage_set_replay (self->stage, self->replay.run, t);
  self->scrubbing = TRUE;
  gtk_range_set_value (self->scrubber, t);
  self->scrubbing = FALSE;
  update_time_label (self);
  update_readouts (self);
  gtk_button_set_icon_name (GTK_BUTTON (self->play_button),
                            pl_replay_is_playing (&self->replay)
                            ? "media-playback-pause-symbolic"
                            : "media-playback-start-symbolic");
}

static gboolean
tick_cb (GtkWidget *widget, GdkFrameClock *clock, gpointer data)
{
  PlPresentation *self = PL_PRESENTATION (data);
  gint64 now = gdk_frame_clock_get_frame_time (clock);

  if (self->last_frame != 0)
    {
      gint64 d = now - self->last_frame;

      self->max_interval = MAX (self->max_interval, d);
      self->sum_interval += d;
      self->n_intervals++;
    }
  self->last_frame = now;
  pl_replay_update (&self->replay, now);
  show_position (self);
  if (!pl_replay_is_playing (&self->replay))
    {
      self->tick_id = 0;
      self->last_frame = 0;
      return G_SOURCE_REMOVE;
    }
  return G_SOURCE_CONTINUE;
}

static gint64
frame_now (PlPresentation *self)
{
  GdkFrameClock *clock = gtk_widget_get_frame_clock (GTK_WIDGET (self->stage));

  return clock != NULL ? gdk_frame_clock_get_frame_time (clock) : g_get_monotonic_time ();
}

static void
ensure_ticking (PlPresentation *self)
{
  if (pl_replay_is_playing (&self->replay) && self->tick_id == 0)
    self->tick_id = gtk_widget_add_tick_callback (GTK_WIDGET (self->stage), tick_cb, self,
                                                  NULL);
}

static void
set_scrubber_range (PlPresentation *self)
{
  double len = pl_replay_get_duration (&self->replay);

  self->scrubbing = TRUE;
  gtk_range_set_range (self->scrubber, 0.0, len > 0.0 ? len : 1.0);
  gtk_range_set_increments (self->scrubber, len > 0.0 ? len / 200.0 : 0.01,
                            len > 0.0 ? len / 20.0 : 0.1);
  self->scrubbing = FALSE;
  gtk_widget_set_sensitive (GTK_WIDGET (self->scrubber), len > 0.0);
}

/* --- results --- */

static void
update_baseline (PlPresentation *self)
{
  g_autoptr (GArray) rows = NULL;

  gtk_widget_action_set_enabled (GTK_WIDGET (self), "presentation.pin",
                                 current_full (self) != NULL);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "presentation.unpin",
                                 self->baseline != NULL);
  if (self->baseline != NULL)
    rows = pl_baseline_compare (self->baseline, self->doc, current_any (self));
  pl_baseline_table_set_rows (self->baseline_table, rows, &self->units);
  gtk_revealer_set_reveal_child (self->baseline_revealer, self->baseline != NULL);
}

static void
results_cb (PlSolveScheduler *scheduler, PlResults *results, PlPresentation *self)
{
  PlResults *full = current_full (self);

  pl_stage_set_results (self->stage, pl_solve_scheduler_get_fast_results (scheduler),
                        pl_solve_scheduler_get_full_results (scheduler));
  /* Only a delivered cycle and shutdown change the runs' lengths: while an
   * edit is being solved the replay plays on over the steady figures. */
  if (full != NULL)
    {
      pl_replay_set_results (&self->replay, full, frame_now (self));
      set_scrubber_range (self);
      ensure_ticking (self);
    }
  show_position (self);
  update_baseline (self);
}

static void
doc_changed_cb (PlDocument *doc, guint change, PlPresentation *self)
{
  const char *line = pl_part_get_text (pl_document_get_title (doc), "line");
  g_autofree char *title = NULL;

  /* Translators: the heading of the presentation; %s is the line's name. */
  title = *line != '\0' ? g_strdup_printf (_("Presenting: %s"), line)
                        : g_strdup (_("Presenting the layout"));
  gtk_label_set_text (self->title_label, title);
  update_readouts (self);
}

/* --- controls --- */

static void
scrubber_changed_cb (GtkRange *range, PlPresentation *self)
{
  if (self->scrubbing)
    return;
  pl_replay_seek (&self->replay, gtk_range_get_value (range), frame_now (self));
  show_position (self);
}

static void
speed_changed_cb (GObject *dropdown, GParamSpec *pspec, PlPresentation *self)
{
  guint i = gtk_drop_down_get_selected (self->speed_dropdown);

  if (i < PL_REPLAY_N_SPEEDS)
    pl_replay_set_speed (&self->replay, pl_replay_speeds[i], frame_now (self));
}

static void
run_toggled_cb (GtkToggleButton *button, PlPresentation *self)
{
  PlRun run = gtk_toggle_button_get_active (self->shutdown_toggle) ? PL_RUN_SHUTDOWN
                                                                   : PL_RUN_CYCLE;

  if (!gtk_toggle_button_get_active (button) || run == self->replay.run)
    return;
  pl_replay_set_run (&self->replay, run, frame_now (self));
  set_scrubber_range (self);
  show_position (self);
}

static void
action_play_pause (GtkWidget *widget, const char *name, GVariant *param)
{
  PlPresentation *self = PL_PRESENTATION (widget);
  gint64 now = frame_now (self);

  if (pl_replay_is_playing (&self->replay))
    pl_replay_pause (&self->replay, now);
  else
    pl_replay_play (&self->replay, now);
  self->last_frame = 0;
  ensure_ticking (self);
  show_position (self);
}

static void
action_pin (GtkWidget *widget, const char *name, GVariant *param)
{
  PlPresentation *self = PL_PRESENTATION (widget);
  PlResults *full = current_full (self);

  if (full == NULL)
    return;
  g_clear_object (&self->baseline);
  self->baseline = pl_baseline_new (self->doc, full);
  update_baseline (self);
}

static void
action_unpin (GtkWidget *widget, const char *name, GVariant *param)
{
  PlPresentation *self = PL_PRESENTATION (widget);

  g_clear_object (&self->baseline);
  update_baseline (self);
}

static void
action_leave (GtkWidget *widget, const char *name, GVariant *param)
{
  gtk_window_destroy (GTK_WINDOW (widget));
}

/* --- GObject --- */

static void
pl_presentation_dispose (GObject *object)
{
  PlPresentation *self = PL_PRESENTATION (object);

  if (self->tick_id != 0)
    {
      gtk_widget_remove_tick_callback (GTK_WIDGET (self->stage), self->tick_id);
      self->tick_id = 0;
    }
  if (self->doc != NULL)
    g_clear_signal_handler (&self->changed_id, self->doc);
  if (self->what_if != NULL)
    pl_what_if_set_document (self->what_if, NULL, NULL);
  g_clear_object (&self->baseline);
  g_clear_object (&self->doc);
  g_clear_object (&self->undo);
  g_clear_object (&self->scheduler);
  gtk_widget_dispose_template (GTK_WIDGET (self), PL_TYPE_PRESENTATION);
  G_OBJECT_CLASS (pl_presentation_parent_class)->dispose (object);
}

static void
pl_presentation_class_init (PlPresentationClass *klass)
{
  GtkWidgetClass *wc = GTK_WIDGET_CLASS (klass);

  G_OBJECT_CLASS (klass)->dispose = pl_presentation_dispose;
  g_type_ensure (PL_TYPE_STAGE);
  g_type_ensure (PL_TYPE_WHAT_IF);
  g_type_ensure (PL_TYPE_BASELINE_TABLE);
  g_type_ensure (PL_TYPE_READOUTS);
  gtk_widget_class_set_template_from_resource (wc,
                                               "/org/pressline/Pressline/pl-presentation.ui");
  gtk_widget_class_bind_template_child (wc, PlPresentation, title_label);
  gtk_widget_class_bind_template_child (wc, PlPresentation, readout_popover);
  gtk_widget_class_bind_template_child (wc, PlPresentation, stage);
  gtk_widget_class_bind_template_child (wc, PlPresentation, play_button);
  gtk_widget_class_bind_template_child (wc, PlPresentation, speed_dropdown);
  gtk_widget_class_bind_template_child (wc, PlPresentation, scrubber);
  gtk_widget_class_bind_template_child (wc, PlPresentation, time_label);
  gtk_widget_class_bind_template_child (wc, PlPresentation, cycle_toggle);
  gtk_widget_class_bind_template_child (wc, PlPresentation, shutdown_toggle);
  gtk_widget_class_bind_template_child (wc, PlPresentation, phase_label);
  gtk_widget_class_bind_template_child (wc, PlPresentation, baseline_revealer);
  gtk_widget_class_bind_template_child (wc, PlPresentation, baseline_table);
  gtk_widget_class_bind_template_child (wc, PlPresentation, readouts);
  gtk_widget_class_bind_template_child (wc, PlPresentation, what_if);
  gtk_widget_class_install_action (wc, "presentation.play-pause", NULL, action_play_pause);
  gtk_widget_class_install_action (wc, "presentation.pin", NULL, action_pin);
  gtk_widget_class_install_action (wc, "presentation.unpin", NULL, action_unpin);
  gtk_widget_class_install_action (wc, "presentation.leave", NULL, action_leave);
}

/* Space, Escape and F5 act in the capture phase: a focused button would
 * otherwise take Space as its own click. */
static void
add_keys (PlPresentation *self)
{
  static const struct
  {
    guint key;
    const char *action;
  } keys[] = {
    { GDK_KEY_space, "presentation.play-pause" },
    { GDK_KEY_Escape, "presentation.leave" },
    { GDK_KEY_F5, "presentation.leave" },
  };
  GtkEventController *controller = gtk_shortcut_controller_new ();

  gtk_event_controller_set_propagation_phase (controller, GTK_PHASE_CAPTURE);
  for (guint i = 0; i < G_N_ELEMENTS (keys); i++)
    {
      GtkShortcutTrigger *trigger = gtk_keyval_trigger_new (keys[i].key, 0);
      GtkShortcutAction *action = gtk_named_action_new (keys[i].action);

      gtk_shortcut_controller_add_shortcut (GTK_SHORTCUT_CONTROLLER (controller),
                                            gtk_shortcut_new (trigger, action));
    }
  gtk_widget_add_controller (GTK_WIDGET (self), controller);
}

static void
pl_presentation_init (PlPresentation *self)
{
  /* Translators: replay speeds, simulated time per wall time. */
  const char *speeds[PL_REPLAY_N_SPEEDS + 1] = {
    _("1/100 speed"), _("1/20 speed"), _("1/5 speed"), _("Real time"), NULL,
  };
  g_autoptr (GtkStringList) list = NULL;

  G_STATIC_ASSERT (PL_REPLAY_N_SPEEDS == 4);
  gtk_widget_init_template (GTK_WIDGET (self));
  add_keys (self);
  gtk_popover_set_child (self->readout_popover, pl_readouts_get_choices (self->readouts));
  pl_unit_prefs_init (&self->units, PL_UNIT_SYSTEM_SI);
  pl_replay_init (&self->replay);
  list = gtk_string_list_new (speeds);
  gtk_drop_down_set_model (self->speed_dropdown, G_LIST_MODEL (list));
  /* 1/20 (the clock's default): a 25 ms shot lasts half a second. */
  gtk_drop_down_set_selected (self->speed_dropdown, 1);
  g_signal_connect (self->speed_dropdown, "notify::selected", G_CALLBACK (speed_changed_cb),
                    self);
  g_signal_connect (self->scrubber, "value-changed", G_CALLBACK (scrubber_changed_cb), self);
  g_signal_connect (self->cycle_toggle, "toggled", G_CALLBACK (run_toggled_cb), self);
  g_signal_connect (self->shutdown_toggle, "toggled", G_CALLBACK (run_toggled_cb), self);
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->scrubber),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, _("Replay time"), -1);
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->play_button),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, _("Play or pause"), -1);
}

PlPresentation *
pl_presentation_new (GtkWindow *parent, PlDocument *doc, PlUndoStack *undo,
                     PlSolveScheduler *scheduler, const PlUnitPrefs *units,
                     gboolean fullscreen)
{
  PlPresentation *self;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  g_return_val_if_fail (PL_IS_UNDO_STACK (undo), NULL);
  g_return_val_if_fail (PL_IS_SOLVE_SCHEDULER (scheduler), NULL);

  self = g_object_new (PL_TYPE_PRESENTATION, "transient-for", parent,
                       "destroy-with-parent", TRUE, NULL);
  if (parent != NULL)
    gtk_window_set_application (GTK_WINDOW (self), gtk_window_get_application (parent));
  self->doc = g_object_ref (doc);
  self->undo = g_object_ref (undo);
  self->scheduler = g_object_ref (scheduler);
  if (units != NULL)
    self->units = *units;
  pl_stage_set_document (self->stage, doc);
  pl_readouts_set_document (self->readouts, doc);
  pl_stage_set_units (self->stage, &self->units);
  pl_what_if_set_document (self->what_if, doc, undo);
  pl_what_if_set_scheduler (self->what_if, scheduler);
  pl_what_if_set_units (self->what_if, &self->units);
  self->changed_id = g_signal_connect (doc, "changed", G_CALLBACK (doc_changed_cb), self);
  g_signal_connect_object (scheduler, "fast-results", G_CALLBACK (results_cb), self, 0);
  g_signal_connect_object (scheduler, "full-results", G_CALLBACK (results_cb), self, 0);
  doc_changed_cb (doc, PL_CHANGE_ALL, self);
  results_cb (scheduler, NULL, self);
  if (fullscreen)
    gtk_window_fullscreen (GTK_WINDOW (self));
  return self;
}

PlStage *
pl_presentation_get_stage (PlPresentation *self)
{
  g_return_val_if_fail (PL_IS_PRESENTATION (self), NULL);
  return self->stage;
}

GtkRange *
pl_presentation_get_scrubber (PlPresentation *self)
{
  g_return_val_if_fail (PL_IS_PRESENTATION (self), NULL);
  return self->scrubber;
}

GtkDropDown *
pl_presentation_get_speed (PlPresentation *self)
{
  g_return_val_if_fail (PL_IS_PRESENTATION (self), NULL);
  return self->speed_dropdown;
}

GtkToggleButton *
pl_presentation_get_run_button (PlPresentation *self, PlRun run)
{
  g_return_val_if_fail (PL_IS_PRESENTATION (self), NULL);
  return run == PL_RUN_SHUTDOWN ? self->shutdown_toggle : self->cycle_toggle;
}

PlWhatIf *
pl_presentation_get_what_if (PlPresentation *self)
{
  g_return_val_if_fail (PL_IS_PRESENTATION (self), NULL);
  return self->what_if;
}

PlBaselineTable *
pl_presentation_get_baseline_table (PlPresentation *self)
{
  g_return_val_if_fail (PL_IS_PRESENTATION (self), NULL);
  return self->baseline_table;
}

PlBaseline *
pl_presentation_get_baseline (PlPresentation *self)
{
  g_return_val_if_fail (PL_IS_PRESENTATION (self), NULL);
  return self->baseline;
}

const PlReplay *
pl_presentation_get_replay (PlPresentation *self)
{
  g_return_val_if_fail (PL_IS_PRESENTATION (self), NULL);
  return &self->replay;
}

const char *
pl_presentation_get_readout (PlPresentation *self, const char *part_id)
{
  g_return_val_if_fail (PL_IS_PRESENTATION (self), NULL);
  return pl_readouts_get_value (self->readouts, part_id);
}

void
pl_presentation_reset_frame_stats (PlPresentation *self)
{
  g_return_if_fail (PL_IS_PRESENTATION (self));
  self->max_interval = self->sum_interval = 0;
  self->n_intervals = 0;
}

guint
pl_presentation_get_frame_stats (PlPresentation *self, double *mean_us, gint64 *max_us)
{
  g_return_val_if_fail (PL_IS_PRESENTATION (self), 0);
  if (mean_us != NULL)
    *mean_us = self->n_intervals > 0 ? (double) self->sum_interval / self->n_intervals : 0.0;
  if (max_us != NULL)
    *max_us = self->max_interval;
  return self->n_intervals;
}
