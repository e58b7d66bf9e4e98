# docker/nginx.Dockerfile — the load balancer of docker/compose.yaml: Debian's
# nginx-light on the same base as the service image, with docker/nginx.conf,
# run as the unprivileged www-data user.
#   docker build -f docker/nginx.Dockerfile -t gascycled-lb .   (from the repo root)
ARG BASE_IMAGE=debian:bookworm-slim
FROM ${BASE_IMAGE}
RUN apt-get update \
 && DEBIAN_FRONTEND=noninteractive apt-get install -y --no-install-recommends nginx-light \
 && rm -rf /var/lib/apt/lists/* /var/cache/apt/*.bin /var/cache/apt/archives/*.deb
COPY docker/nginx.conf /etc/nginx/nginx.conf
LABEL org.opencontainers.image.title="gascycled-lb" \
      org.opencontainers.image.description="nginx load balancer in front of gascycled replicas" \
      org.opencontainers.image.licenses="MIT"
USER www-data
EXPOSE 8080
# SIGQUIT lets nginx finish the requests it is serving.
STOPSIGNAL SIGQUIT
HEALTHCHECK --interval=10s --timeout=3s --retries=3 \
    CMD ["bash", "-c", "exec 3<>/dev/tcp/127.0.0.1/8080 && printf 'GET /lb-healthz HTTP/1.0\\r\\nHost: localhost\\r\\n\\r\\n' >&3 && head -n 1 <&3 | grep -q ' 200 '"]
ENTRYPOINT ["nginx", "-e", "stderr", "-g", "daemon off;"]
