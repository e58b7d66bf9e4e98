# mk/ops.mk — running gascycled for real: container image, compose and
# Kubernetes manifests, nginx scale-out. Included by the top-level Makefile.
#   make image            docker build of docker/Dockerfile (public Debian base)
#   make image-test       build from a local debootstrap base, run, probe, stop (in make test)
#   make ops-manifests    syntax and required keys of docker/ (fast; in make test)
#   make scaleout-test    two replicas behind Debian's nginx, no containers (in make test)
#   make bench-scaleout   wrk through nginx, two replicas against one (in make bench)

DOCKER      ?= $(firstword $(wildcard /usr/bin/docker) docker)
IMAGE_NAME  ?= gascycled
IMAGE_BASE  ?= debian:bookworm-slim
IMAGE_SOURCE ?= $(shell git config --get remote.origin.url 2>/dev/null)

.PHONY: image image-test ops-manifests scaleout-test bench-scaleout

image:
	DOCKER_BUILDKIT=0 $(DOCKER) build -f docker/Dockerfile \
	    --build-arg BASE_IMAGE=$(IMAGE_BASE) \
	    --build-arg VERSION=$(VERSION) --build-arg GIT_REV=$(GIT_REV) \
	    --build-arg SOURCE_URL=$(IMAGE_SOURCE) \
	    --build-arg CREATED=$(shell date -u +%Y-%m-%dT%H:%M:%SZ) \
	    -t $(IMAGE_NAME):$(VERSION) -t $(IMAGE_NAME):latest .

image-test:
	scripts/deps.sh image ops
	BUILD=$(BUILD) tests/ops/image-test.sh

ops-manifests:
	scripts/deps.sh ops node
	node tests/ops/check-manifests.js

scaleout-test:
	scripts/deps.sh build ops
	$(MAKE) $(SERVER)
	BUILD=$(BUILD) tests/ops/scaleout.sh check

bench-scaleout:
	scripts/deps.sh build ops bench
	$(MAKE) $(SERVER)
	BUILD=$(BUILD) tests/ops/scaleout.sh bench

# The image test builds and runs the real container (about 1.5 min with the
# debootstrap base cached under build/ops/, about 3 min on a fresh machine),
# well inside CI's 90 minutes, so it is part of make test. OPS_IMAGE_TEST=0
# leaves it out (e.g. on a host where dockerd cannot run).
OPS_IMAGE_TEST ?= 1
TEST_TARGETS  += ops-manifests scaleout-test
ifeq ($(OPS_IMAGE_TEST),1)
TEST_TARGETS  += image-test
endif
BENCH_TARGETS += bench-scaleout
