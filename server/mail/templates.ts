// Every template an outbox row may name. Importing a feature's mail module registers its templates.
import '../alerts/alert-mail';
import '../alerts/notice-mail';
