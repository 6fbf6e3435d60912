# Worker settings for a thermotile standalone cluster: copy to $SPARK_HOME/conf/spark-env.sh on
# each worker host. A worker offers SPARK_WORKER_CORES cores and SPARK_WORKER_MEMORY memory to
# executors; leave about 1 GB of the host for the OS and the worker daemon itself.
SPARK_WORKER_CORES=4
SPARK_WORKER_MEMORY=8g
# Bind to the host's cluster-facing address (127.0.0.1 on a one-machine cluster).
# SPARK_LOCAL_IP=10.0.0.12
