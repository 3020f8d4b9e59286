// Every job kind registers its handler on import; the worker imports this module once.
import './ingest';
import './link-run';
import './analysis';
import './external-analysis';
import './project-delete';
